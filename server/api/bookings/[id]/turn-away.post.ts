import { idParam } from '../../../../shared/schemas/common'
import { turnAwaySchema } from '../../../../shared/schemas/host'

/**
 * The party is not served (no ID, already intoxicated…): recorded with the reason; it ends as a
 * no-show, which the host can take back until the session ends (undo-door).
 */
export default defineEventHandler(async (event) => {
  // The role first, before the address or the body is read: a stranger learns nothing from them.
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const { reason } = await readBodyAs(event, turnAwaySchema)
  const { user, venue, session } = await requireSessionHost(event, await bookingSessionId(id))
  assertSessionDay(session, venue, user)
  await bookingTransaction(async (tx) => {
    const { booking } = await lockBookingWithSession(tx, id)
    await decideAtDoor(tx, booking, user.id, { event: 'turn_away', seated: 0, idsSeen: 0, reason })
  })
  return { ok: true }
})
