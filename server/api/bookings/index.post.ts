import { bookingCreateSchema } from '../../../shared/schemas/bookings'
import type { BookingCreated } from '../../../shared/types/bookings'

/** Holds seats for a signed-in guest and answers with the payment page to send them to. */
export default defineEventHandler(async (event): Promise<BookingCreated> => {
  const user = await requireRole(event, 'guest')
  const input = await readBodyAs(event, bookingCreateSchema)
  const { booking, checkoutUrl } = await createBookingHold(user, input)
  setResponseStatus(event, 201)
  return { booking: await loadGuestBooking(user.id, booking.id), checkoutUrl }
})
