import { eq } from 'drizzle-orm'
import { inviteSchema } from '../../../shared/schemas/staff'

/** A manager invites a staff member: the account exists at once, the password comes from the link. */
export default defineEventHandler(async (event) => {
  const manager = await requireRole(event, 'manager')
  const input = await readBodyAs(event, inviteSchema)
  const taken = (): never => conflict('An account with this e-mail already exists.', { fields: { email: 'An account with this e-mail already exists.' } })
  const [existing] = await useDb().select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, input.email))
  if (existing) taken()
  // The unique index on e-mail settles a race; the whole invitation rolls back with it.
  const id = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(tables.users).values({ email: input.email, name: input.name, role: input.role }).$returningId()
    await queueInvitation(tx, { userId: row!.id, email: input.email, name: input.name, role: input.role, invitedBy: manager })
    return row!.id
  }).catch((err) => {
    if (isDuplicateKey(err)) taken()
    throw err
  })
  kickOutbox()
  setResponseStatus(event, 201)
  return { id, invitationPending: true }
})
