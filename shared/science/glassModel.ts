/**
 * The glass model end to end: from a pour's lab-sheet numbers to every intermediate quantity and
 * the predictions a guest can check in the glass.
 */
import { DEFAULT_AIR_SPEED_M_S, DEFAULT_WETTED_WALL_M } from './air'
import { FILM_EXCHANGE_FRACTION, type FilmClimb, type FilmFactors, filmClimb } from './climbingFilm'
import { abvFromMassFraction, composition, massFractionFromMoleFraction } from './composition'
import { KELVIN_AT_0C } from './constants'
import { INDEX_REFERENCE, indexFromClimbFlux } from './activityIndex'
import {
  ABV_RANGE_PCT_VOL, AIR_TEMP_RANGE_C, HUMIDITY_RANGE_PCT, SUGAR_RANGE_G_L, TEMP_RANGE_C, WALL_ANGLE_RANGE_DEG, assertInRange,
} from './ranges'
import {
  RANGE_DRAWS, RANGE_SPREADS, type Range, logUniformDraw, normalDraw, rangeOf, seedOf, seededRandom,
} from './uncertainty'
import { viscosityHydroalcoholic_mPa_s, sugarViscosityFactor } from './viscosity'
import { mixtureSigmaUnchecked as mixtureSigma } from './surfaceTension'
import { activityCoefficientsGlass, findAzeotrope, isothermalAzeotropeMoleFraction } from './vle'
import type { AppliedCalibration } from './calibration'

/**
 * Default wall angle, degrees from horizontal: the bowl of a typical tulip-shaped glass leans
 * inward by ~20° from vertical at the liquid line (common practice, no source).
 */
export const DEFAULT_WALL_ANGLE_DEG = 70

/** Default inside diameter of the bowl at the liquid line, mm (a tasting glass, common practice, no source). */
const DEFAULT_BOWL_DIAMETER_MM = 76

/** Default pour, mL (a tasting pour; the pour's own volume is used when known). */
const DEFAULT_POUR_ML = 60

/** The room's air around the glass: a hygrometer's two numbers. */
export interface RoomAir {
  /** Relative humidity of the room air, %, 0–100. */
  relativeHumidityPct: number
  /** Temperature of the room air, °C, 0–40. */
  airTempC: number
}

/**
 * The room assumed when none is given: 50 % relative humidity at 21 °C, the middle of the usual
 * indoor comfort band (about 30–60 % RH, 20–24 °C; ASHRAE Standard 55 — from memory).
 */
export const DEFAULT_ROOM_AIR: RoomAir = { relativeHumidityPct: 50, airTempC: 21 }

/**
 * What kind of drink the glass holds, as far as the film cares: foam, bubbles and surface-active
 * solutes change what a guest sees (docs/science.md, "Kinds of drink").
 */
export const DRINK_KINDS = ['still', 'sparkling', 'fortified', 'spirit', 'cider', 'beer', 'low_alcohol', 'other'] as const
export type DrinkKind = (typeof DRINK_KINDS)[number]

/** What computeFilm needs. */
export interface FilmInputs {
  /** ABV, % vol at 20 °C, 0–100, exactly as on the lab sheet. */
  abvPctVol: number
  /** Liquid temperature in the glass, °C, 0–40. */
  tempC: number
  /** Residual sugar, g/L, 0–400. */
  sugarGL: number
  /** Glass wall angle from horizontal, degrees, 15–90 (default DEFAULT_WALL_ANGLE_DEG = 70). */
  wallAngleDeg?: number
  /** The room's air (default DEFAULT_ROOM_AIR). */
  room?: RoomAir
  /** Kind of drink (default 'still'). */
  kind?: DrinkKind
  /** Inside diameter of the bowl, mm, 30–150 (default DEFAULT_BOWL_DIAMETER_MM). */
  bowlDiameterMm?: number
  /** Volume poured, mL, 5–500 (default DEFAULT_POUR_ML): how fast the pour loses its alcohol. */
  pourVolumeMl?: number
}

