import type { BookingEndReason, BookingState } from '../bookings'
import type { SessionStatus } from '../sessions'

/** A booking as its guest sees it (GET /api/bookings, /api/bookings/[id], and the guest's actions). */
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
  notes: string | null
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
    status: SessionStatus
    upcoming: boolean
  }
}

/**
 * A hold and where to pay for it (POST /api/bookings): a new one, or the guest's live hold in that
 * session found again (`resumed`), never a second.
 */
export interface BookingCreated { booking: BookingView, checkoutUrl: string, resumed: boolean }

/** What the booking form starts from when a guest gives back a hold to change it. */
export type BookingFormStart = Pick<BookingView, 'partySize' | 'contactName' | 'contactPhone'> & { notes: string }
