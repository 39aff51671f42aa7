import { and, asc, eq, gte, inArray, lt } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { H3Event } from 'h3'
import type { Booking } from '../db/schema/bookings'
import type { CheckIn } from '../db/schema/checkins'
import type { TastingSession } from '../db/schema/sessions'
import type { Venue } from '../db/schema/venues'
import { BOOKING_HISTORY_LABELS, BOOKING_STATE_LABELS, type BookingHistoryEvent } from '../../shared/bookings'
import { formatDay, formatDayTime, formatTime } from '../../shared/dates'
import type { HostDay, HostHistoryStep, HostParty, HostPartyFound, SessionRoomReading } from '../../shared/types/host'
import { countSeats, doorTiles, seatFactOf, type DoorOutcome } from '../../shared/seats'
import { groupedBy } from '../../shared/utils/grouped'

/** States a host sees on the day's list: who is coming, who came, who did not. */
const ON_THE_LIST = ['held', 'confirmed', 'checked_in', 'no_show'] as const
/** The door outcomes that end in no_show, and so can be taken back until the session ends. */
const UNDOABLE: readonly DoorOutcome[] = ['no_show', 'turned_away']

const endOf = (s: Pick<TastingSession, 'startsAt' | 'durationMinutes'>) => new Date(s.startsAt.getTime() + s.durationMinutes * 60_000)
const mayAct = (user: CurrentUser, s: Pick<TastingSession, 'hostId'>) => user.role === 'manager' || s.hostId === user.id
const onList = (b: Booking, now: Date) => (ON_THE_LIST as readonly string[]).includes(b.state) && (b.state !== 'held' || b.holdExpiresAt > now)

/**
 * The check-in routes are for the session's own host (or a manager): another host or any guest
 * gets 403. Returns the user and the session (locked when `tx` is given).
 */
export async function requireSessionHost(event: H3Event, sessionId: number, action = 'check guests in') {
  const user = await requireRole(event, 'host', 'manager')
  const venue = await getVenue()
  const [session] = await useDb().select().from(tables.tastingSessions).where(and(eq(tables.tastingSessions.id, sessionId), eq(tables.tastingSessions.venueId, venue.id)))
  if (!session) notFound('No such session.')
  if (!mayAct(user, session)) {
    throw createError({ status: 403, statusText: 'Not your session', message: `Only the session's host or a manager can ${action}.` })
  }
  if (session.status === 'cancelled') conflict('This session is cancelled.')
  return { user, venue, session }
}

export async function bookingSessionId(bookingId: number): Promise<number> {
  const [b] = await useDb().select({ sessionId: tables.bookings.sessionId }).from(tables.bookings).where(eq(tables.bookings.id, bookingId))
  if (!b) notFound('No such booking.')
  return b.sessionId
}

/** The history of each booking, oldest step first, with the name of who took each step. */
async function historyOf(bookingIds: number[]): Promise<Map<number, HostHistoryStep[]>> {
  const out = new Map<number, HostHistoryStep[]>()
  if (!bookingIds.length) return out
  const e = tables.bookingEvents
  const rows = await useDb().select({ e, actorName: tables.users.name }).from(e)
    .leftJoin(tables.users, eq(tables.users.id, e.actorId))
    .where(inArray(e.bookingId, bookingIds)).orderBy(asc(e.at), asc(e.id))
  for (const { e: r, actorName } of rows) {
    const steps = out.get(r.bookingId) ?? []
    steps.push({ id: r.id, event: r.event, label: BOOKING_HISTORY_LABELS[r.event], fromState: r.fromState, toState: r.toState, actorName, reason: r.reason, at: r.at.toISOString() })
    out.set(r.bookingId, steps)
  }
  return out
}

/** One party as the door sees it. */
function partyView(b: Booking, c: CheckIn | null, history: HostHistoryStep[], session: TastingSession, user: CurrentUser, now: Date): HostParty {
  return {
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
    history,
    canUndo: b.state === 'no_show' && !!c && UNDOABLE.includes(c.outcome) && mayAct(user, session) && session.status !== 'cancelled' && now < endOf(session),
  }
}

