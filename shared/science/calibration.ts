/**
 * Calibration of the glass model from what guests and hosts saw (docs/science.md, "Calibration from
 * observations"). Pure functions, no framework imports.
 *
 * Method: a Bayesian fit of two log multipliers per glass (θ = ln exchangeFactor, ln
 * massTransferFactor) with a Gaussian prior centred on the published defaults, the reading scatter's
 * scale estimated from the data (scaled-inverse-χ² prior), band readings as normal observations with
 * "no clear band" and the scale's end as censored ones, tear-speed bins as interval-censored
 * judgements, and the posterior by the Laplace approximation at its mode with the model relinearised
 * at the mode (Gauss–Newton). Gelman, Carlin, Stern, Dunson, Vehtari & Rubin, Bayesian Data
 * Analysis, 3rd ed. (2013): ch. 2–3 (normal model, scaled-inverse-χ² prior on a variance), §4.1 (the
 * normal approximation at the mode), ch. 5 (hierarchical models, partial pooling), §6.3 (posterior
 * predictive checks), §8 (censored and rounded data), §13.3 (finding the mode, Newton's method) —
 * from memory: chapter numbers as recalled, not checked against the book.
 */
import type { DrinkKind, RoomAir } from './glassModel'
import { calibrationRun } from './glassModel'
import type { ObservedSince, TearCount, TearSpeed, TearsFormed } from '../observations'
import { BAND_READING_MAX_MM, OBSERVED_MINUTES_MAX, TEAR_SPEED_BINS_MM_S } from '../observations'

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
  /** Posterior correlation of ln(exchangeFactor) and ln(massTransferFactor) (absent: 0). */
  correlation?: number
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
  /** Entries before one-device-one-vote (a device's repeated entries for one pour count once). */
  entries: number
  /** Posterior medians of the multipliers, exp(posterior mean of ln multiplier), and their 80 % intervals. */
  parameters: ModelParameters
  intervals: { exchangeFactor: [number, number], massTransferFactor: [number, number] }
  /** Posterior standard deviations of ln(multiplier). */
  sdLn: { exchangeFactor: number, massTransferFactor: number }
  /** Posterior correlation of the two ln multipliers. */
  correlation: number
  /**
   * The fit check: the band's scatter beyond reading error, as a fraction of the band (posterior
   * mode of s; null without band readings), and the speed judgements' log score against what the
   * fitted model expects, in standard deviations (null without speed judgements; below −3 fails).
   */
  fit: { bandScatter: number | null, speedScoreZ: number | null }
  /**
   * 'applied': uncertainty below the documented threshold and the observations fit the model —
   * predictions use `parameters`; 'too_few': shrunk to the defaults; 'does_not_fit': the scatter is
   * more than reading error explains, so the defaults stay.
   */
  status: 'applied' | 'too_few' | 'does_not_fit'
}

export interface CalibrationResult {
  groups: GroupCalibration[]
  /** How many runs of the glass model the fit took (memoised per pour, room reading and parameter point). */
  modelRuns: number
}

/**
 * Prior widths, sd of ln(multiplier) (docs/science.md, "Calibration from observations"):
 * - exchangeFactor: ln 2 — the published "×/÷ 2" on f (climbingFilm.ts) read as one standard deviation;
 * - massTransferFactor: 0.35 (×/÷ 1.42) — the published draught spread (0.05–0.2 m/s moves k by
 *   ×/÷ 1.27 end to end, sd 0.14 in ln k) widened for what it leaves out: the correlations' own
 *   accuracy, the 4 cm plate length and a bowl that is not a flat plate (estimate).
 */
export const CALIBRATION_PRIOR_SD_LN = { exchangeFactor: Math.log(2), massTransferFactor: 0.35 } as const

/**
 * A band reading's error, mm, 1σ: an eye reading a printed millimetre scale held against a curved
 * glass, the band's top a soft edge (estimate, no source). The scatter beyond it is estimated.
 */
const BAND_READING_SD_MM = 2

/**
 * Band readings are Student-t with ν = 4 around the model (a robust likelihood, BDA3 §17.2 — from
 * memory): one device's misreading of 60 mm for a 10 mm band weighs like a few normal residuals, not like
 * hundreds, so it neither drags the multipliers nor, alone, fails the fit check.
 */
const BAND_T_NU = 4
const BAND_T_HALF_NU1 = (BAND_T_NU + 1) / 2

/**
 * Prior on the band's relative scatter s (between glasses, moments and observers): scaled-inverse-χ²
 * on s² with ν0 = 4 pseudo-observations at s0 = 0.25 (estimate; BDA3 ch. 3, from memory).
 */
const SCATTER_PRIOR = { nu0: 4, s0: 0.25 } as const

/**
 * A guest's judgement of a tear's speed, sd of ln(speed), 1σ: counting the seconds a tear takes over a
 * centimetre by eye (estimate, no source), and a lapse share: a guest taps a bin at random this often
 * (estimate; keeps one stray tap from ruling the fit).
 */
const SPEED_JUDGEMENT_SD_LN = 0.3
const SPEED_LAPSE = 0.05

