// The booking rules, part 1: the transaction every change of seats runs in, its locks (session row
// first, then booking), the seat count under the lock and the one way a booking changes state.
import { randomBytes } from 'node:crypto'
import { and, eq, lte } from 'drizzle-orm'
import type { Booking } from '../../db/schema/bookings'
import type { TastingSession } from '../../db/schema/sessions'
import { countSeats, type SeatCount } from '../../../shared/seats'
import {
  BOOKING_STATE_LABELS, BOOKING_TRANSITIONS, REFERENCE_ALPHABET, REFERENCE_LENGTH,
  canTransition, type BookingEvent,
} from '../../../shared/bookings'

/** Ten characters of Crockford base32, 5 random bits each (a byte's low 5 bits are uniform). */
export function newBookingReference(): string {
  let out = ''
  for (const byte of randomBytes(REFERENCE_LENGTH)) out += REFERENCE_ALPHABET[byte & 31]
  return out
}

/**
 * A transaction for seats and payments. Correctness comes from the session row lock every path
 * takes first, so READ COMMITTED is enough and avoids InnoDB's gap locks, which would make holds
 * in neighbouring sessions wait on each other. A deadlock the server picks us as the victim of is
 * retried (the whole transaction, mail included, runs again from the start).
 */
export async function bookingTransaction<T>(fn: (tx: Tx) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await useDb().transaction(fn, { isolationLevel: 'read committed' })
    }
    catch (err) {
      if (isRetryableLockError(err) && attempt < 4) {
        await new Promise(r => setTimeout(r, 20 * attempt + Math.random() * 30))
        continue
      }
      throw err
    }
  }
}

/**
 * Runs `fn` after every earlier call for the same session in this process has finished: requests
 * that will wait for one session's row lock wait here instead, without holding a database
 * connection, so that a rush on one session cannot take the pool from everything else. It orders
 * work only; the row lock under it is what keeps the seats right, across processes too.
 */
export function inSessionQueue<T>(sessionId: number, fn: () => Promise<T>): Promise<T> {
  const before = sessionQueues.get(sessionId) ?? Promise.resolve()
  const run = before.then(fn, fn)
  const tail = run.then(() => {}, () => {})
  sessionQueues.set(sessionId, tail)
  void tail.then(() => { if (sessionQueues.get(sessionId) === tail) sessionQueues.delete(sessionId) })
  return run
}
const sessionQueues = new Map<number, Promise<void>>()

export async function lockSessionRow(tx: Tx, sessionId: number): Promise<TastingSession> {
  const [s] = await tx.select().from(tables.tastingSessions).where(eq(tables.tastingSessions.id, sessionId)).for('update')
  if (!s) notFound('No such session.')
  return s
}

/** Held bookings of a session whose time ran out become expired (inside the caller's transaction). */
async function expireRunOutHolds(tx: Tx, sessionId: number, now: Date): Promise<string[]> {
  const b = tables.bookings
  const stale = await tx.select().from(b).where(and(eq(b.sessionId, sessionId), eq(b.state, 'held'), lte(b.holdExpiresAt, now))).for('update')
  for (const booking of stale) await moveBooking(tx, booking, 'expire', { expiredAt: now, endReason: 'hold_expired' })
  return stale.flatMap(s => (s.checkoutSessionId ? [s.checkoutSessionId] : []))
}

/**
 * The seats of a session the caller has locked (`lockSessionRow`), for a decision about them. Its
 * holds whose time ran out are released first: the shared rule gives them no seats, so they must
 * not stay payable as holds either (a payment that still arrives for one takes the late-payment
 * path, which checks the seats again). One grouped query and the shared rule
 * (shared/seats.ts), exactly as every screen counts. Returns the released holds' Checkout Sessions,
 * to close with `expireCheckoutSessions` once the transaction has committed.
 */
export async function lockedSeatCount(tx: Tx, session: Pick<TastingSession, 'id' | 'seats'>, now = new Date()): Promise<{ count: SeatCount, staleCheckouts: string[] }> {
  // One query while the lock is held, in the usual case: the release and a second count only when
  // the facts show a hold that ran out (the shared rule gives it no seat either way).
  const facts = (await loadSeatFacts(tx, [session], now)).get(session.id) ?? []
  if (!facts.some(f => f.state === 'held' && !f.holdLive)) return { count: countSeats(session.seats, facts), staleCheckouts: [] }
  const staleCheckouts = await expireRunOutHolds(tx, session.id, now)
  const count = (await loadSeatCounts(tx, [session], now)).get(session.id)!
  return { count, staleCheckouts }
}

/**
 * Moves a booking along one edge of the state diagram, guarded by its current state in the WHERE
 * clause. Anything not on the diagram is a 409. Call inside a transaction with the row locked.
 */
export async function moveBooking(tx: Tx, booking: Booking, event: BookingEvent, patch: Partial<Booking> = {}): Promise<Booking> {
  if (!canTransition(booking.state, event)) {
    conflict(`This booking is ${BOOKING_STATE_LABELS[booking.state].toLowerCase()}; it cannot be ${EVENT_WORDS[event]}.`)
  }
  const to = BOOKING_TRANSITIONS[event].to
  const { id: _id, createdAt: _c, updatedAt: _u, ...rest } = patch
  await tx.update(tables.bookings).set({ ...rest, state: to })
    .where(and(eq(tables.bookings.id, booking.id), eq(tables.bookings.state, booking.state)))
  return { ...booking, ...rest, state: to }
}

const EVENT_WORDS: Record<BookingEvent, string> = {
  pay: 'paid', late_payment: 'paid', arrive: 'checked in', no_show: 'marked as a no-show',
  turn_away: 'turned away', undo_door: 'put back on the list to come',
  cancel: 'cancelled', refund: 'refunded', expire: 'released',
}

async function lockBooking(tx: Tx, id: number): Promise<Booking> {
  const [b] = await tx.select().from(tables.bookings).where(eq(tables.bookings.id, id)).for('update')
  if (!b) notFound('No such booking.')
  return b
}

/** The session and booking rows locked, always in that order (so two paths never deadlock). */
export async function lockBookingWithSession(tx: Tx, id: number): Promise<{ booking: Booking, session: TastingSession }> {
  const [pre] = await tx.select({ sessionId: tables.bookings.sessionId }).from(tables.bookings).where(eq(tables.bookings.id, id))
  if (!pre) notFound('No such booking.')
  const session = await lockSessionRow(tx, pre.sessionId)
  const booking = await lockBooking(tx, id)
  return { booking, session }
}