/** Names of these users (who read a session's room), in one query. */
async function userNames(ids: number[]): Promise<Map<number, string>> {
  if (!ids.length) return new Map()
  const rows = await useDb().select({ id: tables.users.id, name: tables.users.name }).from(tables.users).where(inArray(tables.users.id, [...new Set(ids)]))
  return new Map(rows.map(r => [r.id, r.name]))
}

/** The host's reading of the session's room, or null until one is taken. */
function roomReadingView(s: TastingSession, readByName: string | null): SessionRoomReading | null {
  if (s.roomHumidityPct === null || s.roomAirTempC === null || !s.roomReadAt) return null
  return { sessionId: s.id, relativeHumidityPct: s.roomHumidityPct, airTempC: s.roomAirTempC, readAt: s.roomReadAt.toISOString(), readByName }
}

/** The session starts on `now`'s calendar day in the venue's zone. */
function isSessionDay(session: Pick<TastingSession, 'startsAt'>, venue: Venue, now = new Date()): boolean {
  return DateTime.fromJSDate(session.startsAt, { zone: venue.timeZone }).hasSame(DateTime.fromJSDate(now, { zone: venue.timeZone }), 'day')
}

/** A room is read on the session's own day: a reading from another day says nothing about its air. */
export function assertRoomReadingDay(session: TastingSession, venue: Venue, now = new Date()) {
  if (!isSessionDay(session, venue, now)) conflict(`Read the room on the day of the session (${formatDay(session.startsAt, venue, now)}).`)
}

/** The day's sessions in the venue's zone with their parties, check-ins, histories and counts, in five queries. */
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
    ? (await db.select({ b: tables.bookings, c: tables.checkIns }).from(tables.bookings)
        .leftJoin(tables.checkIns, eq(tables.checkIns.bookingId, tables.bookings.id))
        .where(and(inArray(tables.bookings.sessionId, ids), inArray(tables.bookings.state, ON_THE_LIST)))
        .orderBy(asc(tables.bookings.contactName))).filter(p => onList(p.b, now))
    : []
  const histories = await historyOf(parties.map(p => p.b.id))
  const readers = await userNames(sessions.flatMap(r => (r.s.roomReadBy ? [r.s.roomReadBy] : [])))
  const bySession = groupedBy(parties, p => p.b.sessionId)
  return {
    date: day.toISODate()!,
    timeZone: venue.timeZone,
    sessions: sessions.map(({ s, flightName, hostName }) => {
      const mine = bySession.get(s.id) ?? []
      const seats = countSeats(s.seats, mine.map(p => seatFactOf(p.b, p.c, now)))
      const sizes = (source: Booking['source']) => mine.filter(p => p.b.source === source).reduce((n, p) => n + p.b.partySize, 0)
      const ends = endOf(s)
      return {
        id: s.id,
        flightId: s.flightId,
        flightName,
        hostName,
        startsAt: s.startsAt.toISOString(),
        endsAt: ends.toISOString(),
        startsLocal: DateTime.fromJSDate(s.startsAt, { zone: venue.timeZone }).toFormat('HH:mm'),
        durationMinutes: s.durationMinutes,
        started: now >= s.startsAt,
        ended: now >= ends,
        status: s.status,
        canAct: mayAct(user, s),
        room: roomReadingView(s, readers.get(s.roomReadBy ?? 0) ?? null),
        canReadRoom: mayAct(user, s) && s.status !== 'cancelled' && isSessionDay(s, venue, now),
        // Seats and tiles by the shared rule (shared/seats.ts); the guests booked are summed from the parties themselves.
        counts: {
          seats: s.seats,
          taken: seats.seatsTaken,
          seatsLeft: seats.seatsLeft,
          bookedOnline: sizes('online'),
          walkIns: sizes('walk_in'),
          tiles: doorTiles(seats.breakdown),
          breakdown: seats.breakdown,
        },
        parties: mine.map(({ b, c }) => partyView(b, c, histories.get(b.id) ?? [], s, user, now)),
      }
    }),
  }
}

