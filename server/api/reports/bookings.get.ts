import { bookingReportQuerySchema } from '../../../shared/schemas/bookings'

/** The manager's bookings view: sessions in a date range (venue days), their bookings, fill and takings. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const q = await readQueryAs(event, bookingReportQuerySchema)
  return loadBookingReport(await getVenue(), q)
})
