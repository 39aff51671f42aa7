import { and, asc, eq, gte, inArray, lt } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { H3Event } from 'h3'
import type { TastingSession } from '../db/schema/sessions'
import type { Venue } from '../db/schema/venues'
import { BOOKING_STATE_LABELS } from '../../shared/bookings'
import type { HostDay } from '../../shared/types/host'
import { countSeats, seatFactOf } from '../../shared/seats'

/** States a host sees on the day's list: who is coming, who came, who did not. */
const ON_THE_LIST = ['held', 'confirmed', 'checked_in', 'no_show'] as const

/**
 * The check-in routes are for the session's own host (or a manager): another host or any guest
 * gets 403. Returns the user and the session (locked when `tx` is given).
 */
export async function requireSessionHost(event: H3Event, sessionId: number) {
  const user = await requireRole(event, 'host', 'manager')
  const venue = await getVenue()
  const [session] = await useDb().select().from(tables.tastingSessions).where(and(eq(tables.tastingSessions.id, sessionId), eq(tables.tastingSessions.venueId, venue.id)))
  if (!session) notFound('No such session.')
  if (user.role !== 'manager' && session.hostId !== user.id) {
    throw createError({ status: 403, statusText: 'Not your session', message: 'Only the session\'s host or a manager can check guests in.' })
  }
  if (session.status === 'cancelled') conflict('This session is cancelled.')
  return { user, venue, session }
}

export async function bookingSessionId(bookingId: number): Promise<number> {
  const [b] = await useDb().select({ sessionId: tables.bookings.sessionId }).from(tables.bookings).where(eq(tables.bookings.id, bookingId))
  if (!b) notFound('No such booking.')
  return b.sessionId
}

/** The day's sessions in the venue's zone with their parties, check-ins and counts, in three queries. */
export async function hostDay(venue: Venue, user: CurrentUser, date: string, now = new Date()): Promise<HostDay> {
  const day = DateTime.fromISO(date, { zone: venue.timeZone }).startOf('day')
  const db = useDb()
  const where = [eq(tables.tastingSessions.venueId, venue.id), gte(tables.tastingSessions.startsAt, day.toUTC().toJSDate()), lt(tables.tastingSessions.startsAt, day.plus({ days: 1 }).toUTC().toJSDate())]
  if (user.role !== 'manager') where.push(eq(tables.tastingSessions.hostId, user.id))
  const sessions = await db.select({ s: tables.tastingSessions, flightName: tables.flights.name, hostName: tables.users.name })
    .from(tables.tastingSessions).innerJoin(tables.flights, eq(tables.flights.id, tables.tastingSessions.flightId))
    .leftJoin(tables.users, eq(tables.users.id, tables.tastingSessions.hostId))
    .where(and(...where)).orderBy(asc(tables.tastingSessions.startsAt))
  const ids = sessions.map(r => r.s.id)
  const parties = ids.length
    ? await db.select({ b: tables.bookings, c: tables.checkIns }).from(tables.bookings)
        .leftJoin(tables.checkIns, eq(tables.checkIns.bookingId, tables.bookings.id))
        .where(and(inArray(tables.bookings.sessionId, ids), inArray(tables.bookings.state, ON_THE_LIST)))
        .orderBy(asc(tables.bookings.contactName))
    : []
  return {
    date: day.toISODate()!,
    timeZone: venue.timeZone,
    sessions: sessions.map(({ s, flightName, hostName }) => {
      const mine = parties.filter(p => p.b.sessionId === s.id).filter(p => p.b.state !== 'held' || p.b.holdExpiresAt > now)
      const seats = countSeats(s.seats, mine.map(p => seatFactOf(p.b, p.c, now)))
      const { breakdown } = seats
      return {
        id: s.id,
        flightId: s.flightId,
        flightName,
        hostName,
        startsAt: s.startsAt.toISOString(),
        startsLocal: DateTime.fromJSDate(s.startsAt, { zone: venue.timeZone }).toFormat('HH:mm'),
        durationMinutes: s.durationMinutes,
        started: now >= s.startsAt,
        status: s.status,
        canAct: user.role === 'manager' || s.hostId === user.id,
        // Seats by the shared rule (shared/seats.ts); expected, arrived and noShows are the panel's own words for parts of it.
        counts: {
          seats: s.seats,
          taken: seats.seatsTaken,
          seatsLeft: seats.seatsLeft,
          expected: breakdown.confirmed,
          arrived: breakdown.seated + breakdown.walkIns,
          noShows: breakdown.didNotCome + breakdown.turnedAway,
          breakdown,
        },
        parties: mine.map(({ b, c }) => ({
          id: b.id,
          reference: b.reference,
          contactName: b.contactName,
          contactPhone: b.contactPhone,
          partySize: b.partySize,
          notes: b.notes,
          source: b.source,
          state: b.state,
          stateLabel: BOOKING_STATE_LABELS[b.state],
          paid: b.amountPaidMinor >= b.amountMinor && b.amountMinor > 0 ? 'paid' as const : b.source === 'walk_in' ? 'at_the_door' as const : b.state === 'held' ? 'waiting' as const : 'unpaid' as const,
          amountMinor: b.amountMinor,
          amountPaidMinor: b.amountPaidMinor,
          currency: b.currency,
          checkIn: c ? { outcome: c.outcome, seated: c.seated, idsSeen: c.idsSeen, reason: c.reason, recordedAt: c.recordedAt.toISOString() } : null,
        })),
      }
    }),
  }
}

/** Records the door outcome for a booking inside the caller's transaction. */
export async function recordCheckIn(tx: Tx, bookingId: number, hostId: number, c: { outcome: 'arrived' | 'turned_away' | 'no_show', seated: number, idsSeen: number, reason?: string | null }) {
  await tx.insert(tables.checkIns).values({ bookingId, hostId, outcome: c.outcome, seated: c.seated, idsSeen: c.idsSeen, reason: c.reason ?? null, recordedAt: new Date() })
}

export function assertSessionDay(session: TastingSession, venue: Venue, now = new Date()) {
  const start = DateTime.fromJSDate(session.startsAt, { zone: venue.timeZone })
  const today = DateTime.fromJSDate(now, { zone: venue.timeZone })
  if (!start.hasSame(today, 'day') && now < session.startsAt) {
    conflict(`Check-in opens on the day of the session (${start.toFormat('ccc d LLL')}).`)
  }
}
