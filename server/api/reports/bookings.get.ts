import { bookingReportQuerySchema } from '../../../shared/schemas/bookings'
import type { BookingReport } from '../../../shared/types/reports'

/** The manager's bookings view: sessions in a date range (venue days), their bookings, fill and takings. */
export default defineEventHandler(async (event): Promise<BookingReport> => {
  await requireRole(event, 'manager')
  const q = await readQueryAs(event, bookingReportQuerySchema)
  return loadBookingReport(await getVenue(), q)
})
