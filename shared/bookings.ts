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
 */
import type { ProductKind } from './products'

export const BOOKING_STATES = ['held', 'confirmed', 'checked_in', 'no_show', 'cancelled', 'refunded', 'expired'] as const
export type BookingState = (typeof BOOKING_STATES)[number]

export type BookingEvent = 'pay' | 'late_payment' | 'arrive' | 'no_show' | 'cancel' | 'refund' | 'expire'

export const BOOKING_TRANSITIONS: Record<BookingEvent, { from: readonly BookingState[], to: BookingState }> = {
  pay: { from: ['held'], to: 'confirmed' },
  late_payment: { from: ['expired'], to: 'confirmed' },
  arrive: { from: ['confirmed'], to: 'checked_in' },
  no_show: { from: ['confirmed'], to: 'no_show' },
  cancel: { from: ['confirmed'], to: 'cancelled' },
  refund: { from: ['cancelled'], to: 'refunded' },
  expire: { from: ['held'], to: 'expired' },
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
  late_payment_no_seats: 'Paid after the time ran out; seats gone, refunded',
}

/** Most guests a single booking may bring; larger groups talk to the venue. */
export const PARTY_MAX = 10

/** Crockford's base32 alphabet: no I, L, O or U, so a code read aloud or typed is hard to get wrong. */
export const REFERENCE_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ'
export const REFERENCE_LENGTH = 10

/** Whole minor units → the currency's major units as a plain decimal string ("35.00", "3500" for JPY). */
export function minorToDecimal(minor: number, currency: string): string {
  const digits = new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2
  return (minor / 10 ** digits).toFixed(digits)
}

/** A session as guests see it: when, price, seats left and whether it can still be booked. */
export interface PublicSession {
  id: number
  flightId: number
  flightName: string
  startsAt: string
  startsLocal: string | null
  endsAt: string
  durationMinutes: number
  seats: number
  seatsLeft: number
  priceMinor: number
  currency: string
  bookingClosesAt: string
  status: 'open' | 'closed' | 'cancelled'
  bookable: boolean
  /** Why it cannot be booked, in words for the guest; null when it can. */
  closedReason: string | null
}

/** A flight on the public list. */
export interface PublishedFlight {
  id: number
  name: string
  summary: string
  pourCount: number
  kinds: ProductKind[]
  standardDrinks: number
  priceFromMinor: number | null
  currency: string
  nextSessions: PublicSession[]
  sessionCount: number
}

/** A booking as its guest sees it. */
export interface BookingView {
  id: number
  reference: string
  state: BookingState
  stateLabel: string
  endReason: BookingEndReason | null
  partySize: number
  contactName: string
  contactEmail: string
  contactPhone: string
  unitPriceMinor: number
  amountMinor: number
  amountPaidMinor: number
  amountRefundedMinor: number
  currency: string
  holdExpiresAt: string
  /** Where to finish paying, while the hold lasts. */
  checkoutUrl: string | null
  createdAt: string
  confirmedAt: string | null
  cancelledAt: string | null
  refundedAt: string | null
  cancelDeadline: string
  canCancel: boolean
  canRelease: boolean
  session: {
    id: number
    flightId: number
    flightName: string
    startsAt: string
    endsAt: string
    durationMinutes: number
    status: 'open' | 'closed' | 'cancelled'
    upcoming: boolean
  }
}
