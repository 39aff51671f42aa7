import { and, asc, eq, gt, inArray, sql, type SQL } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { TastingSession } from '../db/schema/sessions'
import type { Venue } from '../db/schema/venues'
import type { PublicSession } from '../../shared/types/sessions'
import type { SeatCount } from '../../shared/seats'

/** A session as guests see it; seats left come from the shared rule (shared/seats.ts). */
function publicSessionView(s: TastingSession, flightName: string, count: SeatCount, timeZone: string, now = new Date()): PublicSession {
  const closesAt = new Date(s.startsAt.getTime() - s.bookingCutoffMinutes * 60_000)
  const { seatsLeft } = count
  const open = s.status === 'open' && now < closesAt
  return {
    id: s.id,
    flightId: s.flightId,
    flightName,
    startsAt: s.startsAt.toISOString(),
    startsLocal: DateTime.fromJSDate(s.startsAt, { zone: timeZone }).toISO({ suppressMilliseconds: true }),
    endsAt: new Date(s.startsAt.getTime() + s.durationMinutes * 60_000).toISOString(),
    durationMinutes: s.durationMinutes,
    seats: s.seats,
    seatsLeft,
    priceMinor: s.priceMinor,
    currency: s.currency,
    bookingClosesAt: closesAt.toISOString(),
    status: s.status,
    bookable: open && seatsLeft > 0,
    /** Why it cannot be booked, in words for the guest; null when it can. */
    closedReason: s.status === 'cancelled'
      ? 'This session has been cancelled.'
      : s.status !== 'open' || !open
        ? 'Booking for this session has closed.'
        : seatsLeft === 0 ? 'This session is full.' : null,
  }
}

/**
 * Open sessions still taking bookings (future, before their cut-off), with seats left, in two
 * queries (the sessions, then their seats grouped). `flightIds` narrows to some flights; full sessions are listed too (marked not bookable).
 */
export async function loadOpenSessions(venue: Venue, opts: { flightIds?: number[], limit?: number } = {}): Promise<PublicSession[]> {
  if (opts.flightIds && !opts.flightIds.length) return []
  const now = new Date()
  const s = tables.tastingSessions
  const where: SQL[] = [
    eq(s.venueId, venue.id),
    eq(s.status, 'open'),
    gt(s.startsAt, now),
    sql`${s.startsAt} > date_add(${now}, interval ${s.bookingCutoffMinutes} minute)`,
  ]
  if (opts.flightIds) where.push(inArray(s.flightId, opts.flightIds))
  const db = useDb()
  const rows = await db.select({ s, flightName: tables.flights.name })
    .from(s)
    .innerJoin(tables.flights, eq(tables.flights.id, s.flightId))
    .where(and(...where))
    .orderBy(asc(s.startsAt))
    .limit(opts.limit ?? 500)
  const counts = await loadSeatCounts(db, rows.map(r => r.s), now)
  return rows.map(r => publicSessionView(r.s, r.flightName, counts.get(r.s.id)!, venue.timeZone, now))
}

/** One session as a guest sees it before booking (any status, so the page can say why it is closed), or 404. */
export async function loadPublicSession(venue: Venue, id: number): Promise<PublicSession> {
  const now = new Date()
  const s = tables.tastingSessions
  const db = useDb()
  const [row] = await db.select({ s, flightName: tables.flights.name })
    .from(s)
    .innerJoin(tables.flights, eq(tables.flights.id, s.flightId))
    .where(and(eq(s.id, id), eq(s.venueId, venue.id)))
  if (!row) notFound('No such session.')
  const counts = await loadSeatCounts(db, [row.s], now)
  return publicSessionView(row.s, row.flightName, counts.get(row.s.id)!, venue.timeZone, now)
}
