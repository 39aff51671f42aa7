import { and, eq, ne } from 'drizzle-orm'
import { idParam } from '../../../shared/schemas/common'
import { staffPatchSchema } from '../../../shared/schemas/staff'

/** A manager changes a staff member's role or disables the account; never their own. */
export default defineEventHandler(async (event) => {
  const manager = await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const patch = await readBodyAs(event, staffPatchSchema)
  if (id === manager.id) {
    conflict('You cannot change your own role or disable your own account. Ask another manager.')
  }
  return useDb().transaction(async (tx) => {
    const [user] = await tx.select().from(tables.users).where(and(eq(tables.users.id, id), ne(tables.users.role, 'guest'))).for('update')
    if (!user) notFound('No such staff member.')
    await tx.update(tables.users).set(patch).where(eq(tables.users.id, id))
    // A new role or a disabled account ends the person's sign-ins: they sign in again as what they now are.
    if ((patch.role !== undefined && patch.role !== user.role) || (patch.disabled !== undefined && patch.disabled !== user.disabled)) await endAllSessions(id, tx)
    const [row] = await tx.select().from(tables.users).where(eq(tables.users.id, id))
    return { id: row!.id, name: row!.name, email: row!.email, role: row!.role, disabled: row!.disabled, invitationPending: row!.passwordHash === null }
  })
})
