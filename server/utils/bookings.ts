import { randomBytes } from 'node:crypto'
import { and, eq, gt, inArray, lte, sql } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { Booking } from '../db/schema/bookings'
import type { TastingSession } from '../db/schema/sessions'
import type { Venue } from '../db/schema/venues'
import type { MailMessage } from './mail'
import type { BookingMailContext } from './bookingEmails'
import type { CurrentUser } from './auth'
import type { z } from 'zod'
import type { bookingCreateSchema } from '../../shared/schemas/bookings'
import { ageOn } from '../../shared/schemas/auth'
import {
  BOOKING_STATE_LABELS, BOOKING_TRANSITIONS, REFERENCE_ALPHABET, REFERENCE_LENGTH, SEAT_TAKING_STATES,
  canTransition, type BookingEndReason, type BookingEvent,
} from '../../shared/bookings'
import type { BookingView } from '../../shared/types/bookings'

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

export function bookingConflict(message: string, data?: Record<string, unknown>): never {
  throw createError({ statusCode: 409, statusMessage: 'Conflict', message, ...(data ? { data } : {}) })
}

const notFound = (): never => { throw createError({ statusCode: 404, statusMessage: 'Not found', message: 'No such booking.' }) }

export async function lockSessionRow(tx: Tx, sessionId: number): Promise<TastingSession> {
  const [s] = await tx.select().from(tables.tastingSessions).where(eq(tables.tastingSessions.id, sessionId)).for('update')
  if (!s) throw createError({ statusCode: 404, statusMessage: 'Not found', message: 'No such session.' })
  return s
}

/** Party sizes of held, confirmed and checked-in bookings; call with the session row locked. */
export async function seatsTaken(tx: Tx, sessionId: number): Promise<number> {
  const b = tables.bookings
  const [row] = await tx.select({ n: sql<number>`coalesce(sum(${b.partySize}), 0)`.mapWith(Number) }).from(b)
    .where(and(eq(b.sessionId, sessionId), inArray(b.state, SEAT_TAKING_STATES)))
  return row?.n ?? 0
}

/** Unpaid holds one guest may keep open at once, so that nobody can sit on a venue's seats. */
const LIVE_HOLDS_PER_GUEST = 3

/**
 * Moves a booking along one edge of the state diagram, guarded by its current state in the WHERE
 * clause. Anything not on the diagram is a 409. Call inside a transaction with the row locked.
 */
export async function moveBooking(tx: Tx, booking: Booking, event: BookingEvent, patch: Partial<Booking> = {}): Promise<Booking> {
  if (!canTransition(booking.state, event)) {
    bookingConflict(`This booking is ${BOOKING_STATE_LABELS[booking.state].toLowerCase()}; it cannot be ${EVENT_WORDS[event]}.`)
  }
  const to = BOOKING_TRANSITIONS[event].to
  const { id: _id, createdAt: _c, updatedAt: _u, ...rest } = patch
  await tx.update(tables.bookings).set({ ...rest, state: to })
    .where(and(eq(tables.bookings.id, booking.id), eq(tables.bookings.state, booking.state)))
  return { ...booking, ...rest, state: to }
}

const EVENT_WORDS: Record<BookingEvent, string> = {
  pay: 'paid', late_payment: 'paid', arrive: 'checked in', no_show: 'marked as a no-show',
  cancel: 'cancelled', refund: 'refunded', expire: 'released',
}

async function lockBooking(tx: Tx, id: number): Promise<Booking> {
  const [b] = await tx.select().from(tables.bookings).where(eq(tables.bookings.id, id)).for('update')
  if (!b) notFound()
  return b!
}

/** The session and booking rows locked, always in that order (so two paths never deadlock). */
export async function lockBookingWithSession(tx: Tx, id: number): Promise<{ booking: Booking, session: TastingSession }> {
  const [pre] = await tx.select({ sessionId: tables.bookings.sessionId }).from(tables.bookings).where(eq(tables.bookings.id, id))
  if (!pre) notFound()
  const session = await lockSessionRow(tx, pre!.sessionId)
  const booking = await lockBooking(tx, id)
  return { booking, session }
}

async function flightNameOf(flightId: number): Promise<string> {
  const [f] = await useDb().select({ name: tables.flights.name }).from(tables.flights).where(eq(tables.flights.id, flightId))
  return f?.name ?? 'Tasting flight'
}

