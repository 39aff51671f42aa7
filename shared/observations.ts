/**
 * What a guest or host saw in a glass, as Larmoir records it (issue: the observations loop).
 * The choices here are shared by the pour page's form, the host's form, the routes that take them,
 * the manager's chart and the calibration. Owners: the capture side (form, routes, flags) and the
 * analysis side (chart, CSV, calibration) both read from this file; change it in one place.
 */

/** Who recorded it. 'host': staff at the session, with their own reading of the room. */
export const OBSERVATION_SOURCES = ['guest', 'host'] as const
export type ObservationSource = (typeof OBSERVATION_SOURCES)[number]

/** Did tears form after a swirl? 'unsure' is an honest answer and is kept. */
export const TEARS_FORMED = ['yes', 'no', 'unsure'] as const
export type TearsFormed = (typeof TEARS_FORMED)[number]

/** What the minutes are counted from. */
export const OBSERVED_SINCE = ['pour', 'swirl'] as const
export type ObservedSince = (typeof OBSERVED_SINCE)[number]

/**
 * How fast a tear slid, as a guest can judge it: the time a tear takes to slide one centimetre
 * (about a fingertip's width). Bounds in mm/s; a bin's lower bound is inclusive.
 * slow: 3 s or more per cm; steady: 1.5–3 s per cm; fast: under 1.5 s per cm.
 */
export const TEAR_SPEEDS = ['slow', 'steady', 'fast'] as const
export type TearSpeed = (typeof TEAR_SPEEDS)[number]
export const TEAR_SPEED_BINS_MM_S: Record<TearSpeed, { min: number, max: number }> = {
  slow: { min: 0, max: 10 / 3 },
  steady: { min: 10 / 3, max: 20 / 3 },
  fast: { min: 20 / 3, max: Number.POSITIVE_INFINITY },
}

/** Roughly how many tears stood around the glass at once. Bounds inclusive; max null = no upper bound. */
export const TEAR_COUNTS = ['up_to_5', '6_to_15', '16_to_30', 'over_30'] as const
export type TearCount = (typeof TEAR_COUNTS)[number]
export const TEAR_COUNT_BINS: Record<TearCount, { min: number, max: number | null }> = {
  'up_to_5': { min: 1, max: 5 },
  '6_to_15': { min: 6, max: 15 },
  '16_to_30': { min: 16, max: 30 },
  'over_30': { min: 31, max: null },
}

/** The card's printed scale runs 0–80 mm; a reading beyond it is refused as input, not flagged. */
export const BAND_READING_MAX_MM = 80

/** Minutes since pouring or swirling that a form accepts (a session lasts at most a few hours). */
export const OBSERVED_MINUTES_MAX = 240

/** Where the room reading attached to an observation came from. */
export const ROOM_SOURCES = ['host', 'session', 'venue'] as const
export type RoomSource = (typeof ROOM_SOURCES)[number]

/**
 * A band read by eye against a millimetre scale on a curved glass: ±1 mm before it counts as
 * outside the predicted range (estimate, no source).
 */
export const BAND_READING_ERROR_MM = 1

/** Where an observed value fell against the model's 10–90 % range. */
export type Agreement = 'inside' | 'above' | 'below' | 'not_compared'

export interface ObservationComparison {
  band: Agreement
  speed: Agreement
  count: Agreement
  /** Whether tears formed as the model expected ('not_compared' for "unsure"). */
  tears: 'agrees' | 'disagrees' | 'not_compared'
}

/** What compareObservation needs of an observation. */
export interface ObservedValues {
  bandHeightMm: number | null
  noClearBand: boolean
  tearsFormed: TearsFormed
  tearCount: TearCount | null
  tearSpeed: TearSpeed | null
}

/** What compareObservation needs of a prediction (a TearPrediction fits). */
export interface PredictedRanges {
  tearsExpected: boolean
  bandVisible: boolean
  ranges: {
    clearBandHeight_mm: { low: number, high: number } | null
    tearFallSpeed_mm_s: { low: number, high: number } | null
    tearsAround: { low: number, high: number } | null
  }
}

/** An interval [min, max] against a range: overlapping is inside, else above or below. */
function against(min: number, max: number, r: { low: number, high: number } | null): Agreement {
  if (!r) return 'not_compared'
  if (max < r.low) return 'below'
  if (min > r.high) return 'above'
  return 'inside'
}

/**
 * How one observation compares with the model's prediction for that glass: the band against its
 * range (±BAND_READING_ERROR_MM), the speed's and the count's bins against theirs, tears or none.
 */
export function compareObservation(o: ObservedValues, p: PredictedRanges): ObservationComparison {
  let band: Agreement = 'not_compared'
  if (o.noClearBand) band = p.bandVisible ? 'below' : 'inside'
  else if (o.bandHeightMm !== null) {
    band = p.bandVisible || p.ranges.clearBandHeight_mm
      ? against(o.bandHeightMm - BAND_READING_ERROR_MM, o.bandHeightMm + BAND_READING_ERROR_MM, p.ranges.clearBandHeight_mm)
      : 'above'
  }
  const speedBin = o.tearSpeed ? TEAR_SPEED_BINS_MM_S[o.tearSpeed] : null
  const speed = speedBin ? against(speedBin.min, speedBin.max, p.ranges.tearFallSpeed_mm_s) : 'not_compared'
  const countBin = o.tearCount ? TEAR_COUNT_BINS[o.tearCount] : null
  const count = countBin ? against(countBin.min, countBin.max ?? Number.POSITIVE_INFINITY, p.ranges.tearsAround) : 'not_compared'
  const tears = o.tearsFormed === 'unsure' ? 'not_compared' : (o.tearsFormed === 'yes') === p.tearsExpected ? 'agrees' : 'disagrees'
  return { band, speed, count, tears }
}
