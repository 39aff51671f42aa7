import { idParam } from '../../../../shared/schemas/common'
import { turnAwaySchema } from '../../../../shared/schemas/host'

/** The party is not served (no ID, already intoxicated…): recorded with the reason; it ends as a no-show. */
export default defineEventHandler(async (event) => {
  const { id } = await readParamsAs(event, idParam)
  const { reason } = await readBodyAs(event, turnAwaySchema)
  const { user, venue, session } = await requireSessionHost(event, await bookingSessionId(id))
  assertSessionDay(session, venue)
  await bookingTransaction(async (tx) => {
    const { booking } = await lockBookingWithSession(tx, id)
    await moveBooking(tx, booking, 'no_show')
    await recordCheckIn(tx, id, user.id, { outcome: 'turned_away', seated: 0, idsSeen: 0, reason })
  })
  return { ok: true }
})