/** Why a glass shows no tears although the physics would draw a film. */
export type TearsSuppressedBy = 'foam' | 'held' | null

/** The climbing film's figures a guest's prediction carries as they are (climbingFilm.ts names their units). */
type ClimbFigures = Pick<FilmClimb,
  'capillaryLength_mm' | 'meniscusHeight_mm' | 'clearBandHeight_mm' | 'marangoniStress_Pa' | 'filmThickness_um'
  | 'climbingFilmThickness_um' | 'climbSpeed_mm_s' | 'climbFlux_mm2_s' | 'tearOnset_s' | 'tearFallSpeed_mm_s'
  | 'tearWidth_mm' | 'tearSpacing_mm' | 'tearsAround' | 'swirlShow_s'>

/**
 * What a guest can check in the glass, each central value with its 10th–90th percentile range.
 * The tear figures are null where no tears run.
 */
export interface TearPrediction extends ClimbFigures {
  /** Whether tears run after a swirl. */
  tearsExpected: boolean
  /** Whether a steady clear band stands above the meniscus (else the legs come from the swirl's curtain). */
  bandVisible: boolean
  /** Set when the drink's surface holds still: beer's foam, or a pull below SURFACE_HOLD_MN_M. */
  suppressedBy: TearsSuppressedBy
  /** Share of the pour's alcohol that evaporates from its open surface in 10 minutes, %. */
  alcoholLossPer10Min_pct: number
  /** 10th–90th percentile ranges from the documented uncertainties (null where no tears in most draws). */
  ranges: {
    clearBandHeight_mm: Range | null
    tearOnset_s: Range | null
    tearFallSpeed_mm_s: Range | null
    tearsAround: Range | null
    swirlShow_s: Range | null
    filmThickness_um: Range | null
    filmActivityIndex: Range
  }
}