/** What decides a group's status and its room level (docs/science.md, "Calibration from observations"). */
export const CALIBRATION_THRESHOLDS = {
  /** 'applied' needs both posterior sdLn ≤ this: the 80 % interval inside ×/÷ 1.38, against the published ×/÷ 2 on f. */
  applySdLn: 0.25,
  /** Votes (one device at one pour) below which a group stays 'too_few' whatever its sdLn: the scatter's scale then rests on its prior. */
  minVotes: 12,
  /** The fit check: the band's relative scatter beyond reading error above this fails (±40 % at 1σ). */
  maxBandScatter: 0.4,
  /** The fit check: the speed judgements' log score more than this many sd below its expectation fails. */
  minSpeedScoreZ: -3,
  /** A room's own group is reported once it has this many votes for the glass (and the glass has another room). */
  minRoomVotes: 12,
  /** The hierarchical room level: sd of a room's deviation of each ln multiplier from its glass (draughts, observers; estimate). */
  roomSdLn: 0.2,
} as const

/** Options of calibrate; every field defaults to the documented constant above. */
export interface CalibrateOptions {
  priorSdLn?: { exchangeFactor: number, massTransferFactor: number }
  applySdLn?: number
  minVotes?: number
  minRoomVotes?: number
  roomSdLn?: number
}

/** One device's vote at one pour: its entries aggregated. */
interface Vote {
  glassKey: string
  roomKey: string
  deviceKey: string
  entries: number
  base: FitObservation
  minutes: number
  band: number | null
  noClearBand: boolean
  speed: TearSpeed | null
  /** The pour without its room, and the pour in its (rounded) room: the memo keys of its model runs. */
  pourKey: string
  conditionKey: string
}

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b)
  const m = Math.floor(s.length / 2)
  return s.length % 2 ? s[m]! : 0.5 * (s[m - 1]! + s[m]!)
}

/** The most frequent value; on a tie the one nearest the middle of `order` (a device saying slow and fast once each said steady). */
function mode<T extends string>(values: T[], order: readonly T[]): T | null {
  if (!values.length) return null
  const counts = new Map<T, number>()
  for (const v of values) counts.set(v, (counts.get(v) ?? 0) + 1)
  const top = Math.max(...counts.values())
  const tied = [...counts].filter(([, n]) => n === top).map(([v]) => v)
  if (tied.length === 1) return tied[0]!
  const idx = tied.map(v => order.indexOf(v))
  const mid = Math.round(idx.reduce((a, b) => a + b, 0) / idx.length)
  return order[mid] ?? tied[0]!
}

/** One device at one pour of one session counts once: median band, majority on "no clear band", modal speed, median minutes. */
function votesOf(observations: FitObservation[]): Vote[] {
  const by = new Map<string, FitObservation[]>()
  for (const o of observations) {
    const key = JSON.stringify([o.glassKey, o.roomKey, o.deviceKey])
    const list = by.get(key)
    if (list) list.push(o)
    else by.set(key, [o])
  }
  const votes: Vote[] = []
  for (const list of by.values()) {
    const first = list[0]!
    const bands = list.filter(o => !o.noClearBand && o.bandHeightMm !== null && Number.isFinite(o.bandHeightMm)).map(o => o.bandHeightMm!)
    const none = list.filter(o => o.noClearBand).length
    const seenTears = list.filter(o => o.tearsFormed !== 'no')
    const speeds = seenTears.map(o => o.tearSpeed).filter((s): s is TearSpeed => s !== null)
    votes.push({
      glassKey: first.glassKey, roomKey: first.roomKey, deviceKey: first.deviceKey, entries: list.length, base: first,
      minutes: median(list.map(o => Math.min(OBSERVED_MINUTES_MAX, Math.max(0, o.minutesSince)))),
      band: none > bands.length || !bands.length ? null : median(bands),
      noClearBand: none > bands.length,
      speed: mode(speeds, ['slow', 'steady', 'fast'] as const),
      pourKey: JSON.stringify(pourOf(first)),
      conditionKey: JSON.stringify([pourOf(first), roundedRoom(first.room)]),
    })
  }
  return votes
}

/** Linearised model for one vote: ln H and ln U at θ0 with their gradients in θ = (ln f, ln k). */
interface Linear {
  theta0: [number, number]
  lnH: number
  gH: [number, number]
  lnU: number | null
  gU: [number, number]
  visibleMin_mm: number
}

/** Step of the forward differences in ln multiplier. */
const DIFF_STEP = 0.05
/** The ABV step of the secant that carries a pour's loss of alcohol into its band and speed, % vol. */
const ABV_SECANT_PCT_VOL = 1
/** Linearisation points are rounded to this (ln units) so that groups share the pour's runs. */
const THETA_GRID = 0.01
/** The model is relinearised until the mode lies within this of the linearisation point (ln units). */
const RELINEARISE_LN = 0.02

