import Papa from 'papaparse'
import { bookingReportQuerySchema } from '../../../shared/schemas/bookings'
import { BOOKING_STATE_LABELS } from '../../../shared/bookings'
import { minorToDecimal } from '../../../shared/money'
import { SESSION_STATUS_LABELS } from '../../../shared/sessions'
import { formatStampInZone } from '../../../shared/dates'

/** A cell a spreadsheet would run as a formula gets a leading apostrophe (OWASP, CSV injection). */
const safeText = (v: string) => (/^[=+\-@\t\r]/.test(v) ? `'${v}` : v)

/** The bookings of the sessions in the range, one row each, for a spreadsheet. Times in the venue's zone. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const q = await readQueryAs(event, bookingReportQuerySchema)
  const venue = await getVenue()
  const report = await loadBookingReport(venue, q)
  const local = (iso: string) => formatStampInZone(iso, venue.timeZone)
  // Holds that ran out unpaid are left out: nothing happened and nothing was charged.
  const rows = report.sessions.flatMap(({ session, bookings }) => bookings.filter(b => b.state !== 'expired' || b.amountPaidMinor > 0).map(b => ({
    'Reference': b.reference,
    'Session start': local(session.startsAt),
    'Session id': session.id,
    'Flight': safeText(session.flightName),
    'Session status': SESSION_STATUS_LABELS[session.status],
    'Guest': safeText(b.contactName),
    'E-mail': safeText(b.contactEmail),
    'Phone': safeText(b.contactPhone),
    'Party': b.partySize,
    'Guest notes': safeText(b.notes ?? ''),
    'State': BOOKING_STATE_LABELS[b.state],
    'Amount due': minorToDecimal(b.amountMinor, b.currency),
    'Paid': minorToDecimal(b.amountPaidMinor, b.currency),
    'Refunded': minorToDecimal(b.amountRefundedMinor, b.currency),
    'Currency': b.currency,
    'Booked at': local(b.createdAt),
  })))
  const fields = ['Reference', 'Session start', 'Session id', 'Flight', 'Session status', 'Guest', 'E-mail', 'Phone', 'Party', 'Guest notes', 'State', 'Amount due', 'Paid', 'Refunded', 'Currency', 'Booked at']
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="bookings-${report.from}-to-${report.to}.csv"`)
  return Papa.unparse({ fields, data: rows.map(r => fields.map(f => r[f as keyof typeof r])) }, { newline: '\r\n' })
})
