import type { Range } from '../science/uncertainty'
import type { ObservationComparison, ObservationFlag, ObservationSource, RoomSource, SeenInGlass, TearCount, TearSpeed, TearsFormed } from '../observations'

/** One stored observation as its own device (or the host) reads it back: what was seen, never who. */
export interface OwnObservation extends SeenInGlass {
  recordedAt: string
  flags: ObservationFlag[]
  comparison: ObservationComparison
}

/** The model's ranges for one pour in one room, as the comparison shows them. */
export interface PredictedForComparison {
  tearsExpected: boolean
  bandVisible: boolean
  suppressedBy: 'foam' | 'held' | null
  band: Range | null
  speed: Range | null
  around: Range | null
  /** The room they assume: relative humidity %, air °C, and where the reading came from. */
  room: { relativeHumidityPct: number, airTempC: number, source: RoomSource }
}

/**
 * Other people's readings of the same pour, aggregated (GET /api/flights/[id]/pours/[position]/observations):
 * counts per bin only, this device's own entries left out, flagged ones left out and counted.
 */
export interface OthersSeen {
  count: number
  flaggedLeftOut: number
  /** Band readings in 2 mm bins [fromMm, fromMm + 2), only the bins someone fell in. */
  band: { fromMm: number, toMm: number, count: number }[]
  noClearBand: number
  bandNotRead: number
  tears: Record<TearsFormed, number>
  speed: Record<TearSpeed, number>
  around: Record<TearCount, number>
}

export interface PourObservations {
  flightId: number
  position: number
  pourName: string
  /** The session the comparison is for, when the card's session fits this flight now; else null. */
  sessionId: number | null
  predicted: PredictedForComparison
  others: OthersSeen
  /** This device's newest entry for this pour, compared with the prediction for its own room and numbers. */
  mine: OwnObservation | null
  /** Entries this device may still make for this pour at this session. */
  entriesLeft: number
}

/** What POST /api/observations and the host's route answer. */
export interface ObservationSaved {
  id: number
  source: ObservationSource
  sessionId: number | null
  flags: ObservationFlag[]
  roomSource: RoomSource
}

/** A session's pours for the host's form (GET /api/sessions/[id]/observations), with the entries so far. */
export interface SessionObservationPours {
  sessionId: number
  /** The session's room reading to prefill the form (null: not read yet; the venue's usual air is shown as a hint). */
  room: { relativeHumidityPct: number, airTempC: number } | null
  venueRoom: { relativeHumidityPct: number, airTempC: number }
  pours: { position: number, name: string, glassName: string, guestEntries: number, hostEntries: number }[]
  /** The host may record now (from 2 h before the start to 6 h after the end). */
  canRecord: boolean
}