/** Whether the mode x lies within RELINEARISE_LN of the linearisation point θL in both ln multipliers. */
const near = (x: number[], thetaL: [number, number], within = RELINEARISE_LN): boolean => Math.abs(x[0]! - thetaL[0]) < within && Math.abs(x[1]! - thetaL[1]) < within
/**
 * A room starts from its glass's linearisation (exact at the glass's mode) and is relinearised only
 * when its mode lies further than this from it: within 0.1 in ln the model's values move by the
 * shared gradient to better than 1 % (docs/science.md §16).
 */
const ROOM_RELINEARISE_LN = 0.1

type Run = ReturnType<typeof calibrationRun>
type RunInputs = Parameters<typeof calibrationRun>[0]

/** The room a vote's reading gives, rounded (the hygrometer reads ±4 % RH, uncertainty.ts) so that votes share runs. */
const roundedRoom = (r: RoomAir): RoomAir => ({ relativeHumidityPct: Math.round(r.relativeHumidityPct), airTempC: Math.round(4 * r.airTempC) / 4 })

/** The pour as served, without its room. */
const pourOf = (o: FitObservation) => ({
  abvPctVol: o.abvPctVol, tempC: o.tempC, sugarGL: o.sugarGL, wallAngleDeg: o.wallAngleDeg, bowlDiameterMm: o.bowlDiameterMm,
  pourVolumeMl: o.pourVolumeMl, kind: o.kind,
})

/**
 * The model runs of one calibrate call, memoised per distinct condition and parameter point.
 *
 * Gauss–Newton with the residuals exact and the Jacobian shared (docs/science.md): at a
 * linearisation point θL each vote's ln H and ln U are its own condition's model values at θL (one
 * run per pour and room reading), shifted by the pour's loss of alcohol since pouring (a secant in
 * ABV per pour); their gradients in θ are the pour's, computed at a reference room (the mean of its
 * votes' readings). Relinearising until θL stops moving makes the mode solve the estimating equations
 * with exact residuals; the shared gradient changes only the path and, by a few hundredths, the
 * posterior's width.
 */
class ModelCache {
  private runs = new Map<string, Run | null>()
  private conditions = new Map<string, ConditionLinear | null>()
  private references = new Map<string, { key: string, inputs: RunInputs, lowerKey: string, lower: RunInputs | null }>()
  count = 0

  constructor(votes: Vote[]) {
    const rooms = new Map<string, { pour: ReturnType<typeof pourOf>, list: RoomAir[] }>()
    for (const v of votes) {
      const entry = rooms.get(v.pourKey)
      if (entry) entry.list.push(v.base.room)
      else rooms.set(v.pourKey, { pour: pourOf(v.base), list: [v.base.room] })
    }
    for (const [key, { pour, list }] of rooms) {
      const mean = (f: (r: RoomAir) => number): number => list.reduce((s, r) => s + f(r), 0) / list.length
      const inputs = { ...pour, room: roundedRoom({ relativeHumidityPct: mean(r => r.relativeHumidityPct), airTempC: mean(r => r.airTempC) }) }
      const lowerAbv = Math.max(0, pour.abvPctVol - ABV_SECANT_PCT_VOL)
      const lower = lowerAbv < pour.abvPctVol ? { ...inputs, abvPctVol: lowerAbv } : null
      this.references.set(key, { key: JSON.stringify(inputs), inputs, lowerKey: JSON.stringify(lower), lower })
    }
  }

  private run(key: string, inputs: RunInputs, a: number, b: number): Run | null {
    const k = `${key}|${a}|${b}`
    const hit = this.runs.get(k)
    if (hit !== undefined) return hit
    let r: Run | null
    try {
      r = calibrationRun(inputs, { exchangeFactor: Math.exp(a), massTransferFactor: Math.exp(b) })
      this.count++
      if (!r.tearsExpected || !(r.clearBandHeight_mm > 0)) r = null
    }
    catch {
      r = null // outside the model's ranges: the vote is left out
    }
    this.runs.set(k, r)
    return r
  }

