import { createHash } from 'node:crypto'
import { eq } from 'drizzle-orm'
import type Stripe from 'stripe'

const idOf = (v: string | { id: string } | null | undefined) => (typeof v === 'string' ? v : v?.id ?? null)

/** The booking an event is about: by checkout session or payment intent we stored, else by metadata. */
async function bookingOf(event: Stripe.Event): Promise<number | null> {
  const b = tables.bookings
  const db = useDb()
  const object = event.data.object as { object?: string, id?: string, metadata?: Record<string, string> | null, payment_intent?: string | { id: string } | null }
  if (object.object === 'checkout.session' && object.id) {
    const [row] = await db.select({ id: b.id }).from(b).where(eq(b.checkoutSessionId, object.id))
    if (row) return row.id
  }
  const intent = object.object === 'payment_intent' ? object.id ?? null : idOf(object.payment_intent)
  if (intent) {
    const [row] = await db.select({ id: b.id }).from(b).where(eq(b.paymentIntentId, intent))
    if (row) return row.id
  }
  const fromMetadata = Number(object.metadata?.bookingId)
  if (Number.isInteger(fromMetadata) && fromMetadata > 0) {
    const [row] = await db.select({ id: b.id }).from(b).where(eq(b.id, fromMetadata))
    if (row) return row.id
  }
  return null
}

/**
 * Applies one verified Stripe event. The event's id is written in the same transaction as the
 * change it causes, so a replay (same id) finds the row and changes nothing, and a failure part-way
 * writes nothing and the provider retries. Events may come in any order: each handler looks at
 * the booking's state now, not at what came before.
 */
export async function processStripeEvent(event: Stripe.Event, rawBody: Buffer | string): Promise<{ duplicate: boolean, outcome: string }> {
  const venue = await getVenue()
  const bookingId = await bookingOf(event)
  const payloadHash = createHash('sha256').update(rawBody).digest('hex')
  const result = await bookingTransaction(async (tx) => {
    let eventRowId: number
    try {
      const [row] = await tx.insert(tables.paymentEvents).values({
        provider: 'stripe', providerEventId: event.id, type: event.type, payloadHash, bookingId, outcome: 'received', processedAt: new Date(),
      }).$returningId()
      eventRowId = row!.id
    }
    catch (err) {
      if (isDuplicateKey(err)) return { duplicate: true, outcome: 'already processed', refund: false, staleCheckouts: [] as string[] }
      throw err
    }
    let outcome = 'ignored'
    let refund = false
    let refundIntent: string | null = null
    let staleCheckouts: string[] = []
    if (bookingId === null) outcome = 'no matching booking'
    else if (event.type === 'checkout.session.completed') {
      const cs = event.data.object
      if (cs.payment_status === 'paid') {
        // The event's own time is when the guest paid; a delivery retried later is not a later payment.
        ({ outcome, refund, refundIntent, staleCheckouts } = await applyBookingPayment(tx, venue, bookingId, { amountPaid: cs.amount_total ?? 0, currency: cs.currency ?? null, paymentIntentId: idOf(cs.payment_intent), paidAt: Number.isFinite(event.created) ? new Date(event.created * 1000) : undefined }))
      }
      else outcome = `checkout complete, payment ${cs.payment_status}`
    }
    else if (event.type === 'checkout.session.expired') {
      const { booking } = await lockBookingWithSession(tx, bookingId)
      if (booking.state === 'held') {
        // A payment page we closed ourselves carries the reason we wrote first (endBookingHold).
        await moveBooking(tx, booking, 'expire', { expiredAt: new Date(), endReason: booking.endReason ?? 'hold_expired' })
        outcome = 'hold expired, seats released'
      }
      else outcome = `nothing to do: booking is ${booking.state}`
    }
    else if (event.type === 'payment_intent.payment_failed') {
      // A declined card leaves the Checkout Session open for another try; only expiry releases seats.
      outcome = 'payment declined; hold kept for another try'
    }
    else if (event.type === 'refund.created') {
      outcome = 'refund noted'
    }
    await tx.update(tables.paymentEvents).set({ outcome }).where(eq(tables.paymentEvents.id, eventRowId))
    return { duplicate: false, outcome, refund, refundIntent, staleCheckouts }
  })
  kickOutbox()
  void expireCheckoutSessions(result.staleCheckouts)
  if (event.type === 'refund.created' && bookingId !== null && !result.duplicate) {
    // Our own refund call records the refund from its answer; this covers an answer that was lost.
    const refund = event.data.object
    if (refund.status === 'succeeded' || refund.status === 'pending') await recordBookingRefund(bookingId, { refundId: refund.id, amount: refund.amount })
  }
  if (result.refundIntent) {
    await refundPayment(result.refundIntent).catch(err => console.error(`[payments] refund of payment ${result.refundIntent} failed:`, (err as Error).message))
  }
  if (result.refund && bookingId !== null) {
    await refundBooking(bookingId).catch(err => console.error(`[payments] refund of booking ${bookingId} failed, will retry:`, (err as Error).message))
  }
  return { duplicate: result.duplicate, outcome: result.outcome }
}