/** Every quantity the model computes for one pour. Units in the names; fractions are 0–1. */
export interface FilmResult {
  inputs: Required<FilmInputs>
  /** ABV of the water–ethanol solvent once sugar's volume is removed, % vol. */
  solventAbvPctVol: number
  /** True if ABV and sugar were incompatible and the solvent was capped at pure ethanol. */
  solventCapped: boolean
  /** Ethanol mass fraction of the whole drink (sugar included). */
  ethanolMassFraction: number
  /** Ethanol mass fraction of the water–ethanol solvent. */
  solventMassFraction: number
  /** Ethanol mole fraction of the water–ethanol solvent. */
  solventMoleFraction: number
  /** Sugar mass fraction of the drink. */
  sugarMassFraction: number
  /** Ethanol concentration, g/L. */
  ethanol_g_L: number
  /** Density of the drink at tempC, kg/m³. */
  density_kg_m3: number
  /** Density of the water–ethanol solvent at tempC, kg/m³. */
  solventDensity_kg_m3: number
  /** Ethanol activity coefficient in the bulk (glass-temperature NRTL set). */
  activityCoefficientEthanol: number
  /** Water activity coefficient in the bulk (glass-temperature NRTL set). */
  activityCoefficientWater: number
  /** Relative volatility α = γ1P1sat/(γ2P2sat) at the film's temperature. */
  relativeVolatility: number
  /** Ethanol partial pressure over the film, Pa. */
  ethanolPartialPressure_Pa: number
  /** Water partial pressure over the film, Pa. */
  waterPartialPressure_Pa: number
  /** Water vapour partial pressure of the room, Pa. */
  roomWaterPressure_Pa: number
  /** Ethanol mass flux out of the film into the room, kg/(m²·s). */
  ethanolFlux_kg_m2_s: number
  /** Water mass flux out of the film, kg/(m²·s), signed: negative when the film takes water up from the room. */
  waterFlux_kg_m2_s: number
  /** Net mass flux out of the film, kg/(m²·s). */
  totalFlux_kg_m2_s: number
  /** Mass-transfer coefficients of the wetted wall, m/s. */
  massTransferEthanol_m_s: number
  massTransferWater_m_s: number
  /** How much cooler than the liquid the film is at the band's top, K. */
  filmCooling_K: number
  /** Ethanol mole fraction at which α = 1 at tempC (null if none). */
  azeotropeMoleFraction: number | null
  /** ABV of a water–ethanol liquid at that composition, % vol (null if none). */
  azeotropeAbvPctVol: number | null
  /** True if the solvent is at or beyond the azeotrope: evaporation into dry air no longer makes the film more watery. */
  atOrBeyondAzeotrope: boolean
  /** Rate of surface-tension rise per unit film mass, Ṡ, N·kg/(m³·s). */
  solutalDrive: number
  /** Surface tension of the bulk, mN/m. */
  surfaceTensionBulk_mN_m: number
  /** Surface tension of the film at the band's top, mN/m. */
  surfaceTensionFilm_mN_m: number
  /** σ(film) − σ(bulk), mN/m: the solutal and thermal rises together. */
  deltaSigma_mN_m: number
  /** The part from composition, mN/m. */
  solutalDeltaSigma_mN_m: number
  /** The part from evaporative cooling, mN/m. */
  thermalDeltaSigma_mN_m: number
  /** Film activity index, 0–10. */
  filmActivityIndex: number
  /** Uncapped ratio q/q_ref (index = min(10, 10 × this)). */
  filmActivityRelative: number
  /** Viscosity of the drink, mPa·s. */
  viscosity_mPa_s: number
  /** Viscosity of the water–ethanol solvent alone, mPa·s. */
  viscositySolvent_mPa_s: number
  /** Factor by which the sugar multiplies the viscosity. */
  sugarViscosityFactor: number
  /** Predicted film and tears, with ranges. */
  predictions: TearPrediction
  /** Tear fall speed if the liquid had the solvent's viscosity (no sugar), mm/s (null if no tears). */
  tearFallSpeedUnsweetened_mm_s: number | null
  /** The calibration the figures were computed with; null: the published defaults. */
  calibration: AppliedCalibration | null
}

/** One field's problem, for an API route's 400 answer. */
export interface InputIssue {
  field: keyof FilmInputs | 'relativeHumidityPct' | 'airTempC'
  message: string
}

/**
 * Checks computeFilm's number inputs without throwing; returns the issues (empty when valid).
 * Ranges: ranges.ts.
 */
export function validateFilmInputs(input: Partial<Record<'abvPctVol' | 'tempC' | 'sugarGL' | 'wallAngleDeg' | 'relativeHumidityPct' | 'airTempC', unknown>>): InputIssue[] {
  const issues: InputIssue[] = []
  const check = (field: InputIssue['field'] & keyof typeof input, range: { min: number, max: number }, unit: string, optional = false): void => {
    const v = input[field]
    if (v === undefined && optional) return
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      issues.push({ field, message: `${field} must be a number` })
    }
    else if (v < range.min || v > range.max) {
      issues.push({ field, message: `${field} must be between ${range.min} and ${range.max} ${unit}` })
    }
  }
  check('abvPctVol', ABV_RANGE_PCT_VOL, '% vol')
  check('tempC', TEMP_RANGE_C, '°C')
  check('sugarGL', SUGAR_RANGE_G_L, 'g/L')
  check('wallAngleDeg', WALL_ANGLE_RANGE_DEG, '° from horizontal', true)
  check('relativeHumidityPct', HUMIDITY_RANGE_PCT, '%', true)
  check('airTempC', AIR_TEMP_RANGE_C, '°C', true)
  return issues
}