  /** The condition's linearisation at the grid point (a, b), shared by every vote at that pour and room reading. */
  private condition(v: Vote, a: number, b: number, exact: boolean): ConditionLinear | null {
    const key = `${v.conditionKey}|${a}|${b}|${exact ? 1 : 0}`
    const hit = this.conditions.get(key)
    if (hit !== undefined) return hit
    const mine = { ...pourOf(v.base), room: roundedRoom(v.base.room) }
    const ref = this.references.get(v.pourKey)!
    const own0 = this.run(v.conditionKey, mine, 0, 0)
    const own = exact ? this.run(v.conditionKey, mine, a, b) : own0
    const pc = this.run(ref.key, ref.inputs, a, b)
    const pa = this.run(ref.key, ref.inputs, a + DIFF_STEP, b)
    const pb = this.run(ref.key, ref.inputs, a, b + DIFF_STEP)
    const p0 = this.run(ref.key, ref.inputs, 0, 0)
    const pd = ref.lower ? this.run(ref.lowerKey, ref.lower, 0, 0) : null
    let out: ConditionLinear | null = null
    if (own0 && own && pc && pa && pb && p0) {
      const [ownH, ownU] = logs(own)
      const [hc, uc] = logs(pc)
      const [ha, ua] = logs(pa)
      const [hb, ub] = logs(pb)
      const [h0, u0] = logs(p0)
      const [hd, ud] = pd ? logs(pd) : [h0, u0]
      const step = ref.lower ? ref.inputs.abvPctVol - ref.lower.abvPctVol : 0
      const slope = (x0: number, x1: number): number => (step > 0 ? (x0 - x1) / step : 0)
      const speedOk = ownU !== null && u0 !== null && uc !== null && ua !== null && ub !== null && ud !== null
      out = {
        theta0: [a, b],
        // approximate passes carry the condition's own value by the reference room's response
        lnH: ownH + (exact ? 0 : hc - h0),
        gH: [(ha - hc) / DIFF_STEP, (hb - hc) / DIFF_STEP],
        lnU: speedOk ? ownU + (exact ? 0 : uc - u0) : null,
        gU: speedOk ? [(ua! - uc) / DIFF_STEP, (ub! - uc) / DIFF_STEP] : [0, 0],
        visibleMin_mm: own0.visibleBandMin_mm,
        slopeH: slope(h0, hd),
        slopeU: speedOk ? slope(u0, ud!) : 0,
        lossPct: own0.alcoholLossPer10Min_pct,
      }
    }
    this.conditions.set(key, out)
    return out
  }

  /**
   * The vote's model, linearised at θL (null: no film climbs or no tears at its condition, or outside
   * the ranges). The pour's ABV after its minutes of standing: it loses alcoholLossPer10Min_pct of its
   * alcohol per 10 minutes (its own condition at the published parameters), compounded; minutes since
   * a swirl are a lower bound on the minutes since the pour and are used as such.
   */
  linear(v: Vote, thetaL: [number, number], exact: boolean): Linear | null {
    const a = Math.round(thetaL[0] / THETA_GRID) * THETA_GRID
    const b = Math.round(thetaL[1] / THETA_GRID) * THETA_GRID
    const c = this.condition(v, a, b, exact)
    if (!c) return null
    const abv = v.base.abvPctVol
    const dAbv = v.minutes > 0 ? abv * (1 - c.lossPct / 100) ** (v.minutes / 10) - abv : 0
    return {
      theta0: c.theta0, gH: c.gH, gU: c.gU, visibleMin_mm: c.visibleMin_mm,
      lnH: c.lnH + c.slopeH * dAbv,
      lnU: c.lnU === null ? null : c.lnU + c.slopeU * dAbv,
    }
  }
}

/** A condition's linearisation, before its votes' minutes are applied. */
interface ConditionLinear extends Linear {
  slopeH: number
  slopeU: number
  lossPct: number
}

/** ln H, ln U (null when no tears) of a run. */
function logs(r: Run): [number, number | null] {
  return [Math.log(r.clearBandHeight_mm), r.tearFallSpeed_mm_s !== null && r.tearFallSpeed_mm_s > 0 ? Math.log(r.tearFallSpeed_mm_s) : null]
}

