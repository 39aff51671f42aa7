import { bookingCreateSchema } from '../../../shared/schemas/bookings'
import type { BookingCreated } from '../../../shared/types/bookings'

/**
 * Holds seats for a signed-in guest and answers with the payment page to send them to: 201 for a
 * new hold, 200 with the guest's live hold when they already have one in this session.
 */
export default defineEventHandler(async (event): Promise<BookingCreated> => {
  const user = await requireRole(event, 'guest')
  const input = await readBodyAs(event, bookingCreateSchema)
  const { booking, session, flightName, venue, checkoutUrl, resumed } = await createBookingHold(user, input, signedInAccount(event))
  setResponseStatus(event, resumed ? 200 : 201)
  // Built from the rows the hold already read: no second read of what it just wrote.
  return { booking: bookingView(booking, session, flightName, venue), checkoutUrl, resumed }
})
