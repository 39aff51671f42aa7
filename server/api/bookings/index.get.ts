import { bookingListQuerySchema } from '../../../shared/schemas/bookings'
import type { BookingView } from '../../../shared/types/bookings'

/** The signed-in person's own bookings, newest session first; `?sessionId=` keeps one session's. */
export default defineEventHandler(async (event): Promise<BookingView[]> => {
  const user = await requireUser(event)
  const { sessionId } = await readQueryAs(event, bookingListQuerySchema)
  return loadGuestBookings(user.id, { sessionId })
})