/** Standard normal cdf (Abramowitz & Stegun 7.1.26 for erf, |error| < 1.5e-7 — from memory). */
function phi(z: number): number {
  const x = Math.abs(z) / Math.SQRT2
  const t = 1 / (1 + 0.3275911 * x)
  const y = 1 - (((((1.061405429 * t - 1.453152027) * t) + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-x * x)
  return z >= 0 ? 0.5 * (1 + y) : 0.5 * (1 - y)
}

/** ln Φ(z), kept finite far in the lower tail (asymptotic form below −8). */
function logPhi(z: number): number {
  if (z > -8) return Math.log(Math.max(1e-300, phi(z)))
  return -0.5 * z * z - Math.log(-z) - 0.5 * Math.log(2 * Math.PI)
}

const SPEED_ORDER = ['slow', 'steady', 'fast'] as const

/** Probability of one speed bin for a model speed exp(lnU), with the guest's judgement and lapses. */
function speedProbability(lnU: number, bin: TearSpeed): number {
  const { min, max } = TEAR_SPEED_BINS_MM_S[bin]
  const hi = Number.isFinite(max) ? phi((Math.log(max) - lnU) / SPEED_JUDGEMENT_SD_LN) : 1
  const lo = min > 0 ? phi((Math.log(min) - lnU) / SPEED_JUDGEMENT_SD_LN) : 0
  return (1 - SPEED_LAPSE) * Math.max(0, hi - lo) + SPEED_LAPSE / 3
}

/** Probabilities of the three speed bins. */
const speedProbabilities = (lnU: number): number[] => SPEED_ORDER.map(bin => speedProbability(lnU, bin))

interface Datum { v: Vote, lin: Linear }

/** The group's posterior at its mode, by the Laplace approximation (BDA3 §4.1, §13.3, from memory). */
interface Posterior {
  mean: [number, number]
  cov: [[number, number], [number, number]]
  scatter: number | null
  speedScoreZ: number | null
}

/** ln of each speed bin's bounds (−∞, +∞ at the open ends). */
const SPEED_LOG_BOUNDS = SPEED_ORDER.map((bin) => {
  const { min, max } = TEAR_SPEED_BINS_MM_S[bin]
  return [min > 0 ? Math.log(min) : Number.NEGATIVE_INFINITY, Number.isFinite(max) ? Math.log(max) : Number.POSITIVE_INFINITY] as const
})

/** Negative log posterior of (ln f, ln k, ln s) for linearised data and a Gaussian prior (mean m0, inverse covariance P0inv). */
function negLogPosterior(data: Datum[], m0: [number, number], P0inv: [[number, number], [number, number]]): Objective {
  const { nu0, s0 } = SCATTER_PRIOR
  const n = data.length
  // flattened once: 0 no band, 1 a reading, 2 no clear band (below the visible band), 3 at the scale's end (at least that)
  const kind = new Uint8Array(n)
  const y = new Float64Array(n)
  const lnH = new Float64Array(n)
  const gH0 = new Float64Array(n)
  const gH1 = new Float64Array(n)
  const ta = new Float64Array(n)
  const tb = new Float64Array(n)
  const vis = new Float64Array(n)
  const hasU = new Uint8Array(n)
  const lnU = new Float64Array(n)
  const gU0 = new Float64Array(n)
  const gU1 = new Float64Array(n)
  const lo = new Float64Array(n)
  const hi = new Float64Array(n)
  data.forEach(({ v, lin }, i) => {
    kind[i] = v.noClearBand ? 2 : v.band === null ? 0 : v.band >= BAND_READING_MAX_MM ? 3 : 1
    y[i] = v.band ?? 0
    lnH[i] = lin.lnH
    gH0[i] = lin.gH[0]
    gH1[i] = lin.gH[1]
    ta[i] = lin.theta0[0]
    tb[i] = lin.theta0[1]
    vis[i] = lin.visibleMin_mm
    if (v.speed !== null && lin.lnU !== null) {
      hasU[i] = 1
      lnU[i] = lin.lnU
      gU0[i] = lin.gU[0]
      gU1[i] = lin.gU[1]
      const [l, h] = SPEED_LOG_BOUNDS[SPEED_ORDER.indexOf(v.speed)]!
      lo[i] = l
      hi[i] = h
    }
  })
  const hasBand = kind.some(k => k > 0)
  const r2 = BAND_READING_SD_MM * BAND_READING_SD_MM
  const sU = SPEED_JUDGEMENT_SD_LN
  const nu = BAND_T_NU
  const c = BAND_T_HALF_NU1
  /** The value and its gradient in (ln f, ln k, ln s). */
  return (x: number[]): [number, number, number, number] => {
    const a = x[0]!
    const b = x[1]!
    const t = x[2]!
    const s2 = Math.exp(2 * t)
    let nll = 0
    let ga = 0
    let gb = 0
    let gt = 0
    for (let i = 0; i < n; i++) {
      const da = a - ta[i]!
      const db = b - tb[i]!
      const k = kind[i]!
      if (k > 0) {
        const H = Math.exp(lnH[i]! + gH0[i]! * da + gH1[i]! * db)
        const v2 = r2 + s2 * H * H
        let dH = 0 // ∂nll/∂H
        let dv2 = 0 // ∂nll/∂v2
        if (k === 1) {
          const e = y[i]! - H
          const q = 1 + (e * e) / (nu * v2)
          nll += 0.5 * Math.log(v2) + c * Math.log(q)
          dH = (c * (-2 * e)) / (nu * v2 * q)
          dv2 = 0.5 / v2 - (c * e * e) / (nu * v2 * v2 * q)
        }
        else {
          const sd = Math.sqrt(v2)
          // no clear band: ln Φ((ℓc − H)/sd); at the scale's end: ln Φ((H − 80)/sd)
          const sign = k === 2 ? -1 : 1
          const num = k === 2 ? vis[i]! - H : H - BAND_READING_MAX_MM
          const z = num / sd
          nll -= logPhi(z)
          const m = millsRatio(z) // d ln Φ/dz
          dH = -m * (sign / sd)
          dv2 = -m * (-0.5 * z / v2)
        }
        const dHtot = dH + dv2 * 2 * s2 * H // v2 depends on H too
        ga += dHtot * H * gH0[i]!
        gb += dHtot * H * gH1[i]!
        gt += dv2 * 2 * s2 * H * H
      }
      if (hasU[i]) {
        const u = lnU[i]! + gU0[i]! * da + gU1[i]! * db
        const zh = (hi[i]! - u) / sU
        const zl = (lo[i]! - u) / sU
        const pHi = hi[i]! === Number.POSITIVE_INFINITY ? 1 : phi(zh)
        const pLo = lo[i]! === Number.NEGATIVE_INFINITY ? 0 : phi(zl)
        const P = (1 - SPEED_LAPSE) * Math.max(0, pHi - pLo) + SPEED_LAPSE / 3
        nll -= Math.log(P)
        const dHi = hi[i]! === Number.POSITIVE_INFINITY ? 0 : -normalDensity(zh) / sU
        const dLo = lo[i]! === Number.NEGATIVE_INFINITY ? 0 : -normalDensity(zl) / sU
        const du = pHi - pLo > 0 ? (-(1 - SPEED_LAPSE) * (dHi - dLo)) / P : 0
        ga += du * gU0[i]!
        gb += du * gU1[i]!
      }
    }
    const d0 = a - m0[0]
    const d1 = b - m0[1]
    const prior = 0.5 * (P0inv[0][0] * d0 * d0 + 2 * P0inv[0][1] * d0 * d1 + P0inv[1][1] * d1 * d1)
    ga += P0inv[0][0] * d0 + P0inv[0][1] * d1
    gb += P0inv[0][1] * d0 + P0inv[1][1] * d1
    // scaled-inverse-χ²(ν0, s0²) on s², written for t = ln s (Jacobian included): ν0 t + ν0 s0²/(2 s²)
    const scale = hasBand ? nu0 * t + (nu0 * s0 * s0) / (2 * s2) : 0.5 * (t - Math.log(s0)) ** 2
    gt += hasBand ? nu0 - (nu0 * s0 * s0) / s2 : t - Math.log(s0)
    return [nll + prior + scale, ga, gb, gt]
  }
}

const normalDensity = (z: number): number => Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI)

/** d ln Φ(z)/dz = φ(z)/Φ(z), kept finite far in the lower tail (asymptotic −z − 1/z below −8). */
function millsRatio(z: number): number {
  if (z > -8) return normalDensity(z) / Math.max(1e-300, phi(z))
  return -z - 1 / z
}

type Objective = (x: number[]) => [number, number, number, number]

/** Value, analytic gradient and the Hessian by forward differences of the gradient (symmetrised). */
function derivatives(f: Objective, x: number[], h = 1e-5): { g: number[], H: number[][], f0: number } {
  const [f0, ...g] = f(x)
  const n = x.length
  const H = Array.from({ length: n }, () => new Array<number>(n).fill(0))
  for (let j = 0; j < n; j++) {
    const y = [...x]
    y[j]! += h
    const gj = f(y).slice(1)
    for (let i = 0; i < n; i++) H[i]![j] = (gj[i]! - g[i]!) / h
  }
  for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) H[i]![j] = H[j]![i] = 0.5 * (H[i]![j]! + H[j]![i]!)
  return { g, H, f0 }
}

