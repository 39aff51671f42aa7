// The booking rules, part 3: what a payment (or its absence) does to a hold.
import { and, eq } from 'drizzle-orm'
import type { Booking } from '../../db/schema/bookings'
import type { Venue } from '../../db/schema/venues'
import type { BookingEndReason } from '../../../shared/bookings'

export interface PaidFacts { amountPaid: number, paymentIntentId: string | null }

/**
 * A payment the provider reports as done. A held booking is confirmed. A booking whose hold ran
 * out is confirmed only if its seats are still free (and the session still on, not started);
 * otherwise it stays expired, the payment is recorded and refunded, and the guest is told.
 * Returns what happened, whether a refund must follow, and the Checkout Sessions of holds released
 * on the way (close them after the transaction commits).
 */
export async function applyBookingPayment(tx: Tx, venue: Venue, bookingId: number, paid: PaidFacts): Promise<{ outcome: string, refund: boolean, staleCheckouts: string[] }> {
  const { booking, session } = await lockBookingWithSession(tx, bookingId)
  const now = new Date()
  const facts = { amountPaidMinor: paid.amountPaid, paymentIntentId: paid.paymentIntentId, confirmedAt: now }
  if (booking.state === 'held') {
    // A hold being ended (its reason already written) that the guest paid for after all is a booking.
    const confirmed = await moveBooking(tx, booking, 'pay', { ...facts, endReason: null })
    await queueMail(tx, await confirmationEmail(await bookingMailContext(venue, confirmed, session)))
    return { outcome: 'confirmed', refund: false, staleCheckouts: [] }
  }
  if (booking.state === 'expired' && booking.amountPaidMinor === 0 && !booking.paymentIntentId) {
    const { count, staleCheckouts } = await lockedSeatCount(tx, session, now)
    const sessionOn = session.status !== 'cancelled' && session.startsAt.getTime() > now.getTime()
    if (sessionOn && count.seatsLeft >= booking.partySize) {
      const confirmed = await moveBooking(tx, booking, 'late_payment', { ...facts, endReason: null, expiredAt: null })
      await queueMail(tx, await confirmationEmail(await bookingMailContext(venue, confirmed, session)))
      return { outcome: 'late payment, seats still free: confirmed', refund: false, staleCheckouts }
    }
    await tx.update(tables.bookings).set({ amountPaidMinor: paid.amountPaid, paymentIntentId: paid.paymentIntentId, endReason: 'late_payment_no_seats' })
      .where(eq(tables.bookings.id, booking.id))
    return { outcome: 'late payment, no seats: refund', refund: paid.amountPaid > 0, staleCheckouts }
  }
  return { outcome: `nothing to do: booking is ${booking.state}`, refund: false, staleCheckouts: [] }
}

/** Confirms a booking outside a webhook (a free session, or a sweep that found the checkout paid). */
export async function confirmBookingPaid(bookingId: number, paid: PaidFacts): Promise<void> {
  const venue = await getVenue()
  const result = await bookingTransaction(tx => applyBookingPayment(tx, venue, bookingId, paid))
  kickOutbox()
  void expireCheckoutSessions(result.staleCheckouts)
  if (result.refund) await refundBooking(bookingId).catch(err => console.error(`[bookings] refund of ${bookingId} failed:`, (err as Error).message))
}

/** Held → expired, with the session row locked; nothing if it is no longer held. */
async function releaseBookingHold(bookingId: number, reason: BookingEndReason): Promise<boolean> {
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
    // Closing the payment page makes the provider send an expiry event, which may be handled before
    // the release below: the reason goes on the hold first, so that event ends it with this reason
    // (a guest giving seats back is not "time ran out"). A payment after all clears it.
    const b = tables.bookings
    await useDb().update(b).set({ endReason: reason }).where(and(eq(b.id, booking.id), eq(b.state, 'held')))
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