function assertInputs(i: Required<FilmInputs>): void {
  assertInRange('abvPctVol', i.abvPctVol, ABV_RANGE_PCT_VOL.min, ABV_RANGE_PCT_VOL.max, '% vol')
  assertInRange('tempC', i.tempC, TEMP_RANGE_C.min, TEMP_RANGE_C.max, '°C')
  assertInRange('sugarGL', i.sugarGL, SUGAR_RANGE_G_L.min, SUGAR_RANGE_G_L.max, 'g/L')
  assertInRange('wallAngleDeg', i.wallAngleDeg, WALL_ANGLE_RANGE_DEG.min, WALL_ANGLE_RANGE_DEG.max, '° from horizontal')
  assertInRange('relativeHumidityPct', i.room.relativeHumidityPct, HUMIDITY_RANGE_PCT.min, HUMIDITY_RANGE_PCT.max, '%')
  assertInRange('airTempC', i.room.airTempC, AIR_TEMP_RANGE_C.min, AIR_TEMP_RANGE_C.max, '°C')
  assertInRange('bowlDiameterMm', i.bowlDiameterMm, 30, 150, 'mm')
  assertInRange('pourVolumeMl', i.pourVolumeMl, 5, 500, 'mL')
  if (!(DRINK_KINDS as readonly string[]).includes(i.kind)) throw new RangeError(`kind must be one of ${DRINK_KINDS.join(', ')} (got ${String(i.kind)})`)
}

/** The model's azeotrope at 1 atm (DECHEMA NRTL, the boiling-point set), for display next to the handbook value. */
export function modelAzeotropeAt1atm(): { moleFraction: number, massFraction: number, abvPctVol: number, tempC: number } {
  const a = findAzeotrope()
  if (!a) throw new Error('NRTL parameters give no azeotrope at 1 atm') // cannot happen with the published set
  const w = massFractionFromMoleFraction(a.x1)
  return { moleFraction: a.x1, massFraction: w, abvPctVol: abvFromMassFraction(w), tempC: a.tempC }
}

/** Inputs with every default filled in. */
function withDefaults(input: FilmInputs): Required<FilmInputs> {
  return {
    abvPctVol: input.abvPctVol,
    tempC: input.tempC,
    sugarGL: input.sugarGL,
    wallAngleDeg: input.wallAngleDeg ?? DEFAULT_WALL_ANGLE_DEG,
    room: input.room ?? DEFAULT_ROOM_AIR,
    kind: input.kind ?? 'still',
    bowlDiameterMm: input.bowlDiameterMm ?? DEFAULT_BOWL_DIAMETER_MM,
    pourVolumeMl: input.pourVolumeMl ?? DEFAULT_POUR_ML,
  }
}

interface Prepared {
  i: Required<FilmInputs>
  c: ReturnType<typeof composition>
  etaSolvent: number
  sugarFactor: number
}

function prepare(input: FilmInputs): Prepared {
  const i = withDefaults(input)
  assertInputs(i)
  const c = composition(i.abvPctVol, i.tempC, i.sugarGL)
  const etaSolvent = viscosityHydroalcoholic_mPa_s(c.solventMassFraction, i.tempC)
  return { i, c, etaSolvent, sugarFactor: sugarViscosityFactor(c.sugarMassFraction) }
}

/** One run of the film physics for prepared inputs, with optional perturbations. */
function climb(p: Prepared, o: { viscosityFactor?: number, humidityPct?: number, wallAngleDeg?: number, airSpeed_m_s?: number, exchangeFactor?: number, factors?: FilmFactors, noSugarViscosity?: boolean } = {}): FilmClimb {
  const eta = p.etaSolvent * (o.noSugarViscosity ? 1 : p.sugarFactor) * (o.viscosityFactor ?? 1)
  return filmClimb({
    x1: p.c.solventMoleFraction,
    liquidTempC: p.i.tempC,
    sugarMassFraction: p.c.sugarMassFraction,
    density_kg_m3: p.c.density_kg_m3,
    viscosity_mPa_s: eta,
    relativeHumidityPct: o.humidityPct ?? p.i.room.relativeHumidityPct,
    airTempC: p.i.room.airTempC,
    wallAngleDeg: o.wallAngleDeg ?? p.i.wallAngleDeg,
    bowlDiameterMm: p.i.bowlDiameterMm,
    motion: { airSpeed_m_s: o.airSpeed_m_s ?? DEFAULT_AIR_SPEED_M_S, wallHeight_m: DEFAULT_WETTED_WALL_M },
    exchangeFraction: FILM_EXCHANGE_FRACTION * (o.exchangeFactor ?? 1),
    factors: o.factors,
  })
}

