import type { BookingEndReason, BookingState } from '../bookings'
import type { SeatBreakdown } from '../seats'
import type { SessionStatus } from '../sessions'
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
  /** What the guest asked the venue to know (allergies, an occasion); null when they wrote nothing. */
  notes: string | null
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

/** The manager's bookings report over a range of venue days (GET /api/reports/bookings). */
export interface BookingReport {
  from: string
  to: string
  currency: string
  /** The page's sessions (all of them in the CSV), in start order; `totals` cover the whole range. */
  sessions: ReportSession[]
  /** From 1; `totals.sessions` over `pageSize` is the number of pages. */
  page: number
  pageSize: number
  totals: { sessions: number, seats: number, seatsTaken: number, seatsLeft: number, seatsSold: number, fillRate: number, bookings: number, paidMinor: number, refundedMinor: number, revenueMinor: number }
}

/** A session on the manager's overview: when, what, and how full. */
export interface OverviewSession {
  id: number
  flightName: string
  startsAt: string
  durationMinutes: number
  status: SessionStatus
  hostName: string | null
  seats: number
  /** Held (while the hold lasts), confirmed and checked in: the rule behind "seats left". */
  seatsTaken: number
  seatsLeft: number
  /** Guests a host has seated so far. */
  checkedIn: number
}

/** One venue day of the coming week. */
export interface OverviewDay {
  /** YYYY-MM-DD in the venue's zone. */
  date: string
  /** The instant the day begins in the venue's zone (UTC ISO), for writing its weekday. */
  startsAt: string
  sessions: OverviewSession[]
  seats: number
  seatsTaken: number
}

/**
 * The manager's first screen (GET /api/reports/overview): today, the coming week, the week's
 * takings and mail that is not getting out, then the people and the catalogue. Seats of
 * cancelled sessions are left out of the seat totals; amounts are minor units of `currency`.
 */
export interface ManagerOverview {
  /** When the server counted, so "today" and "ago" on the page agree with the figures. */
  generatedAt: string
  currency: string
  /** `startsAt`: the instant the venue's day begins (UTC ISO). */
  today: { date: string, startsAt: string, sessions: OverviewSession[], seats: number, seatsTaken: number, checkedIn: number }
  /** The seven venue days after today. */
  week: { from: string, to: string, days: OverviewDay[], sessions: number, seats: number, seatsTaken: number }
  /** The last seven venue days, today included: card payments taken and refunds sent. */
  takings: { from: string, to: string, paidMinor: number, payments: number, refundedMinor: number, refunds: number, netMinor: number }
  outbox: {
    pending: number
    sent: number
    failed: number
    /** Failed, or still waiting after several attempts or several minutes. */
    stuck: number
    stuckAfterAttempts: number
    stuckAfterMinutes: number
    newestError: { message: string, subject: string, at: string } | null
  }
  staff: { manager: number, host: number, marketing: number, invitationsPending: number }
  guests: number
  activeProducts: number
}
