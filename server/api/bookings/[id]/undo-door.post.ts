import { idParam } from '../../../../shared/schemas/common'
import { undoDoorSchema } from '../../../../shared/schemas/host'

/**
 * Takes back the door's "did not come" or "turned away" until the session ends: the party is to
 * come again (confirmed) and can be seated, if its seats are still free. 409 after the end, for a
 * no-show the door did not decide, or when walk-ins took the seats.
 */
export default defineEventHandler(async (event) => {
  // The role first, before the address or the body is read: a stranger learns nothing from them.
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const { reason } = await readBodyAs(event, undoDoorSchema)
  const { user, venue } = await requireSessionHost(event, await bookingSessionId(id))
  const staleCheckouts = await bookingTransaction(tx => undoAtDoor(tx, venue, id, user.id, reason ?? null))
  void expireCheckoutSessions(staleCheckouts)
  return { ok: true }
})