/**
 * Smallest surface-tension rise, mN/m, that moves the film against what else sets the surface:
 * - wine, cider and other fermented drinks carry surface-active solutes (proteins, polyphenols,
 *   polysaccharides) that lower their surface tension a few mN/m below a water–ethanol solution of
 *   the same strength (docs/science.md §2, a secondary source) and, adsorbed, resist being swept along;
 *   taken as 1 mN/m (estimate, no source);
 * - distilled spirits carry almost none; 0.2 mN/m stands for the uneven evaporation and draughts
 *   around a glass (estimate, no source).
 * Beer is different in kind: its proteins and hop compounds make a stiff, foaming surface that the
 * film cannot move at all (common practice, no source).
 */
export const SURFACE_HOLD_MN_M: Record<DrinkKind, number> = {
  still: 1, sparkling: 1, fortified: 1, cider: 1, low_alcohol: 1, other: 1, beer: Number.POSITIVE_INFINITY, spirit: 0.2,
}

/** Why this kind of drink in this state shows no tears although a film is drawn (null: nothing holds it). */
function suppression(kind: DrinkKind, rise_mN_m: number, climbs: boolean): TearsSuppressedBy {
  if (kind === 'beer') return 'foam'
  return climbs && rise_mN_m < SURFACE_HOLD_MN_M[kind] ? 'held' : null
}

/** Whether tears run after a swirl: a film climbs and its pull beats what holds the surface. */
function tearsRun(kind: DrinkKind, r: FilmClimb): boolean {
  return r.marangoniStress_Pa > 0 && suppression(kind, r.solutalDeltaSigma_mN_m + r.thermalDeltaSigma_mN_m, true) === null
}

/** The ranges: RANGE_DRAWS runs with the spreads of RANGE_SPREADS, seeded from the inputs. */
function predictionRanges(p: Prepared): TearPrediction['ranges'] {
  const random = seededRandom(seedOf(JSON.stringify(p.i)))
  const s = RANGE_SPREADS
  const band: number[] = []
  const onset: number[] = []
  const fall: number[] = []
  const around: number[] = []
  const show: number[] = []
  const thickness: number[] = []
  const index: number[] = []
  for (let k = 0; k < RANGE_DRAWS; k++) {
    const r = climb(p, {
      factors: {
        henry: Math.exp(s.henrySigmaLn * normalDraw(random)),
        waterDiluteGamma: Math.exp(s.waterGammaSigmaLn * normalDraw(random)),
        sigmaSlope: Math.max(0.5, 1 + s.sigmaSlopeSigma * normalDraw(random)),
        glassConductance: logUniformDraw(random, s.conductanceFactor[0], s.conductanceFactor[1]),
      },
      airSpeed_m_s: logUniformDraw(random, s.airSpeed_m_s[0], s.airSpeed_m_s[1]),
      exchangeFactor: logUniformDraw(random, s.exchangeFactor[0], s.exchangeFactor[1]),
      viscosityFactor: Math.max(0.5, 1 + s.viscositySigma * normalDraw(random)),
      humidityPct: Math.min(100, Math.max(0, p.i.room.relativeHumidityPct + s.humiditySigmaPct * normalDraw(random))),
      wallAngleDeg: Math.min(WALL_ANGLE_RANGE_DEG.max, Math.max(WALL_ANGLE_RANGE_DEG.min, p.i.wallAngleDeg + s.wallAngleSigmaDeg * normalDraw(random))),
    })
    index.push(indexFromClimbFlux(r.climbFlux_mm2_s).index)
    if (!tearsRun(p.i.kind, r)) continue
    band.push(r.clearBandHeight_mm)
    thickness.push(r.filmThickness_um)
    if (r.tearOnset_s !== null) onset.push(r.tearOnset_s)
    if (r.tearFallSpeed_mm_s !== null) fall.push(r.tearFallSpeed_mm_s)
    if (r.tearsAround !== null) around.push(r.tearsAround)
    if (r.swirlShow_s !== null) show.push(r.swirlShow_s)
  }
  return {
    clearBandHeight_mm: rangeOf(band, RANGE_DRAWS),
    tearOnset_s: rangeOf(onset, RANGE_DRAWS),
    tearFallSpeed_mm_s: rangeOf(fall, RANGE_DRAWS),
    tearsAround: rangeOf(around, RANGE_DRAWS),
    swirlShow_s: rangeOf(show, RANGE_DRAWS),
    filmThickness_um: rangeOf(thickness, RANGE_DRAWS),
    filmActivityIndex: rangeOf(index, RANGE_DRAWS)!,
  }
}

