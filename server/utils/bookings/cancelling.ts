// The booking rules, part 4: cancelling (by the guest or the venue) and refunding.
import { and, eq } from 'drizzle-orm'
import type { TastingSession } from '../../db/schema/sessions'
import type { Venue } from '../../db/schema/venues'
import type { MailMessage } from '../mail'
import type { CurrentUser } from '../auth'
import { BOOKING_STATE_LABELS, canTransition, cancelDeadline } from '../../../shared/bookings'
import { venueContactText } from '../../../shared/venueContact'

/** Cancellation cut-off of the venue: the last instant a guest may cancel online. */
export const bookingCancelDeadline = (venue: Venue, session: Pick<TastingSession, 'startsAt'>) => cancelDeadline(session.startsAt, venue.cancellationCutoffHours)

/** A guest cancels their own paid booking before the cut-off; the refund follows at once. */
export async function cancelByGuest(user: CurrentUser, bookingId: number): Promise<void> {
  const venue = await getVenue()
  await bookingTransaction(async (tx) => {
    const [own] = await tx.select({ id: tables.bookings.id }).from(tables.bookings)
      .where(and(eq(tables.bookings.id, bookingId), eq(tables.bookings.userId, user.id)))
    if (!own) notFound('No such booking.')
    const { booking, session } = await lockBookingWithSession(tx, bookingId)
    if (booking.state === 'held') conflict('This booking is not paid yet, so there is nothing to cancel. Give the seats back instead, or let the time to pay run out.')
    if (!canTransition(booking.state, 'cancel')) conflict(`This booking is ${BOOKING_STATE_LABELS[booking.state].toLowerCase()}; it cannot be cancelled.`)
    const deadline = bookingCancelDeadline(venue, session)
    if (Date.now() >= deadline.getTime()) {
      conflict(`Bookings can be cancelled online up to ${venue.cancellationCutoffHours} hours before the start; for this session that was ${mailVenueTime(deadline, venue)}. To change or cancel, please contact ${venueContactText(venue)}.`)
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
      const reason = session.status === 'cancelled' ? 'the session has been cancelled' : session.startsAt.getTime() <= Date.now() ? 'the session had already started' : 'the seats could no longer be kept for you'
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
    if (!own) notFound('No such session.')
    const session = await lockSessionRow(tx, sessionId)
    if (session.status === 'cancelled') conflict('This session is already cancelled.')
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
