import { and, eq, gt, inArray, isNull, isNotNull, lte, or } from 'drizzle-orm'

const REMINDER_FROM_MS = 24 * 3_600_000
const REMINDER_TO_MS = 25 * 3_600_000
/** A refund that failed is tried again after this long (the booking's updated_at is the clock). */
const REFUND_RETRY_MS = 60_000

/**
 * A paid hold that still has no Checkout Session this long after it was made lost its payment page
 * to a failure between the two steps (the database or the provider went away after the hold was
 * written); its guest was told nothing was booked, so its seats go back.
 */
const ORPHAN_HOLD_MS = 2 * 60_000

/** One pass of the booking housekeeping; safe to run from several processes at once. */
export async function sweepBookings(): Promise<{ released: number, refunds: number, reminders: number }> {
  const released = await releaseRunOutHolds() + await releaseOrphanHolds()
  // Seats came back: the public pages show them within the page cache's lag.
  if (released) seatsChanged()
  return { released, refunds: await retryRefunds(), reminders: await queueReminders() }
}

async function releaseOrphanHolds(): Promise<number> {
  const b = tables.bookings
  const orphans = await useDb().select({ id: b.id, checkoutSessionId: b.checkoutSessionId }).from(b)
    .where(and(eq(b.state, 'held'), isNull(b.checkoutSessionId), gt(b.amountMinor, 0), lte(b.createdAt, new Date(Date.now() - ORPHAN_HOLD_MS)))).limit(100)
  let released = 0
  for (const booking of orphans) {
    if (await endBookingHold(booking, 'checkout_failed') === 'released') released++
  }
  return released
}

async function releaseRunOutHolds(): Promise<number> {
  const b = tables.bookings
  const stale = await useDb().select({ id: b.id, checkoutSessionId: b.checkoutSessionId }).from(b)
    .where(and(eq(b.state, 'held'), lte(b.holdExpiresAt, new Date()))).limit(100)
  let released = 0
  for (const booking of stale) {
    if (await endBookingHold(booking, 'hold_expired') === 'released') released++
  }
  return released
}

async function retryRefunds(): Promise<number> {
  const b = tables.bookings
  const triedBefore = lte(b.updatedAt, new Date(Date.now() - REFUND_RETRY_MS))
  const LIMIT = 20
  // Two reads, each a short range of `bookings_refund_due_idx` (state, refunded_at, payment_intent_id):
  // expired holds without a payment pile up over the years and are never refunded, so one OR over both
  // states would read them all.
  const cancelled = await useDb().select({ id: b.id }).from(b).where(and(
    eq(b.state, 'cancelled'),
    isNull(b.refundedAt),
    // Bookings paid outside online checkout (no payment intent) are refunded by the venue itself.
    or(isNotNull(b.paymentIntentId), eq(b.amountPaidMinor, 0)),
    triedBefore,
  )).limit(LIMIT)
  const expired = cancelled.length >= LIMIT
    ? []
    : await useDb().select({ id: b.id }).from(b).where(and(
        eq(b.state, 'expired'),
        isNull(b.refundedAt),
        isNotNull(b.paymentIntentId),
        gt(b.amountPaidMinor, b.amountRefundedMinor),
        triedBefore,
      )).limit(LIMIT - cancelled.length)
  const due = [...cancelled, ...expired]
  let done = 0
  for (const { id } of due) {
    try {
      if (await refundBooking(id)) done++
    }
    catch (err) {
      console.error(`[bookings] refund of booking ${id} failed again:`, (err as Error).message)
      await useDb().update(b).set({ updatedAt: new Date() }).where(eq(b.id, id))
    }
  }
  return done
}

/** Confirmed bookings starting 24–25 hours from now get one reminder; the mark and the mail share a transaction. */
async function queueReminders(): Promise<number> {
  const b = tables.bookings
  const s = tables.tastingSessions
  const now = Date.now()
  const rows = await useDb().select({ id: b.id }).from(b).innerJoin(s, eq(s.id, b.sessionId)).where(and(
    eq(b.state, 'confirmed'),
    isNull(b.reminderSentAt),
    inArray(s.status, ['open', 'closed']),
    gt(s.startsAt, new Date(now + REMINDER_FROM_MS)),
    lte(s.startsAt, new Date(now + REMINDER_TO_MS)),
  )).limit(200)
  if (!rows.length) return 0
  const venue = await getVenue()
  let queued = 0
  for (const { id } of rows) {
    const sent = await bookingTransaction(async (tx) => {
      const { booking, session } = await lockBookingWithSession(tx, id)
      if (booking.state !== 'confirmed' || booking.reminderSentAt) return false
      await tx.update(b).set({ reminderSentAt: new Date() }).where(and(eq(b.id, id), isNull(b.reminderSentAt)))
      await queueMail(tx, await reminderEmail(await bookingMailContext(venue, booking, session)))
      return true
    })
    if (sent) queued++
  }
  if (queued) kickOutbox()
  return queued
}