/**
 * Share of the pour's alcohol lost from its open surface in 10 minutes, %, at the film's ethanol
 * flux (the liquid surface is at the bulk composition): 600 s · J_E · π D²/4 / (ABV/100 · 789.24 g/L · V).
 */
function alcoholLossPer10Min(p: Prepared, ethanolFlux_kg_m2_s: number): number {
  const ethanolKg = (p.c.ethanol_g_L * p.i.pourVolumeMl * 1e-6)
  if (!(ethanolKg > 0)) return 0
  const area = (Math.PI * (p.i.bowlDiameterMm * 1e-3) ** 2) / 4
  return Math.min(100, (100 * 600 * ethanolFlux_kg_m2_s * area) / ethanolKg)
}

/**
 * Computes the climbing film, the tears, their ranges and every intermediate quantity for one pour.
 * Sources and ranges: see each module (composition, surfaceTension, vle, air, climbingFilm,
 * activityIndex, viscosity, uncertainty). Throws RangeError for inputs outside their ranges.
 * Never returns NaN.
 */
export function computeFilm(input: FilmInputs, options?: { calibration?: AppliedCalibration | null }): FilmResult {
  const p = prepare(input)
  const { i, c } = p
  const x1 = c.solventMoleFraction
  const T_K = i.tempC + KELVIN_AT_0C
  const gam = activityCoefficientsGlass(x1, T_K)
  const r = climb(p)
  const bare = p.sugarFactor > 1 ? climb(p, { noSugarViscosity: true }) : r
  const azeo = isothermalAzeotropeMoleFraction(T_K, 'glass')
  const azeoAbv = azeo === null ? null : abvFromMassFraction(massFractionFromMoleFraction(azeo))
  const rise = r.solutalDeltaSigma_mN_m + r.thermalDeltaSigma_mN_m
  const suppressed = suppression(i.kind, rise, r.marangoniStress_Pa > 0)
  const activity = indexFromClimbFlux(r.climbFlux_mm2_s)
  const tearsExpected = tearsRun(i.kind, r)
  const ex = r.exchange
  const sigmaBulk = mixtureSigma(x1, i.tempC)
  return {
    inputs: i,
    solventAbvPctVol: c.solventAbvPctVol,
    solventCapped: c.solventCapped,
    ethanolMassFraction: c.ethanolMassFraction,
    solventMassFraction: c.solventMassFraction,
    solventMoleFraction: x1,
    sugarMassFraction: c.sugarMassFraction,
    ethanol_g_L: c.ethanol_g_L,
    density_kg_m3: c.density_kg_m3,
    solventDensity_kg_m3: c.solventDensity_kg_m3,
    activityCoefficientEthanol: gam.gamma1,
    activityCoefficientWater: gam.gamma2,
    relativeVolatility: ex.relativeVolatility,
    ethanolPartialPressure_Pa: ex.pEthanol_Pa,
    waterPartialPressure_Pa: ex.pWater_Pa,
    roomWaterPressure_Pa: ex.roomWaterPressure_Pa,
    ethanolFlux_kg_m2_s: ex.ethanolFlux_kg_m2_s,
    waterFlux_kg_m2_s: ex.waterFlux_kg_m2_s,
    totalFlux_kg_m2_s: ex.ethanolFlux_kg_m2_s + ex.waterFlux_kg_m2_s,
    massTransferEthanol_m_s: ex.kEthanol_m_s,
    massTransferWater_m_s: ex.kWater_m_s,
    filmCooling_K: r.clearBandHeight_mm > 0 ? ex.filmCooling_K : 0,
    azeotropeMoleFraction: azeo,
    azeotropeAbvPctVol: azeoAbv,
    atOrBeyondAzeotrope: azeo !== null && x1 >= azeo,
    solutalDrive: r.solutalDrive,
    surfaceTensionBulk_mN_m: sigmaBulk,
    surfaceTensionFilm_mN_m: sigmaBulk + rise,
    deltaSigma_mN_m: rise,
    solutalDeltaSigma_mN_m: r.solutalDeltaSigma_mN_m,
    thermalDeltaSigma_mN_m: r.thermalDeltaSigma_mN_m,
    filmActivityIndex: activity.index,
    filmActivityRelative: activity.relative,
    viscosity_mPa_s: p.etaSolvent * p.sugarFactor,
    viscositySolvent_mPa_s: p.etaSolvent,
    sugarViscosityFactor: p.sugarFactor,
    predictions: {
      tearsExpected,
      bandVisible: tearsExpected && r.bandVisible,
      suppressedBy: suppressed,
      capillaryLength_mm: r.capillaryLength_mm,
      meniscusHeight_mm: r.meniscusHeight_mm,
      clearBandHeight_mm: r.clearBandHeight_mm,
      marangoniStress_Pa: r.marangoniStress_Pa,
      filmThickness_um: r.filmThickness_um,
      climbingFilmThickness_um: r.climbingFilmThickness_um,
      climbSpeed_mm_s: r.climbSpeed_mm_s,
      climbFlux_mm2_s: r.climbFlux_mm2_s,
      tearOnset_s: tearsExpected ? r.tearOnset_s : null,
      tearFallSpeed_mm_s: tearsExpected ? r.tearFallSpeed_mm_s : null,
      tearWidth_mm: tearsExpected ? r.tearWidth_mm : null,
      tearSpacing_mm: tearsExpected ? r.tearSpacing_mm : null,
      tearsAround: tearsExpected ? r.tearsAround : null,
      swirlShow_s: tearsExpected ? r.swirlShow_s : null,
      alcoholLossPer10Min_pct: alcoholLossPer10Min(p, ex.ethanolFlux_kg_m2_s),
      ranges: predictionRanges(p),
    },
    tearFallSpeedUnsweetened_mm_s: tearsExpected && tearsRun(i.kind, bare) ? bare.tearFallSpeed_mm_s : null,
    calibration: options?.calibration ?? null,
  }
}

