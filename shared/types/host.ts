import type { BookingState } from '../bookings'
import type { SeatBreakdown } from '../seats'
import type { SessionStatus } from '../sessions'

/** The door outcome recorded for a party. */
export interface HostCheckIn { outcome: 'arrived' | 'turned_away' | 'no_show', seated: number, idsSeen: number, reason: string | null, recordedAt: string }

/** One party on the host's list. */
export interface HostParty {
  id: number
  reference: string
  contactName: string
  contactPhone: string
  partySize: number
  notes: string | null
  source: 'online' | 'walk_in'
  state: BookingState
  stateLabel: string
  paid: 'paid' | 'at_the_door' | 'waiting' | 'unpaid'
  amountMinor: number
  amountPaidMinor: number
  currency: string
  checkIn: HostCheckIn | null
}

/** The counts at a glance; `breakdown` is the one seat rule's (shared/seats.ts). */
export interface HostSessionCounts { seats: number, taken: number, seatsLeft: number, expected: number, arrived: number, noShows: number, breakdown: SeatBreakdown }

/** One session of the host's day. */
export interface HostSession {
  id: number
  flightId: number
  flightName: string
  hostName: string | null
  startsAt: string
  /** Local start time in the venue's zone, HH:mm. */
  startsLocal: string
  durationMinutes: number
  started: boolean
  status: SessionStatus
  canAct: boolean
  counts: HostSessionCounts
  parties: HostParty[]
}

/** The host's day (GET /api/host/day): a venue-local date's sessions with every party. */
export interface HostDay { date: string, timeZone: string, sessions: HostSession[] }

/** A print job of a session's cards (POST to start, GET to follow). */
export interface CardJobStarted { jobId: string, total: number }
export interface CardJobView { jobId: string, status: 'running' | 'done' | 'failed', done: number, total: number, error: string | null }
