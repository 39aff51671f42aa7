import type { BookingEndReason, BookingState } from '../bookings'
import type { SeatBreakdown } from '../seats'
import type { SessionRow } from './sessions'

/** One booking in the manager's bookings report. */
export interface ReportBooking {
  id: number
  reference: string
  state: BookingState
  endReason: BookingEndReason | null
  guestName: string
  guestEmail: string
  contactName: string
  contactEmail: string
  contactPhone: string
  partySize: number
  amountMinor: number
  amountPaidMinor: number
  amountRefundedMinor: number
  currency: string
  holdLive: boolean
  createdAt: string
  refundedAt: string | null
}

/** One session of the report with its bookings, fill and takings (minor units). */
export interface ReportSession {
  session: SessionRow
  bookings: ReportBooking[]
  /** Seats by the one seat rule (shared/seats.ts), as every other screen counts them. */
  seatsTaken: number
  seatsLeft: number
  /** Taken, plus parties that did not come or were turned away: what the fill rate counts. */
  seatsSold: number
  seatBreakdown: SeatBreakdown
  fillRate: number
  paidMinor: number
  refundedMinor: number
  revenueMinor: number
}

/** The manager's bookings report over a range of venue days (GET /api/manage/bookings). */
export interface BookingReport {
  from: string
  to: string
  currency: string
  sessions: ReportSession[]
  totals: { sessions: number, seats: number, seatsTaken: number, seatsLeft: number, seatsSold: number, fillRate: number, bookings: number, paidMinor: number, refundedMinor: number, revenueMinor: number }
}

/** The manager's first screen (GET /api/manage/overview). */
export interface ManagerOverview {
  staff: { manager: number, host: number, marketing: number, invitationsPending: number }
  guests: number
  activeProducts: number
  outbox: { pending: number, sent: number, failed: number }
}