/** One point of the ABV curve. */
export interface CurvePoint {
  /** ABV, % vol at 20 °C. */
  abvPctVol: number
  /** Surface tension of the bulk, mN/m. */
  surfaceTensionBulk_mN_m: number
  /** Surface tension of the film at the band's top, mN/m. */
  surfaceTensionFilm_mN_m: number
  /** σ(film) − σ(bulk), mN/m. */
  deltaSigma_mN_m: number
  /** Climbing flux, mm²/s. */
  climbFlux_mm2_s: number
  /** Film activity index, 0–10. */
  filmActivityIndex: number
}

/** Options of computeCurve. */
export interface CurveInputs {
  /** Liquid temperature, °C, 0–40. */
  tempC: number
  /** Residual sugar, g/L, 0–400. */
  sugarGL: number
  /** The room (default DEFAULT_ROOM_AIR). */
  room?: RoomAir
  /** Wall angle (default DEFAULT_WALL_ANGLE_DEG). */
  wallAngleDeg?: number
  /** Number of evenly spaced ABV points from 0 to 100 % vol, 2–401 (default 101). */
  points?: number
}

/** Largest number of points computeCurve accepts. */
export const CURVE_POINTS_MAX = 401

/**
 * Surface tension (bulk and film), climbing flux and film activity index over 0–100 % vol at one
 * temperature, sugar level and room, for charts (central values; no ranges). Same sources as computeFilm.
 */
