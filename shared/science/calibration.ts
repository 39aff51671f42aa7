/**
 * Calibration of the glass model from what guests and hosts saw (docs/science.md, "Calibration").
 * Pure functions, no framework imports. CONTRACT ONLY in this commit: the types below are what the
 * server and the manager's pages use; the science engineer replaces the body of `calibrate` with the
 * documented method and its tests. Until then every group keeps the published defaults.
 */
import type { DrinkKind, RoomAir } from './glassModel'
import type { ObservedSince, TearCount, TearSpeed, TearsFormed } from '../observations'

/**
 * The model parameters the observations can identify, as multipliers of the published defaults
 * (1 = published): the film's exchanged fraction f at the band's top (FILM_EXCHANGE_FRACTION) and the
 * room air's mass-transfer coefficients k for both vapours (and, by the heat–mass analogy, h).
 */
export interface ModelParameters {
  exchangeFactor: number
  massTransferFactor: number
}

export const PUBLISHED_PARAMETERS: ModelParameters = { exchangeFactor: 1, massTransferFactor: 1 }

/**
 * A calibration a prediction uses: `computeFilm(inputs, { calibration })` runs its central value with
 * `parameters` and draws its ranges from the posterior (sdLn) instead of the published spreads of
 * those two parameters. FilmResult.calibration echoes it (null: published defaults).
 */
export interface AppliedCalibration {
  parameters: ModelParameters
  sdLn: { exchangeFactor: number, massTransferFactor: number }
  /** How many observations (after one-device-one-vote) it rests on, for the sentence that says so. */
  observations: number
}

/** One observation as the fit sees it: the pour's numbers, the glass, the room, what was seen. */
export interface FitObservation {
  /** Glass shape the parameters belong to (a glass record's id as text). */
  glassKey: string
  /** The room it was seen in (a venue's id as text, later a room's), for the per-room level. */
  roomKey: string
  /** One device at one pour of one session counts once, however many entries it made. */
  deviceKey: string
  abvPctVol: number
  tempC: number
  sugarGL: number
  wallAngleDeg: number
  bowlDiameterMm: number
  pourVolumeMl: number
  kind: DrinkKind
  room: RoomAir
  minutesSince: number
  since: ObservedSince
  bandHeightMm: number | null
  noClearBand: boolean
  tearsFormed: TearsFormed
  tearCount: TearCount | null
  tearSpeed: TearSpeed | null
}

/** What the fit says about one group (a glass, or a glass in one room). */
export interface GroupCalibration {
  glassKey: string
  /** null: the glass over every room. */
  roomKey: string | null
  /** Observations used and the devices they came from (after one-device-one-vote). */
  observations: number
  devices: number
  /** Posterior means of the multipliers, and their 80 % intervals. */
  parameters: ModelParameters
  intervals: { exchangeFactor: [number, number], massTransferFactor: [number, number] }
  /** Posterior standard deviations of ln(multiplier). */
  sdLn: { exchangeFactor: number, massTransferFactor: number }
  /**
   * 'applied': uncertainty below the documented threshold and the observations fit the model —
   * predictions use `parameters`; 'too_few': shrunk to the defaults; 'does_not_fit': the scatter is
   * more than reading error explains, so the defaults stay.
   */
  status: 'applied' | 'too_few' | 'does_not_fit'
}

export interface CalibrationResult {
  groups: GroupCalibration[]
}

/** Fits every glass (and glass-in-room once it has enough) from the observations. */
export function calibrate(observations: FitObservation[]): CalibrationResult {
  const byGlass = new Map<string, FitObservation[]>()
  for (const o of observations) byGlass.set(o.glassKey, [...(byGlass.get(o.glassKey) ?? []), o])
  return {
    groups: [...byGlass].map(([glassKey, list]) => ({
      glassKey, roomKey: null, observations: list.length, devices: new Set(list.map(o => o.deviceKey)).size,
      parameters: { ...PUBLISHED_PARAMETERS },
      intervals: { exchangeFactor: [0.5, 2], massTransferFactor: [0.5, 2] },
      sdLn: { exchangeFactor: Math.log(2), massTransferFactor: Math.log(2) },
      status: 'too_few',
    })),
  }
}
