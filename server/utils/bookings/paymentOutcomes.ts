// The booking rules, part 3: what a payment (or its absence) does to a hold.
import { and, eq } from 'drizzle-orm'
import type { Booking } from '../../db/schema/bookings'
import type { Venue } from '../../db/schema/venues'
import type { BookingEndReason } from '../../../shared/bookings'

/**
 * What the provider says was paid: the amount in minor units and its currency (lower or upper case;
 * absent only for a free booking confirmed without a payment), and when it was paid if the provider
 * says so (a webhook's event time), else now.
 */
export interface PaidFacts { amountPaid: number, currency?: string | null, paymentIntentId: string | null, paidAt?: Date }

/** Whether a payment is exactly the booking's price: same amount, same currency. */
function paysForBooking(booking: Booking, paid: PaidFacts): boolean {
  if (paid.amountPaid !== booking.amountMinor) return false
  if (paid.currency == null) return booking.amountMinor === 0
  return paid.currency.toUpperCase() === booking.currency.toUpperCase()
}

/**
 * A payment the provider reports as done. A held booking is confirmed when the payment is exactly
 * its price (amount and currency) and came in time: before the hold ran out, before the session's
 * booking cut-off and before its start. Anything else confirms nothing:
 * - a payment of another amount or currency is recorded on the payment event and refunded at once
 *   (refundPayment); the booking is left as it was (a hold runs out as usual);
 * - a payment that came too late (after the hold ran out, the cut-off or the start) ends the hold,
 *   is recorded on the booking and refunded at once, and the guest is told.
 * Returns what happened, which refund must follow (the booking's, or a payment's by its intent), and
 * the Checkout Sessions of holds released on the way (close them after the transaction commits).
 */
export async function applyBookingPayment(tx: Tx, venue: Venue, bookingId: number, paid: PaidFacts): Promise<{ outcome: string, refund: boolean, refundIntent: string | null, staleCheckouts: string[] }> {
  const { booking, session } = await lockBookingWithSession(tx, bookingId)
  const now = new Date()
  const paidAt = paid.paidAt ?? now
  const unpaid = booking.state === 'held' || (booking.state === 'expired' && booking.amountPaidMinor === 0 && !booking.paymentIntentId)
  if (!unpaid) return { outcome: `nothing to do: booking is ${booking.state}`, refund: false, refundIntent: null, staleCheckouts: [] }
  if (!paysForBooking(booking, paid)) {
    console.warn(`[payments] booking ${booking.id} was paid ${paid.amountPaid} ${paid.currency ?? '(no currency)'} for a price of ${booking.amountMinor} ${booking.currency}; not confirmed, refunding`)
    return { outcome: `paid ${paid.amountPaid} ${(paid.currency ?? '').toUpperCase()}, price ${booking.amountMinor} ${booking.currency}: not confirmed, refunded`, refund: false, refundIntent: paid.paymentIntentId, staleCheckouts: [] }
  }
  const closesAt = session.startsAt.getTime() - session.bookingCutoffMinutes * 60_000
  const late = booking.state === 'expired' || paidAt.getTime() > booking.holdExpiresAt.getTime() || paidAt.getTime() >= closesAt || session.status === 'cancelled'
  if (!late) {
    // A hold being ended (its reason already written) that the guest paid for in time is a booking.
    const confirmed = await moveBooking(tx, booking, 'pay', { amountPaidMinor: paid.amountPaid, paymentIntentId: paid.paymentIntentId, confirmedAt: now, endReason: null })
    await queueMail(tx, await confirmationEmail(await bookingMailContext(venue, confirmed, session)))
    return { outcome: 'confirmed', refund: false, refundIntent: null, staleCheckouts: [] }
  }
  const patch = { amountPaidMinor: paid.amountPaid, paymentIntentId: paid.paymentIntentId, endReason: 'late_payment_no_seats' as const }
  if (booking.state === 'held') await moveBooking(tx, booking, 'expire', { ...patch, expiredAt: now })
  else await tx.update(tables.bookings).set(patch).where(eq(tables.bookings.id, booking.id))
  return { outcome: 'paid too late: not confirmed, refunded', refund: paid.amountPaid > 0, refundIntent: null, staleCheckouts: [] }
}

/**
 * Refunds a payment that confirmed nothing and belongs to no booking's money (it paid the wrong
 * amount or currency), in full, once: the idempotency key is the payment itself.
 */
export async function refundPayment(paymentIntentId: string): Promise<void> {
  await useStripe().refunds.create({ payment_intent: paymentIntentId, reason: 'requested_by_customer' }, { idempotencyKey: `payment-${paymentIntentId}-mismatch-refund` })
}

/** Confirms a booking outside a webhook (a free session, or a sweep that found the checkout paid). */
export async function confirmBookingPaid(bookingId: number, paid: PaidFacts): Promise<void> {
  const venue = await getVenue()
  const result = await bookingTransaction(tx => applyBookingPayment(tx, venue, bookingId, paid))
  kickOutbox()
  void expireCheckoutSessions(result.staleCheckouts)
  if (result.refund) await refundBooking(bookingId).catch(err => console.error(`[bookings] refund of ${bookingId} failed:`, (err as Error).message))
  if (result.refundIntent) await refundPayment(result.refundIntent).catch(err => console.error(`[bookings] refund of payment ${result.refundIntent} failed:`, (err as Error).message))
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
          await confirmBookingPaid(booking.id, { amountPaid: cs.amount_total ?? 0, currency: cs.currency ?? null, paymentIntentId: typeof cs.payment_intent === 'string' ? cs.payment_intent : cs.payment_intent?.id ?? null })
          return 'paid'
        }
      }
      else console.error(`[bookings] could not expire checkout ${booking.checkoutSessionId}:`, (err as Error).message)
    }
  }
  return (await releaseBookingHold(booking.id, reason)) ? 'released' : 'unchanged'
}
