// The booking rules, part 2: holding seats and opening the Checkout Session for them.
import { and, desc, eq, gt } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { Booking } from '../../db/schema/bookings'
import type { TastingSession } from '../../db/schema/sessions'
import type { Venue } from '../../db/schema/venues'
import type { User } from '../../db/schema/users'
import type { CurrentUser } from '../auth'
import type { z } from 'zod'
import type { bookingCreateSchema } from '../../../shared/schemas/bookings'
import { ageOn } from '../../../shared/schemas/auth'
import { venueContactText } from '../../../shared/venueContact'
import { PARTY_MAX } from '../../../shared/bookings'
import { countSeats } from '../../../shared/seats'

/**
 * What one guest may keep unpaid at once, so that nobody can sit on a venue's seats: at most
 * UNPAID_HOLDS_PER_GUEST holds, of at most UNPAID_SEATS_PER_GUEST seats together, across sessions;
 * in one session a guest has one live hold (a second request finds it) of at most PARTY_MAX seats.
 * Both are counted inside the booking transaction with the guest's own row locked, so requests in
 * parallel are counted one after another. (Documented in DEVELOPERS.md, "Seat hoarding".)
 */
const UNPAID_HOLDS_PER_GUEST = 3
const UNPAID_SEATS_PER_GUEST = PARTY_MAX

type BookingInput = z.output<typeof bookingCreateSchema>

/** How long a second request for the same hold waits for the first to open its payment page. */
const CHECKOUT_WAIT_MS = 10_000

/** A hold and the rows it was decided on, so that the answer needs no second read. */
export interface BookingHold { booking: Booking, session: TastingSession, flightName: string, venue: Venue, checkoutUrl: string, resumed: boolean }

/**
 * Holds seats and opens a Checkout Session. The payment provider is called only after the
 * transaction commits; if that call fails the hold is released and the guest gets a 503.
 *
 * The transaction locks the guest's own row first, and with it (one statement) their live holds:
 * under that lock alone it finds the guest's live hold in this session (a second request, Back
 * from the payment page, another tab: answered with that hold, never a second one, since the
 * guest's requests queue on their row) and counts their unpaid holds. Only then does it lock the
 * session row, which every booking of the session waits for: under it the session's state and the
 * seats are read, the run-out holds released and the hold inserted, so that the lock is held for
 * as few round trips as possible.
 *
 * Requests for one session take their turn in this process first (`inSessionQueue`), so those
 * waiting for its lock hold no database connection. A request the seats cannot take is refused
 * before any lock, from plain reads made at once: a refusal needs no lock to be right (it writes
 * nothing), and the seats it saw were taken an instant before. Whatever those reads say, a hold is
 * only ever inserted after the count under the lock.
 *
 * `account` is the guest's row as the sign-in check read it in this request (read again if absent).
 */