/**
 * The party with this (normalized) reference, for the session's host or a manager, with its
 * session's day, whatever its state: the door says where it belongs or that it ended.
 */
export async function partyByReference(venue: Venue, user: CurrentUser, reference: string, now = new Date()): Promise<HostPartyFound> {
  const [row] = await useDb().select({ b: tables.bookings, c: tables.checkIns, s: tables.tastingSessions, flightName: tables.flights.name, hostName: tables.users.name })
    .from(tables.bookings)
    .innerJoin(tables.tastingSessions, eq(tables.tastingSessions.id, tables.bookings.sessionId))
    .innerJoin(tables.flights, eq(tables.flights.id, tables.tastingSessions.flightId))
    .leftJoin(tables.users, eq(tables.users.id, tables.tastingSessions.hostId))
    .leftJoin(tables.checkIns, eq(tables.checkIns.bookingId, tables.bookings.id))
    .where(and(eq(tables.bookings.reference, reference), eq(tables.bookings.venueId, venue.id)))
  if (!row) notFound(`No booking has the reference ${reference}. Check it with the guest.`)
  const { b, c, s, flightName, hostName } = row
  if (!mayAct(user, s)) {
    throw createError({ status: 403, statusText: 'Not your session', message: `Booking ${reference} is for ${flightName} on ${formatDayTime(s.startsAt, venue)}, a session ${hostName ?? 'another host'} runs. Ask them or a manager.` })
  }
  const history = (await historyOf([b.id])).get(b.id) ?? []
  return {
    party: partyView(b, c, history, s, user, now),
    session: { id: s.id, flightName, hostName, startsAt: s.startsAt.toISOString(), date: DateTime.fromJSDate(s.startsAt, { zone: venue.timeZone }).toISODate()!, status: s.status },
    onList: onList(b, now),
  }
}

/** Adds one step to a booking's history (inside the caller's transaction). */
async function addHistory(tx: Tx, step: { bookingId: number, event: BookingHistoryEvent, from: Booking['state'], to: Booking['state'], actorId: number, reason?: string | null, at: Date }) {
  await tx.insert(tables.bookingEvents).values({ bookingId: step.bookingId, event: step.event, fromState: step.from, toState: step.to, actorId: step.actorId, reason: step.reason ?? null, at: step.at })
}

/** The door's outcome for a party: one check-in row per booking, replaced by a newer decision. */
async function writeCheckIn(tx: Tx, bookingId: number, hostId: number, c: { outcome: DoorOutcome, seated: number, idsSeen: number, reason?: string | null }, at: Date) {
  const values = { hostId, outcome: c.outcome, seated: c.seated, idsSeen: c.idsSeen, reason: c.reason ?? null, recordedAt: at }
  await tx.insert(tables.checkIns).values({ bookingId, ...values }).onDuplicateKeyUpdate({ set: values })
}

const DOOR_OUTCOME = { arrive: 'arrived', no_show: 'no_show', turn_away: 'turned_away' } as const

/**
 * A decision at the door about a booked party, with its session and booking rows locked by the
 * caller (`lockBookingWithSession`): the booking moves along the diagram, the check-in row says
 * what the host decided, and the history keeps the step, all in the caller's transaction.
 */
export async function decideAtDoor(tx: Tx, booking: Booking, actorId: number, d: { event: keyof typeof DOOR_OUTCOME, seated: number, idsSeen: number, reason?: string | null, patch?: Partial<Booking> }) {
  const at = new Date()
  const moved = await moveBooking(tx, booking, d.event, d.patch)
  await writeCheckIn(tx, booking.id, actorId, { outcome: DOOR_OUTCOME[d.event], seated: d.seated, idsSeen: d.idsSeen, reason: d.reason }, at)
  await addHistory(tx, { bookingId: booking.id, event: d.event, from: booking.state, to: moved.state, actorId, reason: d.reason, at })
}

