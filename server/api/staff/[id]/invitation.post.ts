import { and, eq, isNull, ne } from 'drizzle-orm'
import { idParam } from '../../../../shared/schemas/common'

/** Sends a fresh invitation link to a staff member who has not set a password yet. */
export default defineEventHandler(async (event) => {
  const manager = await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  await useDb().transaction(async (tx) => {
    const [user] = await tx.select().from(tables.users).where(and(eq(tables.users.id, id), ne(tables.users.role, 'guest'))).for('update')
    if (!user) notFound('No such staff member.')
    if (user.passwordHash) conflict('This person has already set a password.')
    await tx.update(tables.authTokens).set({ usedAt: new Date() }).where(and(eq(tables.authTokens.userId, id), eq(tables.authTokens.purpose, 'invite'), isNull(tables.authTokens.usedAt)))
    await queueInvitation(tx, { userId: id, email: user.email, name: user.name, role: user.role, invitedBy: manager })
  })
  kickOutbox()
  return { ok: true }
})