/** Solves A x = b for a small symmetric matrix by Gaussian elimination with partial pivoting (null if singular). */
function solve(A: number[][], b: number[]): number[] | null {
  const n = b.length
  const M = A.map((row, i) => [...row, b[i]!])
  for (let c = 0; c < n; c++) {
    let p = c
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r]![c]!) > Math.abs(M[p]![c]!)) p = r
    if (!(Math.abs(M[p]![c]!) > 1e-12)) return null
    ;[M[c], M[p]] = [M[p]!, M[c]!]
    for (let r = 0; r < n; r++) {
      if (r === c) continue
      const k = M[r]![c]! / M[c]![c]!
      for (let k2 = c; k2 <= n; k2++) M[r]![k2]! -= k * M[c]![k2]!
    }
  }
  return M.map((row, i) => row[n]! / row[i]!)
}

function invert(A: number[][]): number[][] | null {
  const n = A.length
  const cols: number[][] = []
  for (let j = 0; j < n; j++) {
    const e = new Array<number>(n).fill(0)
    e[j] = 1
    const c = solve(A, e)
    if (!c) return null
    cols.push(c)
  }
  return A.map((_, i) => cols.map(c => c[i]!))
}

/** Damped Newton (Levenberg–Marquardt on the Hessian) to the mode of f from x0. */

function findMode(f: Objective, x0: number[]): { x: number[], H: number[][] } {
  let x = [...x0]
  let lambda = 1e-3
  let d = derivatives(f, x)
  for (let it = 0; it < 60; it++) {
    const A = d.H.map((row, i) => row.map((v, j) => v + (i === j ? lambda * Math.max(1, Math.abs(d.H[i]![i]!)) : 0)))
    const step = solve(A, d.g.map(v => -v))
    if (!step) {
      lambda *= 10
      continue
    }
    const cap = Math.max(...step.map(Math.abs))
    const scaled = cap > 1 ? step.map(s => s / cap) : step // no step longer than 1 in ln units
    const y = x.map((v, i) => v + scaled[i]!)
    const fy = f(y)[0]

    if (Number.isFinite(fy) && fy <= d.f0) {
      const small = Math.max(...scaled.map(Math.abs)) < 1e-6 || d.f0 - fy < 1e-10
      x = y
      lambda = Math.max(1e-6, lambda / 4)
      d = derivatives(f, x)
      if (small) break
    }
    else {
      lambda *= 8
      if (lambda > 1e8) break
    }
  }
  return { x, H: d.H }
}

