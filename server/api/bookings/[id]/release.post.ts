import { eq } from 'drizzle-orm'
import { idParam } from '../../../../shared/schemas/common'

/** A guest gives back seats they hold but have not paid for; the payment page closes. */
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await readParamsAs(event, idParam)
  const booking = await loadGuestBooking(user.id, id)
  if (booking.state !== 'held') conflict(`This booking is ${booking.stateLabel.toLowerCase()}; there is no hold to give back.`)
  const [row] = await useDb().select().from(tables.bookings).where(eq(tables.bookings.id, id))
  const result = await endBookingHold(row!, 'hold_released')
  if (result === 'paid') conflict('The payment for this booking has just gone through, so it is confirmed. Cancel it instead if you cannot come.')
  return loadGuestBooking(user.id, id)
})
