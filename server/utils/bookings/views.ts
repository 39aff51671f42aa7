// The booking rules, part 5: bookings as guests and their e-mails see them.
import { and, eq, sql } from 'drizzle-orm'
import type { Booking } from '../../db/schema/bookings'
import type { TastingSession } from '../../db/schema/sessions'
import type { Venue } from '../../db/schema/venues'
import type { BookingMailContext } from '../bookingEmails'
import { BOOKING_STATE_LABELS } from '../../../shared/bookings'
import type { BookingView } from '../../../shared/types/bookings'

export async function flightNameOf(flightId: number): Promise<string> {
  const [f] = await useDb().select({ name: tables.flights.name }).from(tables.flights).where(eq(tables.flights.id, flightId))
  return f?.name ?? 'Tasting flight'
}

export async function bookingMailContext(venue: Venue, booking: Booking, session: TastingSession, flightName?: string): Promise<BookingMailContext> {
  return { venue, booking, session, flightName: flightName ?? await flightNameOf(session.flightId) }
}

/** A booking as its guest sees it, from rows the caller has already read. */
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
    notes: b.notes,
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

/** A guest's bookings (newest session first), one session's, or one of them; scoped to the owner in the WHERE clause. */
export async function loadGuestBookings(userId: number, only: { bookingId?: number, sessionId?: number } = {}): Promise<BookingView[]> {
  const venue = await getVenue()
  const b = tables.bookings
  const rows = await useDb().select({ b, s: tables.tastingSessions, flightName: tables.flights.name })
    .from(b)
    .innerJoin(tables.tastingSessions, eq(tables.tastingSessions.id, b.sessionId))
    .innerJoin(tables.flights, eq(tables.flights.id, tables.tastingSessions.flightId))
    .where(and(eq(b.userId, userId), only.bookingId ? eq(b.id, only.bookingId) : undefined, only.sessionId ? eq(b.sessionId, only.sessionId) : undefined))
    .orderBy(sql`${tables.tastingSessions.startsAt} desc`, sql`${b.id} desc`)
    .limit(500)
  return rows.map(r => bookingView(r.b, r.s, r.flightName, venue))
}

export async function loadGuestBooking(userId: number, bookingId: number): Promise<BookingView> {
  const [view] = await loadGuestBookings(userId, { bookingId })
  if (!view) notFound('No such booking.')
  return view
}
