import { and, asc, eq, gte, inArray, lt, type SQL } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { Venue } from '../db/schema/venues'
import type { z } from 'zod'
import type { bookingReportQuerySchema } from '../../shared/schemas/bookings'
import { addSeatCounts, countSeats, seatFactOf, type SeatCount } from '../../shared/seats'
import type { BookingReport } from '../../shared/types/reports'
import { groupedBy } from '../../shared/utils/grouped'

type ReportQuery = z.output<typeof bookingReportQuerySchema>

/** The venue's calendar days turned into a UTC range; by default from a week ago to four weeks ahead. */
function reportRange(venue: Venue, q: Pick<ReportQuery, 'from' | 'to'>) {
  const today = DateTime.now().setZone(venue.timeZone).startOf('day')
  const from = q.from ? DateTime.fromISO(q.from, { zone: venue.timeZone }) : today.minus({ days: 7 })
  const to = q.to ? DateTime.fromISO(q.to, { zone: venue.timeZone }) : today.plus({ days: 28 })
  return { from: from.toISODate()!, to: to.toISODate()!, fromUtc: from.startOf('day').toUTC().toJSDate(), toUtc: to.plus({ days: 1 }).startOf('day').toUTC().toJSDate() }
}

/**
 * Sessions in the range with their bookings (two queries), each session's seats, fill rate and
 * takings, and the totals. Seats taken and left are the shared rule (shared/seats.ts), as every
 * other screen shows them; the fill rate is of seats sold, which also counts the parties that did
 * not come or were turned away (they paid for their seats). Takings are what was paid less what
 * was refunded, in minor units.
 */
export async function loadBookingReport(venue: Venue, q: ReportQuery): Promise<BookingReport> {
  const range = reportRange(venue, q)
  const s = tables.tastingSessions
  const where: SQL[] = [eq(s.venueId, venue.id), gte(s.startsAt, range.fromUtc), lt(s.startsAt, range.toUtc)]
  if (q.flightId) where.push(eq(s.flightId, q.flightId))
  const sessions = await loadSessionViews(and(...where), venue.timeZone)
  const b = tables.bookings
  const rows = sessions.length
    ? await useDb().select({ b, guestName: tables.users.name, guestEmail: tables.users.email, checkIn: { outcome: tables.checkIns.outcome, seated: tables.checkIns.seated } }).from(b)
        .innerJoin(tables.users, eq(tables.users.id, b.userId))
        .leftJoin(tables.checkIns, eq(tables.checkIns.bookingId, b.id))
        .where(inArray(b.sessionId, sessions.map(x => x.id)))
        .orderBy(asc(b.sessionId), asc(b.createdAt))
    : []
  const now = new Date()
  const counts = new Map<number, SeatCount>()
  // Grouped once, so a month of a busy venue costs one pass over its bookings, not one per session.
  const bySession = groupedBy(rows, r => r.b.sessionId)
  const out = sessions.map((session) => {
    const mine = bySession.get(session.id) ?? []
    const seats = countSeats(session.seats, mine.map(r => seatFactOf(r.b, r.checkIn, now)))
    counts.set(session.id, seats)
    const list = mine.map(({ b: row, guestName, guestEmail }) => ({
      id: row.id,
      reference: row.reference,
      state: row.state,
      endReason: row.endReason,
      guestName,
      guestEmail,
      contactName: row.contactName,
      contactEmail: row.contactEmail,
      contactPhone: row.contactPhone,
      notes: row.notes?.trim() ? row.notes : null,
      partySize: row.partySize,
      amountMinor: row.amountMinor,
      amountPaidMinor: row.amountPaidMinor,
      amountRefundedMinor: row.amountRefundedMinor,
      currency: row.currency,
      holdLive: row.state === 'held' && row.holdExpiresAt.getTime() > now.getTime(),
      createdAt: row.createdAt.toISOString(),
      refundedAt: row.refundedAt?.toISOString() ?? null,
    }))
    const paidMinor = list.reduce((n, x) => n + x.amountPaidMinor, 0)
    const refundedMinor = list.reduce((n, x) => n + x.amountRefundedMinor, 0)
    return {
      session,
      bookings: list,
      seatsTaken: seats.seatsTaken,
      seatsLeft: seats.seatsLeft,
      seatsSold: seats.seatsSold,
      seatBreakdown: seats.breakdown,
      fillRate: session.seats ? seats.seatsSold / session.seats : 0,
      paidMinor,
      refundedMinor,
      revenueMinor: paidMinor - refundedMinor,
    }
  })
  const live = addSeatCounts(out.filter(x => x.session.status !== 'cancelled').map(x => counts.get(x.session.id)!))
  return {
    from: range.from,
    to: range.to,
    currency: venue.currency,
    sessions: out,
    totals: {
      sessions: out.length,
      seats: live.seats,
      seatsTaken: live.seatsTaken,
      seatsLeft: live.seatsLeft,
      seatsSold: live.seatsSold,
      fillRate: live.seats ? live.seatsSold / live.seats : 0,
      bookings: out.reduce((n, x) => n + x.bookings.length, 0),
      paidMinor: out.reduce((n, x) => n + x.paidMinor, 0),
      refundedMinor: out.reduce((n, x) => n + x.refundedMinor, 0),
      revenueMinor: out.reduce((n, x) => n + x.revenueMinor, 0),
    },
  }
}