export async function createBookingHold(user: CurrentUser, input: BookingInput, account?: Pick<User, 'dateOfBirth' | 'emailVerifiedAt'>): Promise<BookingHold> {
  const db = useDb()
  const { booking: cfg } = useRuntimeConfig()
  const now = new Date()
  const b = tables.bookings
  const liveOwnHold = and(eq(b.sessionId, input.sessionId), eq(b.userId, user.id), eq(b.state, 'held'), gt(b.holdExpiresAt, now))
  // Every read before the locks at once (one round trip): the venue is kept in memory, the seat
  // facts need only the session's id, and a guest with a live hold here is answered with it below.
  const [venue, me, [found], [probe], facts] = await Promise.all([
    getVenue(),
    account ?? db.select({ dateOfBirth: tables.users.dateOfBirth, emailVerifiedAt: tables.users.emailVerifiedAt }).from(tables.users).where(eq(tables.users.id, user.id)).then(r => r[0]),
    db.select().from(tables.tastingSessions).where(eq(tables.tastingSessions.id, input.sessionId)),
    db.select({ id: b.id }).from(b).where(liveOwnHold).limit(1),
    loadSeatFacts(db, [{ id: input.sessionId }], now),
  ])
  if (!me?.emailVerifiedAt) addressNotConfirmed(user)
  if (me.dateOfBirth && me.dateOfBirth !== input.dateOfBirth) {
    invalidFields({ dateOfBirth: `This is not the date of birth on your account. If your account has it wrong, please contact ${venueContactText(venue)}.` })
  }
  // Another venue's session is "no such session", like a missing one.
  const pre = found?.venueId === venue.id ? found : undefined
  if (!pre) invalidFields({ sessionId: 'No such session.' })
  const sessionDay = DateTime.fromJSDate(pre.startsAt, { zone: venue.timeZone }).toISODate()!
  if (ageOn(input.dateOfBirth, sessionDay) < venue.legalAge) {
    invalidFields({ dateOfBirth: `You must be ${venue.legalAge} or older on the day of the session to book. Local law sets this age and our hosts follow it.` })
  }
  if (!probe) {
    refuseUnbookable(pre, now)
    const left = countSeats(pre.seats, facts.get(pre.id) ?? []).seatsLeft
    if (input.partySize > left) refuseSeats(left)
  }

  const holdMs = Math.max(1, Number(cfg.holdMinutes)) * 60_000
  const held = await inSessionQueue(pre.id, () => bookingTransaction(async (tx) => {
    // The guest's own row and their live holds (all sessions), locked in one statement: their
    // requests in parallel queue here, and the unpaid holds they already have are counted one
    // request at a time. The one here (if any) is resumed, the rest are counted.
    const mine = await tx.select({ email: tables.users.email, emailVerifiedAt: tables.users.emailVerifiedAt, hold: b })
      .from(tables.users)
      .leftJoin(b, and(eq(b.userId, tables.users.id), eq(b.state, 'held'), gt(b.holdExpiresAt, now)))
      .where(eq(tables.users.id, user.id)).orderBy(desc(b.id)).for('update')
    const row = mine[0]
    if (!row?.emailVerifiedAt) addressNotConfirmed(user)
    const live = mine.flatMap(r => (r.hold ? [r.hold] : []))
    const own = live.find(h => h.sessionId === pre.id)
    if (own) {
      if (own.partySize !== input.partySize) {
        conflict(
          `You are already holding ${own.partySize} seat${own.partySize === 1 ? '' : 's'} in this session, waiting for payment. Continue paying for them, or give them back to book for a different party.`,
          { booking: { id: own.id, partySize: own.partySize, checkoutUrl: own.checkoutUrl } },
        )
      }
      return { booking: own as Booking | undefined, bookingId: own.id, session: pre, resumed: true, staleCheckouts: [] as string[] }
    }
    const seats = live.reduce((n, h) => n + h.partySize, 0)
    if (live.length >= UNPAID_HOLDS_PER_GUEST) {
      conflict(`You already have ${live.length} bookings waiting for payment. Finish paying for them, or give their seats back, before holding more.`)
    }
    if (seats + input.partySize > UNPAID_SEATS_PER_GUEST) {
      conflict(`You already hold ${seats} unpaid seat${seats === 1 ? '' : 's'}; together with these that would be more than ${UNPAID_SEATS_PER_GUEST}. Finish paying for them, or give some back, first.`)
    }
    if (!me.dateOfBirth) await tx.update(tables.users).set({ dateOfBirth: input.dateOfBirth }).where(eq(tables.users.id, user.id))

    const session = await lockSessionRow(tx, input.sessionId)
    refuseUnbookable(session, now)
    const { count, staleCheckouts } = await lockedSeatCount(tx, session, now)
    if (input.partySize > count.seatsLeft) refuseSeats(count.seatsLeft)
    const values = {
      venueId: venue.id, sessionId: session.id, userId: user.id, reference: newBookingReference(), state: 'held' as const,
      partySize: input.partySize, contactName: input.contactName, contactEmail: row.email, contactPhone: input.contactPhone, notes: input.notes ?? null,
      ageConfirmed: input.ageConfirmed, unitPriceMinor: session.priceMinor, amountMinor: session.priceMinor * input.partySize,
      currency: session.currency, holdExpiresAt: new Date(now.getTime() + holdMs),
    }
    const [inserted] = await tx.insert(b).values(values).$returningId()
    return { booking: undefined as Booking | undefined, bookingId: inserted!.id, session, resumed: false, staleCheckouts }
  }))
  void expireCheckoutSessions(held.staleCheckouts)
  const session = held.session
  if (held.booking) {
    // A hold found again (read under the lock): only the flight's name is left to read.
    const flightName = await flightNameOf(pre.flightId)
    return { booking: held.booking, session, flightName, venue, checkoutUrl: await paymentPageOf(held.booking), resumed: true }
  }
  // Read back after the commit, outside the locks, with the flight's name in the same statement.
  const [back] = await db.select({ booking: b, flightName: tables.flights.name }).from(b)
    .leftJoin(tables.flights, eq(tables.flights.id, session.flightId))
    .where(eq(b.id, held.bookingId))
  if (!back) throw paymentUnavailable()
  const { booking } = back
  const flightName = back.flightName ?? 'Tasting flight'

  if (booking.amountMinor === 0) {
    // A free session needs no payment: the hold is confirmed at once.
    await confirmBookingPaid(booking.id, { amountPaid: 0, paymentIntentId: null })
    const [confirmed] = await db.select().from(b).where(eq(b.id, booking.id))
    return { booking: confirmed ?? booking, session, flightName, venue, checkoutUrl: appLink(`/bookings/${booking.id}?paid=1`), resumed: false }
  }
  try {
    const checkout = await openCheckout(venue, booking, session, flightName)
    await db.update(b).set({ checkoutSessionId: checkout.id, checkoutUrl: checkout.url })
      .where(and(eq(b.id, booking.id), eq(b.state, 'held')))
    return { booking: { ...booking, checkoutSessionId: checkout.id, checkoutUrl: checkout.url }, session, flightName, venue, checkoutUrl: checkout.url!, resumed: false }
  }
  catch (err) {
    console.error(`[bookings] checkout for booking ${booking.id} failed:`, (err as Error).message)
    await bookingTransaction(async (tx) => {
      const locked = await lockBookingWithSession(tx, booking.id)
      if (locked.booking.state === 'held') await moveBooking(tx, locked.booking, 'expire', { expiredAt: new Date(), endReason: 'checkout_failed' })
    })
    throw paymentUnavailable()
  }
}