/** A walk-in party is booked and seated in one step: its check-in row, and a first step of history. */
export async function recordWalkIn(tx: Tx, bookingId: number, actorId: number, partySize: number, idsSeen: number) {
  const at = new Date()
  await writeCheckIn(tx, bookingId, actorId, { outcome: 'arrived', seated: partySize, idsSeen }, at)
  await addHistory(tx, { bookingId, event: 'arrive', from: 'confirmed', to: 'checked_in', actorId, reason: 'Walk-in, seated at the door', at })
}

/**
 * Takes back the door's "did not come" or "turned away" (`undo_door`): the party is to come again
 * and can be seated. Only before the session ends, only for a no-show the door decided, and only
 * while its seats are free (walk-ins may have taken them). The session row is locked first.
 * Returns the Checkout Sessions of holds released on the way (see `lockedSeatCount`).
 */
export async function undoAtDoor(tx: Tx, venue: Venue, bookingId: number, actorId: number, reason: string | null, now = new Date()): Promise<string[]> {
  const { booking, session } = await lockBookingWithSession(tx, bookingId)
  const ends = endOf(session)
  if (now >= ends) conflict(`The session ended at ${formatTime(ends, venue)}; a decision at the door can no longer be undone.`)
  if (booking.state !== 'no_show') conflict(`This party is ${BOOKING_STATE_LABELS[booking.state].toLowerCase()}; there is no "did not come" or "turned away" to undo.`)
  const [door] = await tx.select().from(tables.checkIns).where(eq(tables.checkIns.bookingId, bookingId)).for('update')
  if (!door || !UNDOABLE.includes(door.outcome)) conflict('This party was not marked at the door, so there is nothing to undo here.')
  const { count, staleCheckouts } = await lockedSeatCount(tx, session, now)
  if (booking.partySize > count.seatsLeft) {
    conflict(`This party needs ${booking.partySize} seat${booking.partySize === 1 ? '' : 's'}; ${count.seatsLeft ? `only ${count.seatsLeft} left` : 'none are left'}.`, { seatsLeft: count.seatsLeft })
  }
  const moved = await moveBooking(tx, booking, 'undo_door')
  // The party has no door outcome again; its history keeps the decision and its undoing.
  await tx.delete(tables.checkIns).where(eq(tables.checkIns.bookingId, bookingId))
  await addHistory(tx, { bookingId, event: 'undo_door', from: booking.state, to: moved.state, actorId, reason, at: now })
  return staleCheckouts
}

/**
 * How long after a session ends its host may still record who came (a late entry at closing time,
 * a walk-in typed up after the last pour). Later, the door record of a past session is a manager's
 * to correct, so a host's account cannot rewrite old days.
 */
const DOOR_GRACE_HOURS = 6

export function assertSessionDay(session: TastingSession, venue: Venue, user: CurrentUser, now = new Date()) {
  const start = DateTime.fromJSDate(session.startsAt, { zone: venue.timeZone })
  const today = DateTime.fromJSDate(now, { zone: venue.timeZone })
  if (!start.hasSame(today, 'day') && now < session.startsAt) {
    conflict(`Check-in opens on the day of the session (${formatDay(session.startsAt, venue, now)}).`)
  }
  assertDoorOpen(session, user, now)
}

/** Door decisions on a session that ended more than DOOR_GRACE_HOURS ago are for managers only (409 for a host). */
export function assertDoorOpen(session: Pick<TastingSession, 'startsAt' | 'durationMinutes'>, user: CurrentUser, now = new Date()) {
  if (user.role === 'manager') return
  const closesAt = session.startsAt.getTime() + (session.durationMinutes * 60 + DOOR_GRACE_HOURS * 3600) * 1000
  if (now.getTime() > closesAt) {
    conflict(`This session ended more than ${DOOR_GRACE_HOURS} hours ago, so its door record is closed. Ask a manager to correct it.`)
  }
}