/** Mode and Laplace posterior of (ln f, ln k) for linearised data (the scale s integrated out in the same approximation). */
function posteriorOf(data: Datum[], m0: [number, number], P0: [[number, number], [number, number]], x0: number[]): { x: number[], post: Posterior } {
  const P0inv = invert(P0) as [[number, number], [number, number]]
  const m = findMode(negLogPosterior(data, m0, P0inv), x0)
  const inv = invert(m.H)
  const cov: [[number, number], [number, number]] = inv && inv[0]![0]! > 0 && inv[1]![1]! > 0
    ? [[inv[0]![0]!, inv[0]![1]!], [inv[1]![0]!, inv[1]![1]!]]
    : P0
  const theta: [number, number] = [m.x[0]!, m.x[1]!]
  const hasBand = data.some(d => d.v.band !== null || d.v.noClearBand)
  return { x: m.x, post: { mean: theta, cov, scatter: hasBand ? Math.exp(m.x[2]!) : null, speedScoreZ: speedScore(data, theta) } }
}

interface Fitted { post: Posterior, data: Datum[], x: number[] }

/**
 * The posterior of one glass: mode by damped Newton on the linearised model, relinearised at the mode
 * until it lies within RELINEARISE_LN of the linearisation point — first with each vote carried by its pour's response
 * (cheap), then with every vote's own model run at the mode (exact residuals) — then the Laplace
 * covariance of (ln f, ln k) from the inverse Hessian, the scale s integrated out in the same approximation.
 */
function fitGlass(votes: Vote[], cache: ModelCache, P0: [[number, number], [number, number]]): Fitted | null {
  let theta: [number, number] = [0, 0]
  let x = [0, 0, Math.log(SCATTER_PRIOR.s0)]
  let exact = false
  let fitted: Fitted | null = null
  for (let pass = 0; pass < 8; pass++) {
    const data: Datum[] = []
    for (const v of votes) {
      if (v.band === null && !v.noClearBand && v.speed === null) continue
      const lin = cache.linear(v, theta, exact)
      if (lin && (v.band !== null || v.noClearBand || lin.lnU !== null)) data.push({ v, lin })
    }
    if (!data.length) return null
    const r = posteriorOf(data, [0, 0], P0, x)
    fitted = { post: r.post, data, x: r.x }
    x = r.x
    const same = near(x, data[0]!.lin.theta0)
    theta = [x[0]!, x[1]!]
    if (same && (exact || pass === 0)) break // at θ = 0 the cheap and the exact pass are the same
    if (same) exact = true
  }
  return fitted
}

/**
 * A room's posterior: from its votes' linearisation at the glass's mode, relinearised exactly (every
 * condition's own run) at the room's mode until it lies within RELINEARISE_LN of the linearisation point (at most 4 passes).
 */
function fitRoom(data0: Datum[], cache: ModelCache, m0: [number, number], P0: [[number, number], [number, number]], x0: number[]): Fitted {
  let data = data0
  let x = x0
  let fitted: Fitted | null = null
  for (let pass = 0; pass < 4; pass++) {
    const r = posteriorOf(data, m0, P0, x)
    fitted = { post: r.post, data, x: r.x }
    x = r.x
    if (near(x, data[0]!.lin.theta0, pass === 0 ? ROOM_RELINEARISE_LN : RELINEARISE_LN)) break
    const next: Datum[] = []
    for (const d of data) {
      const l = cache.linear(d.v, [x[0]!, x[1]!], true)
      if (l) next.push({ v: d.v, lin: l })
    }
    if (!next.length) break
    data = next
  }
  return fitted!
}

/**
 * Posterior predictive check of the speed judgements (BDA3 §6.3, from memory): their summed log
 * probability under the fitted model against its expectation and variance if the model were right.
 */
function speedScore(data: Datum[], theta: [number, number]): number | null {
  let obs = 0
  let mean = 0
  let variance = 0
  let n = 0
  for (const { v, lin } of data) {
    if (v.speed === null || lin.lnU === null) continue
    const p = speedProbabilities(lin.lnU + lin.gU[0] * (theta[0] - lin.theta0[0]) + lin.gU[1] * (theta[1] - lin.theta0[1]))
    const lp = p.map(Math.log)
    const e = p.reduce((s, pi, i) => s + pi * lp[i]!, 0)
    const e2 = p.reduce((s, pi, i) => s + pi * lp[i]! * lp[i]!, 0)
    obs += lp[SPEED_ORDER.indexOf(v.speed)]!
    mean += e
    variance += e2 - e * e
    n++
  }
  if (!n) return null
  return variance > 1e-12 ? (obs - mean) / Math.sqrt(variance) : 0
}

const Z80 = 1.2815515655446004 // 90th percentile of the standard normal

