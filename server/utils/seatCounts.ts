import { eq, inArray, sql } from 'drizzle-orm'
import { countSeats, type DoorOutcome, type SeatCount, type SeatFact } from '../../shared/seats'
import type { BookingState } from '../../shared/bookings'

/**
 * Seats of several sessions by the shared rule (shared/seats.ts), from one grouped query: party
 * sizes and seated counts summed per session, state, live hold, door outcome and source. Without a
 * lock it is a read for display; the booking transaction calls it with the session row locked.
 */
export async function loadSeatCounts(db: Db | Tx, sessions: readonly { id: number, seats: number }[], now: Date): Promise<Map<number, SeatCount>> {
  const facts = await loadSeatFacts(db, sessions, now)
  const out = new Map<number, SeatCount>()
  for (const s of sessions) out.set(s.id, countSeats(s.seats, facts.get(s.id) ?? []))
  return out
}

/** What the seat rule counts, per session: one fact per group of bookings (state, live hold, door outcome, source). */
export async function loadSeatFacts(db: Db | Tx, sessions: readonly { id: number }[], now: Date): Promise<Map<number, SeatFact[]>> {
  const facts = new Map<number, SeatFact[]>()
  if (!sessions.length) return facts
  const b = tables.bookings
  const c = tables.checkIns
  const holdLive = sql<number>`(${b.state} = 'held' and ${b.holdExpiresAt} > ${now})`
  const rows = await db.select({
    sessionId: b.sessionId,
    state: b.state,
    source: b.source,
    holdLive: holdLive.mapWith(Number),
    outcome: c.outcome,
    partySize: sql<number>`sum(${b.partySize})`.mapWith(Number),
    seated: sql<number>`coalesce(sum(${c.seated}), 0)`.mapWith(Number),
  }).from(b)
    .leftJoin(c, eq(c.bookingId, b.id))
    .where(inArray(b.sessionId, [...new Set(sessions.map(s => s.id))]))
    .groupBy(b.sessionId, b.state, b.source, holdLive, c.outcome)
  for (const r of rows) {
    const list = facts.get(r.sessionId) ?? []
    list.push({ state: r.state as BookingState, partySize: r.partySize, holdLive: r.holdLive === 1, outcome: r.outcome as DoorOutcome | null, seated: r.seated, walkIn: r.source === 'walk_in' })
    facts.set(r.sessionId, list)
  }
  return facts
}
