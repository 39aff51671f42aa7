import { REPORT_SESSIONS_PER_PAGE, bookingReportPageQuerySchema } from '../../../shared/schemas/bookings'
import type { BookingReport } from '../../../shared/types/reports'

/**
 * The manager's bookings view: sessions in a date range (venue days), a page of them with their
 * bookings, fill and takings, and the whole range's totals.
 */
export default defineEventHandler(async (event): Promise<BookingReport> => {
  await requireRole(event, 'manager')
  const { page, ...q } = await readQueryAs(event, bookingReportPageQuerySchema)
  return loadBookingReport(await getVenue(), q, { page, pageSize: REPORT_SESSIONS_PER_PAGE })
})
