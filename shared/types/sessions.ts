import type { SessionStatus } from '../sessions'

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
  status: SessionStatus
  bookable: boolean
  /** Why it cannot be booked, in words for the guest; null when it can. */
  closedReason: string | null
}

/** A session as a guest's list shows it: the public session without what the list already knows. */
export type ListedSession = Omit<PublicSession, 'flightId' | 'flightName' | 'startsLocal'>

/** What the booking form needs about one session (GET /api/sessions/[id]/availability). */
export interface SessionAvailability {
  session: PublicSession
  holdMinutes: number
  /** The last instant a booking of this session can be cancelled online (the venue's cut-off before the start). */
  cancelClosesAt: string
  flight: { id: number, name: string, summary: string, pourCount: number, volumeMl: number, ethanolGrams: number, standardDrinks: number }
}

/** A session on the staff calendar (GET /api/sessions, /api/sessions/[id], and their changes). */
export interface SessionRow {
  id: number
  flightId: number
  flightName: string
  flightVersion: number
  startsAt: string
  startsLocal: string | null
  endsAt: string
  durationMinutes: number
  seats: number
  priceMinor: number
  currency: string
  hostId: number | null
  hostName: string | null
  bookingCutoffMinutes: number
  bookingClosesAt: string
  status: SessionStatus
  seriesId: string | null
}

/** What cancelling a whole session did (POST /api/sessions/[id]/cancel). */
export interface SessionCancelResult { bookingsCancelled: number, refunded: number, refundsPending: number, holdsReleased: number }
