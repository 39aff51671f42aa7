import { idParam } from '../../../../shared/schemas/common'

/** After the start, a party that has not come is marked as a no-show (the host can take it back until the session ends). */
export default defineEventHandler(async (event) => {
  // The role first, before the address or the body is read: a stranger learns nothing from them.
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const { user, session } = await requireSessionHost(event, await bookingSessionId(id))
  if (new Date() < session.startsAt) conflict('A party can be marked as not coming only after the session has started.')
  assertDoorOpen(session, user)
  await bookingTransaction(async (tx) => {
    const { booking } = await lockBookingWithSession(tx, id)
    await decideAtDoor(tx, booking, user.id, { event: 'no_show', seated: 0, idsSeen: 0 })
  })
  return { ok: true }
})
