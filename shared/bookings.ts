import { formatFromNow, formatWhen, type VenueClock } from './dates'

/**
 * A booking's life, as the product design draws it:
 *
 *   held ──paid──▶ confirmed ──arrive──▶ checked_in
 *    │                 │  └──no-show (after start)──▶ no_show
 *    │                 └──cancel (before cut-off) / session cancelled──▶ cancelled ──refund──▶ refunded
 *    └──hold expires / payment failed──▶ expired
 *
 * One edge is added, for money that arrives late: a payment the provider confirms after the hold
 * has already run out (`expired ──late payment──▶ confirmed`), taken only while the seats are still
 * free. If they are not, the booking stays expired and the payment goes straight back.
 *
 * The door has two ways into no_show: "did not come" (after the start) and "turned away" (with a
 * reason, e.g. no ID). Both are the host's own decisions, and the host can take either back until
 * the session ends (`no_show ──undo at the door──▶ confirmed`), so a party that arrives late can
 * still be seated while its seats are free. The edge is only for a no-show the door decided
 * (a check-in row says so); the route checks that, and the session's end, before it moves.
 */
export const BOOKING_STATES = ['held', 'confirmed', 'checked_in', 'no_show', 'cancelled', 'refunded', 'expired'] as const
export type BookingState = (typeof BOOKING_STATES)[number]

export type BookingEvent = 'pay' | 'late_payment' | 'arrive' | 'no_show' | 'turn_away' | 'undo_door' | 'cancel' | 'refund' | 'expire'

export const BOOKING_TRANSITIONS: Record<BookingEvent, { from: readonly BookingState[], to: BookingState }> = {
  pay: { from: ['held'], to: 'confirmed' },
  late_payment: { from: ['expired'], to: 'confirmed' },
  arrive: { from: ['confirmed'], to: 'checked_in' },
  no_show: { from: ['confirmed'], to: 'no_show' },
  turn_away: { from: ['confirmed'], to: 'no_show' },
  undo_door: { from: ['no_show'], to: 'confirmed' },
  cancel: { from: ['confirmed'], to: 'cancelled' },
  refund: { from: ['cancelled'], to: 'refunded' },
  expire: { from: ['held'], to: 'expired' },
}

/**
 * What a booking's history records (booking_events): the diagram's events, plus the door's own
 * decisions — turning a party away, and undoing a "did not come" or a "turned away" so that a
 * late party can still be seated.
 */
export const BOOKING_HISTORY_EVENTS = ['pay', 'late_payment', 'arrive', 'no_show', 'turn_away', 'undo_door', 'cancel', 'refund', 'expire'] as const
export type BookingHistoryEvent = (typeof BOOKING_HISTORY_EVENTS)[number]

/** A step of a booking's history in words a host reads. */
export const BOOKING_HISTORY_LABELS: Record<BookingHistoryEvent, string> = {
  pay: 'Paid',
  late_payment: 'Paid after the time to pay ran out',
  arrive: 'Seated',
  no_show: 'Marked as did not come',
  turn_away: 'Turned away',
  undo_door: 'Put back on the list to come',
  cancel: 'Cancelled',
  refund: 'Refunded',
  expire: 'Time to pay ran out',
}

export const canTransition = (from: BookingState, event: BookingEvent): boolean => BOOKING_TRANSITIONS[event].from.includes(from)

export const BOOKING_STATE_LABELS: Record<BookingState, string> = {
  held: 'Waiting for payment',
  confirmed: 'Confirmed',
  checked_in: 'Checked in',
  no_show: 'Did not come',
  cancelled: 'Cancelled, refund on its way',
  refunded: 'Cancelled and refunded',
  expired: 'Not completed',
}