export function computeCurve(input: CurveInputs): CurvePoint[] {
  const points = input.points ?? 101
  assertInRange('points', points, 2, CURVE_POINTS_MAX, 'points')
  if (!Number.isInteger(points)) throw new RangeError(`points must be an integer (got ${points})`)
  const out: CurvePoint[] = []
  for (let k = 0; k < points; k++) {
    const abv = (100 * k) / (points - 1)
    const p = prepare({ abvPctVol: abv, tempC: input.tempC, sugarGL: input.sugarGL, room: input.room, wallAngleDeg: input.wallAngleDeg })
    const r = climb(p)
    const bulk = mixtureSigma(p.c.solventMoleFraction, input.tempC)
    const rise = r.solutalDeltaSigma_mN_m + r.thermalDeltaSigma_mN_m
    out.push({
      abvPctVol: abv,
      surfaceTensionBulk_mN_m: bulk,
      surfaceTensionFilm_mN_m: bulk + rise,
      deltaSigma_mN_m: rise,
      climbFlux_mm2_s: r.climbFlux_mm2_s,
      filmActivityIndex: indexFromClimbFlux(r.climbFlux_mm2_s).index,
    })
  }
  return out
}

/** The central film physics of a pour without ranges (for comparisons in the guest texts). */
export function centralClimb(input: FilmInputs): FilmClimb {
  return climb(prepare(input))
}

/**
 * Film activity index, 0–10, of a drink (ABV % vol, °C, sugar g/L) in the default room and glass.
 * Throws RangeError outside the model's ranges.
 */
export function filmActivityIndex(abvPctVol: number, tempC: number, sugarGL = 0, room: RoomAir = DEFAULT_ROOM_AIR): number {
  return indexFromClimbFlux(climb(prepare({ abvPctVol, tempC, sugarGL, room })).climbFlux_mm2_s).index
}

/**
 * Recomputes the index's anchor (INDEX_REFERENCE): the largest climbing flux over 0–100 % vol at
 * 20 °C, no sugar, default room and glass, by a 1 % vol scan and golden-section refinement.
 */
export function findIndexReference(): { climbFlux_mm2_s: number, abvPctVol: number } {
  const q = (abv: number): number => climb(prepare({ abvPctVol: abv, tempC: INDEX_REFERENCE.tempC, sugarGL: 0 })).climbFlux_mm2_s
  let best = 0
  for (let a = 1; a <= 100; a++) if (q(a) > q(best)) best = a
  let lo = Math.max(0, best - 1)
  let hi = Math.min(100, best + 1)
  const g = (Math.sqrt(5) - 1) / 2
  while (hi - lo > 1e-4) {
    const m1 = hi - g * (hi - lo)
    const m2 = lo + g * (hi - lo)
    if (q(m1) < q(m2)) lo = m1
    else hi = m2
  }
  const abv = 0.5 * (lo + hi)
  return { climbFlux_mm2_s: q(abv), abvPctVol: abv }
}
