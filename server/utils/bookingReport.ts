import { and, asc, count, eq, gte, inArray, lt, sql, type SQL } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { Venue } from '../db/schema/venues'
import type { z } from 'zod'
import type { bookingReportQuerySchema } from '../../shared/schemas/bookings'
import { addSeatCounts, countSeats, seatFactOf } from '../../shared/seats'
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
 * Sessions in the range with their bookings, each session's seats, fill rate and takings, and the
 * totals of the whole range. Seats taken and left are the shared rule (shared/seats.ts), as every
 * other screen shows them; the fill rate is of seats sold, which also counts the parties that did
 * not come or were turned away (they paid for their seats). Takings are what was paid less what
 * was refunded, in minor units.
 *
 * `page` (from 1, `pageSize` sessions each, in start order) bounds what is read and sent in full: the
 * totals come from grouped queries over the whole range, the parties and their details only for the
 * page's sessions, so a busy month costs a page's worth of rows. Without `page`, every session (the
 * CSV export).
 */
export async function loadBookingReport(venue: Venue, q: ReportQuery, paging?: { page: number, pageSize: number }): Promise<BookingReport> {
  const range = reportRange(venue, q)
  const s = tables.tastingSessions
  const b = tables.bookings
  const db = useDb()
  const where: SQL[] = [eq(s.venueId, venue.id), gte(s.startsAt, range.fromUtc), lt(s.startsAt, range.toUtc)]
  if (q.flightId) where.push(eq(s.flightId, q.flightId))
  const inRange = await db.select({ id: s.id, seats: s.seats, status: s.status }).from(s).where(and(...where)).orderBy(asc(s.startsAt), asc(s.id))
  const ids = inRange.map(x => x.id)
  const now = new Date()
  const [seatCounts, [money]] = await Promise.all([
    loadSeatCounts(db, inRange, now),
    ids.length
      ? db.select({ n: count(), paid: sql<number>`coalesce(sum(${b.amountPaidMinor}), 0)`.mapWith(Number), refunded: sql<number>`coalesce(sum(${b.amountRefundedMinor}), 0)`.mapWith(Number) }).from(b).where(inArray(b.sessionId, ids))
      : [{ n: 0, paid: 0, refunded: 0 }],
  ])
  const shownIds = paging ? ids.slice((paging.page - 1) * paging.pageSize, paging.page * paging.pageSize) : ids
  const [sessions, rows] = shownIds.length
    ? await Promise.all([
        loadSessionViews(inArray(s.id, shownIds), venue.timeZone),
        db.select({ b, guestName: tables.users.name, guestEmail: tables.users.email, checkIn: { outcome: tables.checkIns.outcome, seated: tables.checkIns.seated } }).from(b)
          .innerJoin(tables.users, eq(tables.users.id, b.userId))
          .leftJoin(tables.checkIns, eq(tables.checkIns.bookingId, b.id))
          .where(inArray(b.sessionId, shownIds))
          .orderBy(asc(b.sessionId), asc(b.createdAt)),
      ])
    : [[], []]
  // Grouped once, so the page's sessions cost one pass over their bookings, not one per session.
  const bySession = groupedBy(rows, r => r.b.sessionId)
  const out = sessions.map((session) => {
    const mine = bySession.get(session.id) ?? []
    const seats = countSeats(session.seats, mine.map(r => seatFactOf(r.b, r.checkIn, now)))
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
  const live = addSeatCounts(inRange.filter(x => x.status !== 'cancelled').map(x => seatCounts.get(x.id)!))
  return {
    from: range.from,
    to: range.to,
    currency: venue.currency,
    sessions: out,
    page: paging?.page ?? 1,
    pageSize: paging?.pageSize ?? Math.max(1, ids.length),
    totals: {
      sessions: ids.length,
      seats: live.seats,
      seatsTaken: live.seatsTaken,
      seatsLeft: live.seatsLeft,
      seatsSold: live.seatsSold,
      fillRate: live.seats ? live.seatsSold / live.seats : 0,
      bookings: money?.n ?? 0,
      paidMinor: money?.paid ?? 0,
      refundedMinor: money?.refunded ?? 0,
      revenueMinor: (money?.paid ?? 0) - (money?.refunded ?? 0),
    },
  }
}