function groupResult(glassKey: string, roomKey: string | null, votes: Vote[], fitted: Fitted | null, o: Required<CalibrateOptions>, priorSd: [number, number]): GroupCalibration {
  const mean = fitted?.post.mean ?? [0, 0]
  const cov = fitted?.post.cov ?? [[priorSd[0] ** 2, 0], [0, priorSd[1] ** 2]]
  const sa = Math.sqrt(cov[0][0])
  const sb = Math.sqrt(cov[1][1])
  const used = fitted?.data.map(d => d.v) ?? []
  const scatter = fitted?.post.scatter ?? null
  const speedZ = fitted?.post.speedScoreZ ?? null
  const enough = used.length >= o.minVotes
  const fits = (scatter === null || scatter <= CALIBRATION_THRESHOLDS.maxBandScatter) && (speedZ === null || speedZ >= CALIBRATION_THRESHOLDS.minSpeedScoreZ)
  const status: GroupCalibration['status'] = enough && !fits ? 'does_not_fit' : enough && sa <= o.applySdLn && sb <= o.applySdLn ? 'applied' : 'too_few'
  const interval = (m: number, s: number): [number, number] => [Math.exp(m - Z80 * s), Math.exp(m + Z80 * s)]
  return {
    glassKey, roomKey,
    observations: used.length,
    devices: new Set(used.map(v => v.deviceKey)).size,
    entries: votes.reduce((s, v) => s + v.entries, 0),
    parameters: { exchangeFactor: Math.exp(mean[0]), massTransferFactor: Math.exp(mean[1]) },
    intervals: { exchangeFactor: interval(mean[0], sa), massTransferFactor: interval(mean[1], sb) },
    sdLn: { exchangeFactor: sa, massTransferFactor: sb },
    correlation: sa > 0 && sb > 0 ? cov[0][1] / (sa * sb) : 0,
    fit: { bandScatter: scatter, speedScoreZ: speedZ },
    status,
  }
}

/**
 * Fits every glass, and every glass in a room once that room has CALIBRATION_THRESHOLDS.minRoomVotes votes,
 * from the observations. A room's prior is its glass's posterior from the other rooms (leave that
 * room out, so its votes are not counted twice) widened by CALIBRATION_THRESHOLDS.roomSdLn: partial pooling,
 * a room's deviation shrunk toward its glass (BDA3 ch. 5, from memory).
 */
export function calibrate(observations: FitObservation[], options: CalibrateOptions = {}): CalibrationResult {
  const o: Required<CalibrateOptions> = {
    priorSdLn: options.priorSdLn ?? CALIBRATION_PRIOR_SD_LN,
    applySdLn: options.applySdLn ?? CALIBRATION_THRESHOLDS.applySdLn,
    minVotes: options.minVotes ?? CALIBRATION_THRESHOLDS.minVotes,
    minRoomVotes: options.minRoomVotes ?? CALIBRATION_THRESHOLDS.minRoomVotes,
    roomSdLn: options.roomSdLn ?? CALIBRATION_THRESHOLDS.roomSdLn,
  }
  const priorSd: [number, number] = [o.priorSdLn.exchangeFactor, o.priorSdLn.massTransferFactor]
  const P0: [[number, number], [number, number]] = [[priorSd[0] ** 2, 0], [0, priorSd[1] ** 2]]
  const all = votesOf(observations)
  const cache = new ModelCache(all)
  const byGlass = new Map<string, Vote[]>()
  for (const v of all) {
    const list = byGlass.get(v.glassKey)
    if (list) list.push(v)
    else byGlass.set(v.glassKey, [v])
  }
  const groups: GroupCalibration[] = []
  for (const [glassKey, votes] of [...byGlass].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) {
    const glass = fitGlass(votes, cache, P0)
    groups.push(groupResult(glassKey, null, votes, glass, o, priorSd))
    if (!glass) continue
    // The room level starts from the glass's linearisation at its mode and relinearises at the room's own.
    const byRoom = new Map<string, Datum[]>()
    for (const d of glass.data) byRoom.set(d.v.roomKey, [...(byRoom.get(d.v.roomKey) ?? []), d])
    for (const [roomKey, mine] of [...byRoom].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) {
      // a room's own group means something only against the glass's other rooms
      if (byRoom.size < 2 || mine.length < o.minRoomVotes) continue
      const others = glass.data.filter(d => d.v.roomKey !== roomKey)
      const rest = posteriorOf(others, [0, 0], P0, glass.x).post
      const t2 = o.roomSdLn ** 2
      const c0 = rest.cov
      const roomPrior: [[number, number], [number, number]] = [[c0[0][0] + t2, c0[0][1]], [c0[1][0], c0[1][1] + t2]]
      const r = fitRoom(mine, cache, rest.mean, roomPrior, [rest.mean[0], rest.mean[1], glass.x[2]!])
      const roomVotes = votes.filter(v => v.roomKey === roomKey)
      groups.push(groupResult(glassKey, roomKey, roomVotes, r, o, [Math.sqrt(roomPrior[0][0]), Math.sqrt(roomPrior[1][1])]))
    }
  }
  return { groups, modelRuns: cache.count }
}

/** The calibration a prediction uses for a group, or null unless its status is 'applied'. */
export function appliedCalibration(g: GroupCalibration): AppliedCalibration | null {
  if (g.status !== 'applied') return null
  return { parameters: { ...g.parameters }, sdLn: { ...g.sdLn }, correlation: g.correlation, observations: g.observations }
}