export const BOOKING_END_REASONS = ['guest_cancelled', 'session_cancelled', 'hold_released', 'hold_expired', 'checkout_failed', 'late_payment_no_seats'] as const
export type BookingEndReason = (typeof BOOKING_END_REASONS)[number]
export const BOOKING_END_REASON_LABELS: Record<BookingEndReason, string> = {
  guest_cancelled: 'Cancelled by the guest',
  session_cancelled: 'Session cancelled by the venue',
  hold_released: 'Seats given back before paying',
  hold_expired: 'Time to pay ran out',
  checkout_failed: 'Payment service unavailable',
  late_payment_no_seats: 'Paid after the time to pay or to book ran out; refunded',
}

/**
 * How a booking's end reads to its guest: a heading and a sentence for each end reason, told apart
 * by whether money was taken. The labels above are the staff's short names for the same reasons.
 */
export function bookingEndWords(reason: BookingEndReason, paid: boolean): { title: string, text: string } {
  switch (reason) {
    case 'hold_released':
      return { title: 'Seats given back', text: 'You gave the seats back before paying, so nothing was charged.' }
    case 'hold_expired':
      return { title: 'Time to pay ran out', text: 'The time to pay ran out before a payment came through, so the seats went back and nothing was charged.' }
    case 'checkout_failed':
      return { title: 'Not booked', text: 'The payment service could not be reached, so the seats were not kept and nothing was charged.' }
    case 'session_cancelled':
      return paid
        ? { title: 'Session cancelled', text: 'The venue has cancelled this session, so your booking is cancelled and your payment refunded in full.' }
        : { title: 'Session cancelled', text: 'The venue cancelled this session before you paid, so nothing was charged.' }
    case 'guest_cancelled':
      return paid
        ? { title: 'Cancelled', text: 'You cancelled this booking, so your payment is refunded in full.' }
        : { title: 'Cancelled', text: 'You cancelled this booking. Nothing was paid, so there is nothing to refund.' }
    case 'late_payment_no_seats':
      return { title: 'Paid too late', text: 'Your payment arrived after the time to pay or to book this session had run out, so the booking could not go ahead. Your payment is refunded in full.' }
  }
}

/** The last instant a guest may cancel a session online: the venue's cut-off before its start. */
export function cancelDeadline(startsAt: string | Date, cutoffHours: number): Date {
  return new Date(new Date(startsAt).getTime() - cutoffHours * 3_600_000)
}

/**
 * The cut-off of one session in a sentence, as the booking form and the confirmation state it:
 * "Online cancellation closes at Sat, Oct 3, 2:00 PM EDT, that is in 5 hours." or that it has closed.
 */
export function cancelCutoffSentence(deadline: string | Date, clock: VenueClock, now = new Date()): string {
  const at = new Date(deadline)
  if (at.getTime() <= now.getTime()) return 'Online cancellation for this session has already closed: this booking cannot be cancelled online.'
  return `Online cancellation closes at ${formatWhen(at, clock, now)}, that is ${formatFromNow(at, clock, now)}.`
}

/** Most guests a single booking may bring; larger groups talk to the venue. */
export const PARTY_MAX = 10

/** Crockford's base32 alphabet: no I, L, O or U, so a code read aloud or typed is hard to get wrong. */
export const REFERENCE_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ'
export const REFERENCE_LENGTH = 10

/**
 * A reference as someone typed or read it, in the form it is stored: upper case, without spaces
 * or dashes, and with the letters Crockford's decoding rules read as digits (O as 0; I and L as 1;
 * crockford.com/base32.html). It may still not be a reference: check with `isReference`.
 */
export function normalizeReference(text: string): string {
  return text.toUpperCase().replace(/[\s\-\u2010-\u2015]+/g, '').replace(/O/g, '0').replace(/[IL]/g, '1')
}

/** Whether a normalized text can be a booking reference: ten symbols of the alphabet. */
export function isReference(text: string): boolean {
  return text.length === REFERENCE_LENGTH && [...text].every(ch => REFERENCE_ALPHABET.includes(ch))
}