/** 409 for a session that takes no bookings now (checked before the locks, and again under them). */
function refuseUnbookable(session: TastingSession, now: Date): void {
  if (session.status === 'cancelled') conflict('This session has been cancelled. Please choose another one.')
  if (session.status !== 'open') conflict('This session is not taking bookings. Please choose another one.')
  const closesAt = session.startsAt.getTime() - session.bookingCutoffMinutes * 60_000
  if (now.getTime() >= closesAt) conflict(`Booking for this session closed ${session.bookingCutoffMinutes} minutes before the start. Please choose another session.`)
}

function refuseSeats(left: number): never {
  return conflict(left <= 0 ? 'Sorry, this session is now full. Please choose another one.' : `Only ${left} seat${left === 1 ? '' : 's'} left in this session. Choose a smaller party or another session.`, { seatsLeft: left })
}

/** 403 for a guest who has not confirmed their address yet: what to do is on the booking page. */
function addressNotConfirmed(user: CurrentUser): never {
  throw createError({ status: 403, statusText: 'Address not confirmed', message: `Confirm your e-mail address first: open the link we sent to ${user.email}. You can ask for a new link on this page.`, data: { reason: 'address_not_confirmed' } })
}

const paymentUnavailable = () => createError({ status: 503, statusText: 'Payment unavailable', message: 'We could not reach the payment service, so nothing was booked and nothing was charged. Please try again in a few minutes.' })

/**
 * Where to pay for a hold found again. Its payment page may still be in the making (the request
 * that made the hold is talking to the provider): wait for it a little, rather than open a second.
 */
async function paymentPageOf(hold: Booking): Promise<string> {
  const until = Date.now() + CHECKOUT_WAIT_MS
  let row: Booking | undefined = hold
  for (;;) {
    if (!row) notFound('No such booking.')
    if (row.state === 'held' && row.checkoutUrl) return row.checkoutUrl
    if (row.state === 'confirmed') return appLink(`/bookings/${row.id}?paid=1`)
    if (row.state !== 'held') throw paymentUnavailable()
    if (Date.now() > until) throw createError({ status: 503, statusText: 'Payment page not ready', message: 'Your seats are held, but their payment page is not ready yet. Please try again in a moment.' })
    await new Promise(r => setTimeout(r, 200))
    const [again] = await useDb().select().from(tables.bookings).where(eq(tables.bookings.id, hold.id))
    row = again
  }
}

async function openCheckout(venue: Venue, booking: Booking, session: TastingSession, flightName: string) {
  const expiresAtMs = Math.max(booking.holdExpiresAt.getTime(), Date.now() + checkoutMinLifetimeMs() + 60_000)
  const when = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short', timeZone: venue.timeZone }).format(session.startsAt)
  const metadata = { bookingId: String(booking.id), reference: booking.reference }
  const checkout = await useStripe().checkout.sessions.create({
    mode: 'payment',
    line_items: [{
      quantity: booking.partySize,
      price_data: {
        currency: booking.currency.toLowerCase(),
        unit_amount: booking.unitPriceMinor,
        product_data: { name: `${flightName}, ${when}`, description: `Seated tasting at ${venue.name}` },
      },
    }],
    customer_email: booking.contactEmail,
    client_reference_id: String(booking.id),
    metadata,
    payment_intent_data: { metadata, description: `Booking ${booking.reference}` },
    expires_at: Math.ceil(expiresAtMs / 1000),
    submit_type: 'book',
    success_url: appLink(`/bookings/${booking.id}?paid=1`),
    cancel_url: appLink(`/bookings/${booking.id}?paid=0`),
  }, { idempotencyKey: `booking-${booking.id}-${booking.reference}-checkout` })
  if (!checkout.url) throw new Error('the Checkout Session has no URL')
  return checkout
}

/** Closes Checkout Sessions whose hold has ended, so nobody can pay for seats that are gone. */
export async function expireCheckoutSessions(ids: string[]): Promise<void> {
  for (const id of ids) {
    try { await useStripe().checkout.sessions.expire(id) }
    catch (err) {
      if (!isFinalStripeError(err)) console.error(`[bookings] could not expire checkout ${id}:`, (err as Error).message)
    }
  }
}
