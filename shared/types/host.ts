import type { BookingHistoryEvent, BookingState } from '../bookings'
import type { DoorTiles, SeatBreakdown } from '../seats'
import type { SessionStatus } from '../sessions'

/** The door outcome recorded for a party. */
export interface HostCheckIn { outcome: 'arrived' | 'turned_away' | 'no_show', seated: number, idsSeen: number, reason: string | null, recordedAt: string }

/** One step of a party's history (booking_events): what, when, who and why. */
export interface HostHistoryStep {
  id: number
  event: BookingHistoryEvent
  /** The step in words a host reads. */
  label: string
  fromState: BookingState
  toState: BookingState
  /** Who did it; null when the system did (a payment, a hold running out) or the account is gone. */
  actorName: string | null
  reason: string | null
  at: string
}

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
  /** Every step so far, oldest first. */
  history: HostHistoryStep[]
  /** The door's "did not come" or "turned away" can still be taken back (until the session ends). */
  canUndo: boolean
}

/**
 * The counts at a glance, all from the one seat rule (shared/seats.ts): the tiles add up to
 * `bookedOnline + walkIns`, the guests of the parties on the list.
 */
export interface HostSessionCounts {
  seats: number
  taken: number
  seatsLeft: number
  /** Guests of the online bookings on the list (paying now, to come, seated, or not). */
  bookedOnline: number
  /** Guests seated at the door without a booking (inside the Seated tile). */
  walkIns: number
  tiles: DoorTiles
  breakdown: SeatBreakdown
}

/** One session of the host's day. */
export interface HostSession {
  id: number
  flightId: number
  flightName: string
  hostName: string | null
  startsAt: string
  endsAt: string
  /** Local start time in the venue's zone, HH:mm. */
  startsLocal: string
  durationMinutes: number
  started: boolean
  ended: boolean
  status: SessionStatus
  canAct: boolean
  /** The host's reading of the room for this session; null until one is taken (cards then assume the venue's usual air). */
  room: SessionRoomReading | null
  /** The caller may record a reading now: the session's host or a manager, on the session's day, not cancelled. */
  canReadRoom: boolean
  counts: HostSessionCounts
  parties: HostParty[]
}

/** A host's reading of a session's room (PUT /api/sessions/[id]/room-reading, and on the host's day). */
export interface SessionRoomReading {
  sessionId: number
  relativeHumidityPct: number
  /** °C to a tenth; pages show it in the venue's unit. */
  airTempC: number
  /** When it was read (UTC, ISO 8601). */
  readAt: string
  /** Who read it; null if that account is gone. */
  readByName: string | null
}

/** The host's day (GET /api/days/[date]): a venue-local date's sessions with every party. */
export interface HostDay { date: string, timeZone: string, sessions: HostSession[] }

/**
 * A party found by its booking reference (GET /api/bookings/by-reference/[reference]), with the
 * session it is for, so the door can go to it or say plainly which day and session it belongs to.
 */
export interface HostPartyFound {
  party: HostParty
  session: {
    id: number
    flightName: string
    hostName: string | null
    startsAt: string
    /** The session's calendar day in the venue's zone, YYYY-MM-DD (the host's day to open). */
    date: string
    status: SessionStatus
  }
  /** On that day's list (a booking that ended — cancelled, refunded, not completed — is not). */
  onList: boolean
}

/** A print job of a session's cards (POST to start, GET to follow). */
export interface CardJobStarted { jobId: string, total: number }
export interface CardJobView { jobId: string, status: 'running' | 'done' | 'failed', done: number, total: number, error: string | null }
