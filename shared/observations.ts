import { z } from './schemas/zod'
import { roomReadingSchema } from './schemas/room'

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

/** What was seen in one glass and when, as it is stored and read back (no identity). */
export interface SeenInGlass extends ObservedValues {
  minutesSince: number
  since: ObservedSince
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

// ─── The forms and the routes that take an observation ───────────────────────────────────────────

/** What the form calls each choice (Larmoir's own words; the bins are the values above). */
export const TEARS_FORMED_LABELS: Record<TearsFormed, string> = { yes: 'Yes', no: 'No', unsure: 'Not sure' }
export const TEAR_COUNT_LABELS: Record<TearCount, string> = {
  'up_to_5': 'A few (up to 5)',
  '6_to_15': 'Several (6–15)',
  '16_to_30': 'Many (16–30)',
  'over_30': 'A crowd (over 30)',
}
export const TEAR_SPEED_LABELS: Record<TearSpeed, string> = { slow: 'Slow', steady: 'Steady', fast: 'Fast' }
/** Each speed bin in words a guest can time against a fingertip (1 cm) and a slow count of seconds. */
export const TEAR_SPEED_HINTS: Record<TearSpeed, string> = {
  slow: '3 seconds or more to slide a fingertip’s width (1 cm)',
  steady: 'about 2 seconds to slide 1 cm (1½ to 3)',
  fast: 'under 1½ seconds to slide 1 cm',
}
/** Each speed bin as a span of seconds per centimetre, for sentences. */
export const TEAR_SPEED_SPANS: Record<TearSpeed, string> = { slow: '3 s or more per cm', steady: '1½–3 s per cm', fast: 'under 1½ s per cm' }
export const OBSERVED_SINCE_LABELS: Record<ObservedSince, string> = { pour: 'the pour', swirl: 'the last swirl' }

/** The step of the band's box: half a millimetre, finer than anyone reads a curved glass by eye. */
export const BAND_READING_STEP_MM = 0.5

const bandMessage = `Enter the band’s height in millimetres, as a number from 0 to ${BAND_READING_MAX_MM} (the card’s scale).`
const choiceMessage = (what: string, options: readonly string[]) => `Choose ${what}: ${options.join(', ')}.`

/** The fields both forms (the guest's and the host's) share, each with its own message. */
const fieldShape = {
  bandHeightMm: z.number({ error: bandMessage })
    .min(0, { error: 'The band’s height cannot be below 0 mm: read it up from the top of the wine.' })
    .max(BAND_READING_MAX_MM, { error: `The card’s scale ends at ${BAND_READING_MAX_MM} mm; a band higher than that is not one we can read.` })
    .transform(v => Math.round(v * 10) / 10)
    .nullable().default(null),
  noClearBand: z.boolean({ error: 'Say yes or no to “no clear band”.' }).default(false),
  tearsFormed: z.enum(TEARS_FORMED, { error: choiceMessage('whether tears formed', Object.values(TEARS_FORMED_LABELS)) }),
  tearCount: z.enum(TEAR_COUNTS, { error: choiceMessage('roughly how many tears', Object.values(TEAR_COUNT_LABELS)) }).nullable().default(null),
  tearSpeed: z.enum(TEAR_SPEEDS, { error: choiceMessage('how fast the tears slid', Object.values(TEAR_SPEED_LABELS)) }).nullable().default(null),
  minutesSince: z.number({ error: `Enter the minutes since pouring or swirling, from 0 to ${OBSERVED_MINUTES_MAX}.` })
    .refine(Number.isInteger, { error: 'Enter whole minutes.' })
    .min(0, { error: 'Minutes cannot be below 0.' })
    .max(OBSERVED_MINUTES_MAX, { error: `At most ${OBSERVED_MINUTES_MAX} minutes (${OBSERVED_MINUTES_MAX / 60} hours): after that the glass has changed too much to say.` }),
  since: z.enum(OBSERVED_SINCE, { error: 'Say whether the minutes count from the pour or from the last swirl.' }),
}

/** Rules across fields: a band and "no clear band" together, or tear details with "no tears". */
function crossRules(v: { bandHeightMm: number | null, noClearBand: boolean, tearsFormed: TearsFormed, tearCount: TearCount | null, tearSpeed: TearSpeed | null }, ctx: z.RefinementCtx) {
  if (v.noClearBand && v.bandHeightMm !== null) ctx.addIssue({ code: 'custom', path: ['bandHeightMm'], message: 'You chose “no clear band”: leave the height empty, or take that choice back.' })
  if (v.tearsFormed === 'no' && v.tearCount !== null) ctx.addIssue({ code: 'custom', path: ['tearCount'], message: 'You said no tears formed, so leave “how many” empty.' })
  if (v.tearsFormed === 'no' && v.tearSpeed !== null) ctx.addIssue({ code: 'custom', path: ['tearSpeed'], message: 'You said no tears formed, so leave “how fast” empty.' })
}

/** What a person saw in one glass: the form's own fields (the guest's form checks these before sending). */
export const observationFieldsSchema = z.object(fieldShape).superRefine(crossRules)
export type ObservationFields = z.output<typeof observationFieldsSchema>
/** The same fields as a form holds them before the check (defaults not yet filled in). */
export type ObservationFieldsInput = z.input<typeof observationFieldsSchema>

const idField = (what: string) => z.number({ error: `The ${what} must be a number.` }).int({ error: `The ${what} must be a whole number.` }).positive({ error: `The ${what} must be positive.` })

/**
 * The bot check's answer (GET /api/observations/challenge): the signed challenge as it came, and the
 * counter whose SHA-256 with it starts with the asked-for zero bits.
 */
const challengeField = z.object({
  token: z.string({ error: 'The bot check is missing: reload the page and try again.' }).min(1, { error: 'The bot check is missing: reload the page and try again.' }).max(400, { error: 'The bot check is not one of ours.' }),
  counter: z.number({ error: 'The bot check has no answer yet.' }).int({ error: 'The bot check’s answer must be a whole number.' }).min(0, { error: 'The bot check’s answer cannot be negative.' }).max(2 ** 40, { error: 'The bot check’s answer is too large.' }),
}, { error: 'The bot check is missing: reload the page and try again.' })

/**
 * A guest's observation (POST /api/observations): the pour, the session from the card's QR code
 * (if any), the fields, the bot check and a box people never see (`website`: a bot that fills
 * every input fills it too).
 */
export const guestObservationSchema = z.object({
  flightId: idField('flight id'),
  position: z.number({ error: 'The pour number must be a number.' }).int({ error: 'The pour number must be a whole number.' }).min(1, { error: 'Pours are numbered from 1.' }).max(8, { error: 'A flight has at most 8 pours.' }),
  sessionId: idField('session id').nullable().default(null),
  ...fieldShape,
  challenge: challengeField,
  website: z.string({ error: 'Leave this box empty.' }).max(0, { error: 'Leave this box empty.' }).default(''),
}).superRefine(crossRules)

// ─── Flags: implausible values are kept, and say why ─────────────────────────────────────────────

/** Why a stored observation looks implausible. Each rule below names its reasoning. */
export const OBSERVATION_FLAGS = [
  'band_far_above_prediction',
  'band_over_50_mm',
  'tears_under_foam',
  'fast_tears_very_sweet',
  'band_without_tears',
  'read_after_two_hours',
  'session_not_this_flight',
  'session_not_now',
] as const
export type ObservationFlag = (typeof OBSERVATION_FLAGS)[number]

/** How a flag reads on a staff page. */
export const OBSERVATION_FLAG_LABELS: Record<ObservationFlag, string> = {
  band_far_above_prediction: 'band over 4 × the predicted high end',
  band_over_50_mm: 'band over 50 mm',
  tears_under_foam: 'tears reported under foam',
  fast_tears_very_sweet: 'fast tears from a very sweet pour',
  band_without_tears: 'a band reported with “no tears”',
  read_after_two_hours: 'read more than 2 hours after pouring or swirling',
  session_not_this_flight: 'the card’s session pours another flight',
  session_not_now: 'the card’s session was not on at the time',
}

/**
 * A band more than this many times the predicted range's high end is far outside what the model's
 * documented uncertainty can reach (its 90th percentile already carries the spread of every input):
 * most likely the reading is of something else, such as the swirl's wet ring (estimate, no source).
 */
export const FLAG_BAND_OVER_PREDICTED_FACTOR = 4
/**
 * A climbing film's clear band stands a few millimetres to a couple of centimetres above the wine in
 * tasting glasses; 50 mm is more than twice the highest the model predicts for any demo pour (estimate,
 * no source), and a reading that high is most likely the swirl's wet ring.
 */
export const FLAG_BAND_MAX_MM = 50
/**
 * Very sweet: 100 g/L of sugar and more (dessert wines, tawny and ruby ports, liqueurs). Sugar thickens
 * the liquid, so its tears slide slowly; "sweet" wine starts at 45 g/L in EU labelling (Regulation (EU)
 * 2019/33, Annex III), and 100 g/L is well past it (estimate, no source for the cut itself).
 */
export const FLAG_VERY_SWEET_G_L = 100
/**
 * After two hours the pour has lost much of its alcohol from the surface and the glass wall has
 * dried or been refilled; what is seen then says little about the pour as served (estimate, no source).
 */
export const FLAG_MINUTES_MAX = 120

/** What observationFlags needs: the values seen, the pour's sugar, and how the session tie went. */
export interface FlagInput extends ObservedValues {
  minutesSince: number
  residualSugarGL: number
  /** 'none' when no session was given; the two mismatches when one was given but did not fit. */
  session: 'matched' | 'none' | 'other_flight' | 'not_now'
}

/** The prediction the flags compare with (a TearPrediction fits). */
export interface FlagPrediction extends PredictedRanges {
  suppressedBy: 'foam' | 'held' | null
}

/**
 * The reasons an observation looks implausible, in OBSERVATION_FLAGS order; empty when none. Pure:
 * the route stores the result in `observations.flags`, keeps the row, and the calibration leaves
 * flagged rows out.
 * - band over FLAG_BAND_OVER_PREDICTED_FACTOR × the predicted high end, or over FLAG_BAND_MAX_MM;
 * - tears "yes" where the model says foam holds the surface (beer): foam stops the film climbing;
 * - "fast" tears from a pour of FLAG_VERY_SWEET_G_L or more, whose predicted range stays below the
 *   fast bin (sugar's viscosity slows tears);
 * - a band read while saying no tears formed: the band is the film the tears fall from, so the two
 *   go together (or the band read is the swirl's ring);
 * - minutes over FLAG_MINUTES_MAX;
 * - a card's session of another flight, or one not on from 2 h before its start to 6 h after its end.
 */
export function observationFlags(o: FlagInput, p: FlagPrediction): ObservationFlag[] {
  const out = new Set<ObservationFlag>()
  const band = o.noClearBand ? null : o.bandHeightMm
  const high = p.ranges.clearBandHeight_mm?.high
  if (band !== null && high !== undefined && high > 0 && band > FLAG_BAND_OVER_PREDICTED_FACTOR * high) out.add('band_far_above_prediction')
  if (band !== null && band > FLAG_BAND_MAX_MM) out.add('band_over_50_mm')
  if (o.tearsFormed === 'yes' && p.suppressedBy === 'foam') out.add('tears_under_foam')
  const speedHigh = p.ranges.tearFallSpeed_mm_s?.high ?? 0
  if (o.tearSpeed === 'fast' && o.residualSugarGL >= FLAG_VERY_SWEET_G_L && speedHigh < TEAR_SPEED_BINS_MM_S.fast.min) out.add('fast_tears_very_sweet')
  if (band !== null && band > 0 && o.tearsFormed === 'no') out.add('band_without_tears')
  if (o.minutesSince > FLAG_MINUTES_MAX) out.add('read_after_two_hours')
  if (o.session === 'other_flight') out.add('session_not_this_flight')
  if (o.session === 'not_now') out.add('session_not_now')
  return OBSERVATION_FLAGS.filter(f => out.has(f))
}

/** A card's session counts for an observation from this long before its start… */
const SESSION_TIE_BEFORE_MS = 2 * 3_600_000
/** …to this long after its end (guests linger; a host tidies up the record later). */
const SESSION_TIE_AFTER_MS = 6 * 3_600_000

/** Whether an observation made at `at` may be tied to this session of this flight. */
export function sessionTie(session: { flightId: number, startsAt: Date, durationMinutes: number, status: string } | null, flightId: number, at: Date): FlagInput['session'] {
  if (!session) return 'none'
  if (session.flightId !== flightId) return 'other_flight'
  const from = session.startsAt.getTime() - SESSION_TIE_BEFORE_MS
  const to = session.startsAt.getTime() + session.durationMinutes * 60_000 + SESSION_TIE_AFTER_MS
  if (session.status === 'cancelled' || at.getTime() < from || at.getTime() > to) return 'not_now'
  return 'matched'
}

/** Entries one device may make for one pour at one session (the card's QR; or none). */
export const ENTRIES_PER_DEVICE_POUR_SESSION = 3

/**
 * The host's observation for one pour of a session (POST /api/sessions/[id]/observations): the same
 * fields, and the room's humidity and air temperature as the host reads them (the messages speak the
 * venue's unit; the wire carries °C).
 */
export const hostObservationSchema = (unit: 'c' | 'f') => z.object({
  position: z.number({ error: 'Choose the pour.' }).int({ error: 'Choose the pour.' }).min(1, { error: 'Pours are numbered from 1.' }).max(8, { error: 'A flight has at most 8 pours.' }),
  ...fieldShape,
  ...roomReadingSchema(unit).shape,
}).superRefine(crossRules)