export async function bookingMailContext(venue: Venue, booking: Booking, session: TastingSession, flightName?: string): Promise<BookingMailContext> {
  return { venue, booking, session, flightName: flightName ?? await flightNameOf(session.flightId) }
}

// ——— holds and checkout ———

type BookingInput = z.output<typeof bookingCreateSchema>

/**
 * Holds seats and opens a Checkout Session. One transaction locks the session row, releases its
 * run-out holds, counts the seats still taken and inserts the hold; the payment provider is called
 * only after it commits. If that call fails the hold is released and the guest gets a 503.
 */
export async function createBookingHold(user: CurrentUser, input: BookingInput): Promise<{ booking: Booking, checkoutUrl: string }> {
  const venue = await getVenue()
  const db = useDb()
  const { booking: cfg } = useRuntimeConfig()
  const [account] = await db.select({ dateOfBirth: tables.users.dateOfBirth }).from(tables.users).where(eq(tables.users.id, user.id))
  const invalid = (field: string, message: string): never => {
    throw createError({ statusCode: 400, statusMessage: 'Invalid input', message, data: { fields: { [field]: message } } })
  }
  if (account?.dateOfBirth && account.dateOfBirth !== input.dateOfBirth) {
    invalid('dateOfBirth', 'This is not the date of birth on your account. If your account has it wrong, please contact the venue.')
  }
  const [pre] = await db.select().from(tables.tastingSessions)
    .where(and(eq(tables.tastingSessions.id, input.sessionId), eq(tables.tastingSessions.venueId, venue.id)))
  if (!pre) invalid('sessionId', 'No such session.')
  const sessionDay = DateTime.fromJSDate(pre!.startsAt, { zone: venue.timeZone }).toISODate()!
  if (ageOn(input.dateOfBirth, sessionDay) < venue.legalAge) {
    invalid('dateOfBirth', `You must be ${venue.legalAge} or older on the day of the session to book. Local law sets this age and our hosts follow it.`)
  }

  const now = new Date()
  const [{ live } = { live: 0 }] = await db.select({ live: sql<number>`count(*)`.mapWith(Number) }).from(tables.bookings)
    .where(and(eq(tables.bookings.userId, user.id), eq(tables.bookings.state, 'held'), gt(tables.bookings.holdExpiresAt, now)))
  if (live >= LIVE_HOLDS_PER_GUEST) {
    bookingConflict(`You already have ${live} bookings waiting for payment. Finish paying for them, or give their seats back, before holding more.`)
  }
  const holdMs = Math.max(1, Number(cfg.holdMinutes)) * 60_000
  const { booking, staleCheckouts } = await bookingTransaction(async (tx) => {
    const session = await lockSessionRow(tx, input.sessionId)
    if (session.status === 'cancelled') bookingConflict('This session has been cancelled. Please choose another one.')
    if (session.status !== 'open') bookingConflict('This session is not taking bookings. Please choose another one.')
    const closesAt = session.startsAt.getTime() - session.bookingCutoffMinutes * 60_000
    if (now.getTime() >= closesAt) bookingConflict(`Booking for this session closed ${session.bookingCutoffMinutes} minutes before the start. Please choose another session.`)

    const staleCheckouts = await expireRunOutHolds(tx, session.id, now)
    const left = session.seats - await seatsTaken(tx, session.id)
    if (input.partySize > left) {
      bookingConflict(left <= 0 ? 'Sorry, this session is now full. Please choose another one.' : `Only ${left} seat${left === 1 ? '' : 's'} left in this session. Choose a smaller party or another session.`, { seatsLeft: Math.max(0, left) })
    }
    const values = {
      venueId: venue.id, sessionId: session.id, userId: user.id, reference: newBookingReference(), state: 'held' as const,
      partySize: input.partySize, contactName: input.contactName, contactEmail: input.contactEmail, contactPhone: input.contactPhone, notes: input.notes ?? null,
      ageConfirmed: input.ageConfirmed, unitPriceMinor: session.priceMinor, amountMinor: session.priceMinor * input.partySize,
      currency: session.currency, holdExpiresAt: new Date(now.getTime() + holdMs),
    }
    const [row] = await tx.insert(tables.bookings).values(values).$returningId()
    if (!account?.dateOfBirth) await tx.update(tables.users).set({ dateOfBirth: input.dateOfBirth }).where(eq(tables.users.id, user.id))
    const [booking] = await tx.select().from(tables.bookings).where(eq(tables.bookings.id, row!.id))
    return { booking: booking!, staleCheckouts }
  })
  void expireCheckoutSessions(staleCheckouts)

  const flightName = await flightNameOf(pre!.flightId)
  if (booking.amountMinor === 0) {
    // A free session needs no payment: the hold is confirmed at once.
    await confirmBookingPaid(booking.id, { amountPaid: 0, paymentIntentId: null })
    return { booking, checkoutUrl: appLink(`/bookings/${booking.id}?paid=1`) }
  }
  try {
    const checkout = await openCheckout(venue, booking, pre!, flightName)
    await db.update(tables.bookings).set({ checkoutSessionId: checkout.id, checkoutUrl: checkout.url })
      .where(and(eq(tables.bookings.id, booking.id), eq(tables.bookings.state, 'held')))
    return { booking: { ...booking, checkoutSessionId: checkout.id, checkoutUrl: checkout.url }, checkoutUrl: checkout.url! }
  }
  catch (err) {
    console.error(`[bookings] checkout for booking ${booking.id} failed:`, (err as Error).message)
    await bookingTransaction(async (tx) => {
      const locked = await lockBookingWithSession(tx, booking.id)
      if (locked.booking.state === 'held') await moveBooking(tx, locked.booking, 'expire', { expiredAt: new Date(), endReason: 'checkout_failed' })
    })
    throw createError({ statusCode: 503, statusMessage: 'Payment unavailable', message: 'We could not reach the payment service, so nothing was booked and nothing was charged. Please try again in a few minutes.' })
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

/** Held bookings of a session whose time ran out become expired (inside the caller's transaction). */
async function expireRunOutHolds(tx: Tx, sessionId: number, now: Date): Promise<string[]> {
  const b = tables.bookings
  const stale = await tx.select().from(b).where(and(eq(b.sessionId, sessionId), eq(b.state, 'held'), lte(b.holdExpiresAt, now))).for('update')
  for (const booking of stale) await moveBooking(tx, booking, 'expire', { expiredAt: now, endReason: 'hold_expired' })
  return stale.flatMap(s => (s.checkoutSessionId ? [s.checkoutSessionId] : []))
}

/** Closes Checkout Sessions whose hold has ended, so nobody can pay for seats that are gone. */
async function expireCheckoutSessions(ids: string[]): Promise<void> {
  for (const id of ids) {
    try { await useStripe().checkout.sessions.expire(id) }
    catch (err) {
      if (!isFinalStripeError(err)) console.error(`[bookings] could not expire checkout ${id}:`, (err as Error).message)
    }
  }
}

// ——— payment outcomes ———

export interface PaidFacts { amountPaid: number, paymentIntentId: string | null }

/**
 * A payment the provider reports as done. A held booking is confirmed. A booking whose hold ran
 * out is confirmed only if its seats are still free (and the session still on, not started);
 * otherwise it stays expired, the payment is recorded and refunded, and the guest is told.
 * Returns what happened, and whether a refund must follow.
 */
export async function applyBookingPayment(tx: Tx, venue: Venue, bookingId: number, paid: PaidFacts): Promise<{ outcome: string, refund: boolean }> {
  const { booking, session } = await lockBookingWithSession(tx, bookingId)
  const now = new Date()
  const facts = { amountPaidMinor: paid.amountPaid, paymentIntentId: paid.paymentIntentId, confirmedAt: now }
  if (booking.state === 'held') {
    const confirmed = await moveBooking(tx, booking, 'pay', facts)
    await queueMail(tx, await confirmationEmail(await bookingMailContext(venue, confirmed, session)))
    return { outcome: 'confirmed', refund: false }
  }
  if (booking.state === 'expired' && booking.amountPaidMinor === 0 && !booking.paymentIntentId) {
    const left = session.seats - await seatsTaken(tx, session.id)
    const sessionOn = session.status !== 'cancelled' && session.startsAt.getTime() > now.getTime()
    if (sessionOn && left >= booking.partySize) {
      const confirmed = await moveBooking(tx, booking, 'late_payment', { ...facts, endReason: null, expiredAt: null })
      await queueMail(tx, await confirmationEmail(await bookingMailContext(venue, confirmed, session)))
      return { outcome: 'late payment, seats still free: confirmed', refund: false }
    }
    await tx.update(tables.bookings).set({ amountPaidMinor: paid.amountPaid, paymentIntentId: paid.paymentIntentId, endReason: 'late_payment_no_seats' })
      .where(eq(tables.bookings.id, booking.id))
    return { outcome: 'late payment, no seats: refund', refund: paid.amountPaid > 0 }
  }
  return { outcome: `nothing to do: booking is ${booking.state}`, refund: false }
}

/** Confirms a booking outside a webhook (a free session, or a sweep that found the checkout paid). */
async function confirmBookingPaid(bookingId: number, paid: PaidFacts): Promise<void> {
  const venue = await getVenue()
  const result = await bookingTransaction(tx => applyBookingPayment(tx, venue, bookingId, paid))
  kickOutbox()
  if (result.refund) await refundBooking(bookingId).catch(err => console.error(`[bookings] refund of ${bookingId} failed:`, (err as Error).message))
}

/** Held → expired, with the session row locked; nothing if it is no longer held. */
export async function releaseBookingHold(bookingId: number, reason: BookingEndReason): Promise<boolean> {
  return bookingTransaction(async (tx) => {
    const { booking } = await lockBookingWithSession(tx, bookingId)
    if (booking.state !== 'held') return false
    await moveBooking(tx, booking, 'expire', { expiredAt: new Date(), endReason: reason })
    return true
  })
}

/**
 * Ends a hold for good: first closes its Checkout Session, so the guest cannot pay afterwards. If
 * the provider says it was paid meanwhile, the payment is applied instead. If the provider cannot
 * be reached the hold is released anyway (seats never stay blocked); a payment that still arrives
 * goes through the late-payment path.
 */
export async function endBookingHold(booking: Pick<Booking, 'id' | 'checkoutSessionId'>, reason: BookingEndReason): Promise<'released' | 'paid' | 'unchanged'> {
  if (booking.checkoutSessionId && useRuntimeConfig().stripe.secretKey) {
    try { await useStripe().checkout.sessions.expire(booking.checkoutSessionId) }
    catch (err) {
      if (isFinalStripeError(err)) {
        const cs = await useStripe().checkout.sessions.retrieve(booking.checkoutSessionId).catch(() => null)
        if (cs?.status === 'complete' && cs.payment_status === 'paid') {
          await confirmBookingPaid(booking.id, { amountPaid: cs.amount_total ?? 0, paymentIntentId: typeof cs.payment_intent === 'string' ? cs.payment_intent : cs.payment_intent?.id ?? null })
          return 'paid'
        }
      }
      else console.error(`[bookings] could not expire checkout ${booking.checkoutSessionId}:`, (err as Error).message)
    }
  }
  return (await releaseBookingHold(booking.id, reason)) ? 'released' : 'unchanged'
}

// ——— cancelling and refunding ———

/** Cancellation cut-off of the venue: the last instant a guest may cancel online. */
export const bookingCancelDeadline = (venue: Venue, session: Pick<TastingSession, 'startsAt'>) =>
  new Date(session.startsAt.getTime() - venue.cancellationCutoffHours * 3_600_000)

/** A guest cancels their own paid booking before the cut-off; the refund follows at once. */
export async function cancelByGuest(user: CurrentUser, bookingId: number): Promise<void> {
  const venue = await getVenue()
  await bookingTransaction(async (tx) => {
    const [own] = await tx.select({ id: tables.bookings.id }).from(tables.bookings)
      .where(and(eq(tables.bookings.id, bookingId), eq(tables.bookings.userId, user.id)))
    if (!own) notFound()
    const { booking, session } = await lockBookingWithSession(tx, bookingId)
    if (booking.state === 'held') bookingConflict('This booking is not paid yet, so there is nothing to cancel. Give the seats back instead, or let the time to pay run out.')
    if (!canTransition(booking.state, 'cancel')) bookingConflict(`This booking is ${BOOKING_STATE_LABELS[booking.state].toLowerCase()}; it cannot be cancelled.`)
    const deadline = bookingCancelDeadline(venue, session)
    if (Date.now() >= deadline.getTime()) {
      bookingConflict(`Bookings can be cancelled online up to ${venue.cancellationCutoffHours} hours before the start; for this session that was ${mailVenueTime(deadline, venue.timeZone)}. Please contact ${venue.name}, ${venue.address}.`)
    }
    const cancelled = await moveBooking(tx, booking, 'cancel', { cancelledAt: new Date(), endReason: 'guest_cancelled' })
    await queueMail(tx, cancellationEmail(await bookingMailContext(venue, cancelled, session), 'guest'))
  })
  kickOutbox()
  await refundBooking(bookingId).catch(err => console.error(`[bookings] refund of ${bookingId} failed, will retry:`, (err as Error).message))
}

/**
 * Returns a booking's payment: a cancelled booking becomes refunded, a late payment on an expired
 * booking is returned. The provider call carries an idempotency key derived from the booking, so
 * the route, the retry sweep and a webhook can all call this and only one refund is made; only
 * the transaction that records it queues the e-mail.
 */
export async function refundBooking(bookingId: number): Promise<boolean> {
  const db = useDb()
  const [b] = await db.select().from(tables.bookings).where(eq(tables.bookings.id, bookingId))
  if (!b) return false
  if (b.refundedAt) return true
  const due = b.amountPaidMinor - b.amountRefundedMinor
  if (b.state === 'cancelled' && due <= 0) {
    // Nothing was paid (a free session): the refund step is empty.
    await bookingTransaction(async (tx) => {
      const { booking } = await lockBookingWithSession(tx, bookingId)
      if (booking.state === 'cancelled' && !booking.refundedAt) await moveBooking(tx, booking, 'refund', { refundedAt: new Date() })
    })
    return true
  }
  if (!(b.state === 'cancelled' || b.state === 'expired') || due <= 0) return false
  if (!b.paymentIntentId) {
    console.warn(`[bookings] booking ${b.id} was paid outside online checkout; the venue refunds it directly.`)
    return false
  }
  const refund = await useStripe().refunds.create({
    payment_intent: b.paymentIntentId,
    reason: 'requested_by_customer',
    metadata: { bookingId: String(b.id), reference: b.reference },
  }, { idempotencyKey: `booking-${b.id}-${b.reference}-refund` })
  await recordBookingRefund(bookingId, { refundId: refund.id, amount: refund.amount })
  return true
}

/** Writes a refund the provider has made (from the API answer or its webhook), once. */
export async function recordBookingRefund(bookingId: number, facts: { refundId: string | null, amount: number }): Promise<boolean> {
  const venue = await getVenue()
  const recorded = await bookingTransaction(async (tx) => {
    const { booking, session } = await lockBookingWithSession(tx, bookingId)
    if (booking.refundedAt) return false
    const patch = { refundId: facts.refundId, amountRefundedMinor: facts.amount, refundedAt: new Date() }
    let message: MailMessage
    if (booking.state === 'cancelled') {
      const refunded = await moveBooking(tx, booking, 'refund', patch)
      message = refundEmail(await bookingMailContext(venue, refunded, session))
    }
    else if (booking.state === 'expired') {
      await tx.update(tables.bookings).set(patch).where(eq(tables.bookings.id, booking.id))
      const reason = session.status === 'cancelled' ? 'the session has been cancelled' : session.startsAt.getTime() <= Date.now() ? 'the session had already started' : 'the seats had gone to other guests'
      message = latePaymentRefundEmail(await bookingMailContext(venue, { ...booking, ...patch }, session), reason)
    }
    else return false
    await queueMail(tx, message)
    return true
  })
  if (recorded) kickOutbox()
  return recorded
}

/**
 * The venue cancels a session: it stops taking bookings, holds are released (their checkout
 * closed), paid bookings are cancelled and refunded, and every guest is told. 409 if already done.
 */
export async function cancelTastingSession(venue: Venue, sessionId: number) {
  const { cancelled, holds } = await bookingTransaction(async (tx) => {
    const [own] = await tx.select({ id: tables.tastingSessions.id }).from(tables.tastingSessions)
      .where(and(eq(tables.tastingSessions.id, sessionId), eq(tables.tastingSessions.venueId, venue.id)))
    if (!own) throw createError({ statusCode: 404, statusMessage: 'Not found', message: 'No such session.' })
    const session = await lockSessionRow(tx, sessionId)
    if (session.status === 'cancelled') bookingConflict('This session is already cancelled.')
    await tx.update(tables.tastingSessions).set({ status: 'cancelled' }).where(eq(tables.tastingSessions.id, sessionId))
    const rows = await tx.select().from(tables.bookings).where(eq(tables.bookings.sessionId, sessionId)).for('update')
    const flightName = await flightNameOf(session.flightId)
    const now = new Date()
    const cancelled: number[] = []
    const holds: string[] = []
    for (const b of rows) {
      if (b.state === 'held') {
        await moveBooking(tx, b, 'expire', { expiredAt: now, endReason: 'session_cancelled' })
        if (b.checkoutSessionId) holds.push(b.checkoutSessionId)
      }
      else if (b.state === 'confirmed') {
        const c = await moveBooking(tx, b, 'cancel', { cancelledAt: now, endReason: 'session_cancelled' })
        await queueMail(tx, cancellationEmail(await bookingMailContext(venue, c, session, flightName), 'venue'))
        cancelled.push(b.id)
      }
    }
    return { cancelled, holds }
  })
  kickOutbox()
  await expireCheckoutSessions(holds)
  let refunded = 0
  for (const id of cancelled) {
    try {
      if (await refundBooking(id)) refunded++
    }
    catch (err) { console.error(`[bookings] refund of ${id} failed, will retry:`, (err as Error).message) }
  }
  return { bookingsCancelled: cancelled.length, refunded, refundsPending: cancelled.length - refunded, holdsReleased: holds.length }
}

// ——— views ———

export function bookingView(b: Booking, s: TastingSession, flightName: string, venue: Venue, now = new Date()): BookingView {
  const deadline = bookingCancelDeadline(venue, s)
  const holdActive = b.state === 'held' && b.holdExpiresAt.getTime() > now.getTime()
  return {
    id: b.id,
    reference: b.reference,
    state: b.state,
    stateLabel: BOOKING_STATE_LABELS[b.state],
    endReason: b.endReason,
    partySize: b.partySize,
    contactName: b.contactName,
    contactEmail: b.contactEmail,
    contactPhone: b.contactPhone,
    unitPriceMinor: b.unitPriceMinor,
    amountMinor: b.amountMinor,
    amountPaidMinor: b.amountPaidMinor,
    amountRefundedMinor: b.amountRefundedMinor,
    currency: b.currency,
    holdExpiresAt: b.holdExpiresAt.toISOString(),
    /** Where to finish paying, while the hold lasts. */
    checkoutUrl: holdActive ? b.checkoutUrl : null,
    createdAt: b.createdAt.toISOString(),
    confirmedAt: b.confirmedAt?.toISOString() ?? null,
    cancelledAt: b.cancelledAt?.toISOString() ?? null,
    refundedAt: b.refundedAt?.toISOString() ?? null,
    cancelDeadline: deadline.toISOString(),
    canCancel: b.state === 'confirmed' && now < deadline,
    canRelease: holdActive,
    session: {
      id: s.id,
      flightId: s.flightId,
      flightName,
      startsAt: s.startsAt.toISOString(),
      endsAt: new Date(s.startsAt.getTime() + s.durationMinutes * 60_000).toISOString(),
      durationMinutes: s.durationMinutes,
      status: s.status,
      upcoming: s.startsAt.getTime() > now.getTime(),
    },
  }
}

/** A guest's bookings (newest session first), or one of them; scoped to the owner in the WHERE clause. */
export async function loadGuestBookings(userId: number, bookingId?: number): Promise<BookingView[]> {
  const venue = await getVenue()
  const b = tables.bookings
  const rows = await useDb().select({ b, s: tables.tastingSessions, flightName: tables.flights.name })
    .from(b)
    .innerJoin(tables.tastingSessions, eq(tables.tastingSessions.id, b.sessionId))
    .innerJoin(tables.flights, eq(tables.flights.id, tables.tastingSessions.flightId))
    .where(and(eq(b.userId, userId), bookingId ? eq(b.id, bookingId) : undefined))
    .orderBy(sql`${tables.tastingSessions.startsAt} desc`, sql`${b.id} desc`)
    .limit(500)
  return rows.map(r => bookingView(r.b, r.s, r.flightName, venue))
}

export async function loadGuestBooking(userId: number, bookingId: number): Promise<BookingView> {
  const [view] = await loadGuestBookings(userId, bookingId)
  if (!view) notFound()
  return view!
}
