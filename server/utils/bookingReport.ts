import { and, asc, eq, gte, inArray, lt, type SQL } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { Venue } from '../db/schema/venues'
import type { z } from 'zod'
import type { bookingReportQuerySchema } from '../../shared/schemas/bookings'
import type { BookingReport } from '../../shared/types/reports'

type ReportQuery = z.output<typeof bookingReportQuerySchema>

/** Seats that count towards the fill rate: live holds and confirmed seats, plus no-shows (they paid for theirs). */
const FILL_STATES = new Set(['held', 'confirmed', 'checked_in', 'no_show'])

/** The venue's calendar days turned into a UTC range; by default from a week ago to four weeks ahead. */
function reportRange(venue: Venue, q: Pick<ReportQuery, 'from' | 'to'>) {
  const today = DateTime.now().setZone(venue.timeZone).startOf('day')
  const from = q.from ? DateTime.fromISO(q.from, { zone: venue.timeZone }) : today.minus({ days: 7 })
  const to = q.to ? DateTime.fromISO(q.to, { zone: venue.timeZone }) : today.plus({ days: 28 })
  return { from: from.toISODate()!, to: to.toISODate()!, fromUtc: from.startOf('day').toUTC().toJSDate(), toUtc: to.plus({ days: 1 }).startOf('day').toUTC().toJSDate() }
}

/**
 * Sessions in the range with their bookings (two queries), each session's fill rate and takings,
 * and the totals. Takings are what was paid less what was refunded, in minor units.
 */
export async function loadBookingReport(venue: Venue, q: ReportQuery): Promise<BookingReport> {
  const range = reportRange(venue, q)
  const s = tables.tastingSessions
  const where: SQL[] = [eq(s.venueId, venue.id), gte(s.startsAt, range.fromUtc), lt(s.startsAt, range.toUtc)]
  if (q.flightId) where.push(eq(s.flightId, q.flightId))
  const sessions = await loadSessionViews(and(...where), venue.timeZone)
  const b = tables.bookings
  const rows = sessions.length
    ? await useDb().select({ b, guestName: tables.users.name, guestEmail: tables.users.email }).from(b)
        .innerJoin(tables.users, eq(tables.users.id, b.userId))
        .where(inArray(b.sessionId, sessions.map(x => x.id)))
        .orderBy(asc(b.sessionId), asc(b.createdAt))
    : []
  const now = Date.now()
  const out = sessions.map((session) => {
    const list = rows.filter(r => r.b.sessionId === session.id).map(({ b: row, guestName, guestEmail }) => ({
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
      holdLive: row.state === 'held' && row.holdExpiresAt.getTime() > now,
      createdAt: row.createdAt.toISOString(),
      refundedAt: row.refundedAt?.toISOString() ?? null,
    }))
    const seatsTaken = list.filter(x => FILL_STATES.has(x.state) && (x.state !== 'held' || x.holdLive)).reduce((n, x) => n + x.partySize, 0)
    const paidMinor = list.reduce((n, x) => n + x.amountPaidMinor, 0)
    const refundedMinor = list.reduce((n, x) => n + x.amountRefundedMinor, 0)
    return {
      session,
      bookings: list,
      seatsTaken,
      fillRate: session.seats ? seatsTaken / session.seats : 0,
      paidMinor,
      refundedMinor,
      revenueMinor: paidMinor - refundedMinor,
    }
  })
  const live = out.filter(x => x.session.status !== 'cancelled')
  const seats = live.reduce((n, x) => n + x.session.seats, 0)
  const seatsTaken = live.reduce((n, x) => n + x.seatsTaken, 0)
  return {
    from: range.from,
    to: range.to,
    currency: venue.currency,
    sessions: out,
    totals: {
      sessions: out.length,
      seats,
      seatsTaken,
      fillRate: seats ? seatsTaken / seats : 0,
      bookings: out.reduce((n, x) => n + x.bookings.length, 0),
      paidMinor: out.reduce((n, x) => n + x.paidMinor, 0),
      refundedMinor: out.reduce((n, x) => n + x.refundedMinor, 0),
      revenueMinor: out.reduce((n, x) => n + x.revenueMinor, 0),
    },
  }
}
