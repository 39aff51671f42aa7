/**
 * The glass model end to end: from a pour's lab-sheet numbers to every intermediate quantity and
 * the predictions a guest can check in the glass.
 */
import { abvFromMassFraction, composition, massFractionFromMoleFraction } from './composition'
import { KELVIN_AT_0C } from './constants'
import { FILM_MASS_LOSS_FRACTION, evaporationFlux } from './film'
import { filmActivityFromMoleFraction } from './activityIndex'
import { DEFAULT_WALL_ANGLE_DEG, type TearPrediction, predictTears } from './predictions'
import {
  ABV_RANGE_PCT_VOL, SUGAR_RANGE_G_L, TEMP_RANGE_C, WALL_ANGLE_RANGE_DEG, assertInRange,
} from './ranges'
import { viscosityHydroalcoholic_mPa_s, sugarViscosityFactor } from './viscosity'
import { activityCoefficientsNrtl, findAzeotrope, isothermalAzeotropeMoleFraction } from './vle'

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
  /** The room's air (default DEFAULT_ROOM_AIR). */
  room?: RoomAir
  /** Kind of drink (default 'still'). */
  kind?: DrinkKind
  /** ABV, % vol at 20 °C, 0–100. */
  abvPctVol: number
  /** Liquid temperature in the glass, °C, 0–40. */
  tempC: number
  /** Residual sugar, g/L, 0–400. */
  sugarGL: number
  /** Glass wall angle from horizontal, degrees, 15–90 (default DEFAULT_WALL_ANGLE_DEG = 70). */
  wallAngleDeg?: number
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
  /** Ethanol activity coefficient in the bulk (NRTL). */
  activityCoefficientEthanol: number
  /** Water activity coefficient in the bulk (NRTL). */
  activityCoefficientWater: number
  /** Relative volatility α = γ1P1sat/(γ2P2sat) at tempC. */
  relativeVolatility: number
  /** Ethanol mole fraction of the vapour leaving the bulk. */
  vapourMoleFraction: number
  /** Ethanol partial pressure over the bulk, Pa. */
  ethanolPartialPressure_Pa: number
  /** Water partial pressure over the bulk, Pa. */
  waterPartialPressure_Pa: number
  /** Ethanol evaporation flux into dry still air, kg/(m²·s). */
  ethanolFlux_kg_m2_s: number
  /** Total evaporation flux into dry still air, kg/(m²·s). */
  totalFlux_kg_m2_s: number
  /** Ethanol mole fraction at which α = 1 at tempC (null if none). */
  azeotropeMoleFraction: number | null
  /** ABV of a water–ethanol liquid at that composition, % vol (null if none). */
  azeotropeAbvPctVol: number | null
  /** True if the solvent is at or beyond the azeotrope: evaporation no longer enriches the film in water. */
  atOrBeyondAzeotrope: boolean
  /** Evaporated fraction of the film's volatile mass assumed at the top of the band. */
  filmMassLossFraction: number
  /** The same loss counted in moles. */
  filmMoleLossFraction: number
  /** Ethanol mole fraction of the evaporated film. */
  filmMoleFraction: number
  /** Ethanol mass fraction of the evaporated film's solvent. */
  filmMassFraction: number
  /** Surface tension of the bulk, mN/m. */
  surfaceTensionBulk_mN_m: number
  /** Surface tension of the evaporated film, mN/m. */
  surfaceTensionFilm_mN_m: number
  /** Marangoni driving force σ(film) − σ(bulk), mN/m. */
  deltaSigma_mN_m: number
  /** Film activity index, 0–10. */
  filmActivityIndex: number
  /** Uncapped ratio D/D_ref of the index drive (index = min(10, 10 × this); 1 = the 20 °C maximum). */
  filmActivityRelative: number
  /** Viscosity of the drink, mPa·s. */
  viscosity_mPa_s: number
  /** Viscosity of the water–ethanol solvent alone, mPa·s. */
  viscositySolvent_mPa_s: number
  /** Factor by which the sugar multiplies the viscosity. */
  sugarViscosityFactor: number
  /** Predicted film and tears. */
  predictions: TearPrediction
  /** Tear fall speed if the liquid had the solvent's viscosity (no sugar), mm/s (null if no tears). */
  tearFallSpeedUnsweetened_mm_s: number | null
}

/** One field's problem, for an API route's 400 answer. */
export interface InputIssue {
  field: keyof FilmInputs
  message: string
}

/**
 * Checks computeFilm's inputs without throwing; returns the issues (empty when valid).
 * Ranges: ABV_RANGE_PCT_VOL, TEMP_RANGE_C, SUGAR_RANGE_G_L, WALL_ANGLE_RANGE_DEG (ranges.ts).
 */
export function validateFilmInputs(input: Partial<Record<keyof FilmInputs, unknown>>): InputIssue[] {
  const issues: InputIssue[] = []
  const check = (field: keyof FilmInputs, range: { min: number, max: number }, unit: string, optional = false): void => {
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
  return issues
}

function assertInputs(abvPctVol: number, tempC: number, sugarGL: number): void {
  assertInRange('abvPctVol', abvPctVol, ABV_RANGE_PCT_VOL.min, ABV_RANGE_PCT_VOL.max, '% vol')
  assertInRange('tempC', tempC, TEMP_RANGE_C.min, TEMP_RANGE_C.max, '°C')
  assertInRange('sugarGL', sugarGL, SUGAR_RANGE_G_L.min, SUGAR_RANGE_G_L.max, 'g/L')
}

/** The model's azeotrope at 1 atm (NRTL), for display next to the handbook value. */
export function modelAzeotropeAt1atm(): { moleFraction: number, massFraction: number, abvPctVol: number, tempC: number } {
  const a = findAzeotrope()
  if (!a) throw new Error('NRTL parameters give no azeotrope at 1 atm') // cannot happen with the published set
  const w = massFractionFromMoleFraction(a.x1)
  return { moleFraction: a.x1, massFraction: w, abvPctVol: abvFromMassFraction(w), tempC: a.tempC }
}

/**
 * Computes the climbing film, the tears and every intermediate quantity for one pour.
 * Sources and ranges: see each module (composition, surfaceTension, vle, film, activityIndex,
 * viscosity, predictions). Throws RangeError for inputs outside ABV 0–100 % vol, 0–40 °C,
 * sugar 0–400 g/L, wall 15–90° from horizontal. Never returns NaN.
 */
export function computeFilm(input: FilmInputs): FilmResult {
  const { abvPctVol, tempC, sugarGL } = input
  const wallAngleDeg = input.wallAngleDeg ?? DEFAULT_WALL_ANGLE_DEG
  assertInputs(abvPctVol, tempC, sugarGL)
  assertInRange('wallAngleDeg', wallAngleDeg, WALL_ANGLE_RANGE_DEG.min, WALL_ANGLE_RANGE_DEG.max, '° from horizontal')

  const c = composition(abvPctVol, tempC, sugarGL)
  const x1 = c.solventMoleFraction
  const T_K = tempC + KELVIN_AT_0C
  const gam = activityCoefficientsNrtl(x1, T_K)
  const flux = evaporationFlux(x1, tempC)
  const activity = filmActivityFromMoleFraction(x1, tempC)
  const { film, surfaceTensionBulk_mN_m: sigmaBulk, surfaceTensionFilm_mN_m: sigmaFilm } = activity
  const azeo = isothermalAzeotropeMoleFraction(T_K)
  const azeoAbv = azeo === null ? null : abvFromMassFraction(massFractionFromMoleFraction(azeo))
  const etaSolvent = viscosityHydroalcoholic_mPa_s(c.solventMassFraction, tempC)
  const sugarFactor = sugarViscosityFactor(c.sugarMassFraction)
  const eta = etaSolvent * sugarFactor

  const physics = {
    deltaSigma_mN_m: sigmaFilm - sigmaBulk,
    surfaceTension_mN_m: sigmaBulk,
    density_kg_m3: c.density_kg_m3,
    evaporationFlux_kg_m2_s: flux.total_kg_m2_s,
    wallAngleDeg,
    massLossFraction: FILM_MASS_LOSS_FRACTION,
  }
  const predictions = predictTears({ ...physics, viscosity_mPa_s: eta })
  const unsweetened = predictTears({ ...physics, viscosity_mPa_s: etaSolvent })

  return {
    inputs: { abvPctVol, tempC, sugarGL, wallAngleDeg, room: input.room ?? DEFAULT_ROOM_AIR, kind: input.kind ?? 'still' },
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
    relativeVolatility: flux.relativeVolatility,
    vapourMoleFraction: flux.y1,
    ethanolPartialPressure_Pa: flux.pEthanol_Pa,
    waterPartialPressure_Pa: flux.pWater_Pa,
    ethanolFlux_kg_m2_s: flux.ethanol_kg_m2_s,
    totalFlux_kg_m2_s: flux.total_kg_m2_s,
    azeotropeMoleFraction: azeo,
    azeotropeAbvPctVol: azeoAbv,
    atOrBeyondAzeotrope: azeo !== null && x1 >= azeo,
    filmMassLossFraction: film.massLossFraction,
    filmMoleLossFraction: film.moleLossFraction,
    filmMoleFraction: film.x1Film,
    filmMassFraction: film.massFractionFilm,
    surfaceTensionBulk_mN_m: sigmaBulk,
    surfaceTensionFilm_mN_m: sigmaFilm,
    deltaSigma_mN_m: sigmaFilm - sigmaBulk,
    filmActivityIndex: activity.index,
    filmActivityRelative: activity.relative,
    viscosity_mPa_s: eta,
    viscositySolvent_mPa_s: etaSolvent,
    sugarViscosityFactor: sugarFactor,
    predictions,
    tearFallSpeedUnsweetened_mm_s: unsweetened.tearFallSpeed_mm_s,
  }
}

/** One point of the ABV curve. */
export interface CurvePoint {
  /** ABV, % vol at 20 °C. */
  abvPctVol: number
  /** Surface tension of the bulk, mN/m. */
  surfaceTensionBulk_mN_m: number
  /** Surface tension of the evaporated film, mN/m. */
  surfaceTensionFilm_mN_m: number
  /** σ(film) − σ(bulk), mN/m. */
  deltaSigma_mN_m: number
  /** Film activity index, 0–10. */
  filmActivityIndex: number
}

/** Options of computeCurve. */
export interface CurveInputs {
  /** Liquid temperature, °C, 0–40. */
  tempC: number
  /** Residual sugar, g/L, 0–400. */
  sugarGL: number
  /** Number of evenly spaced ABV points from 0 to 100 % vol, 2–2001 (default 201). */
  points?: number
}

/**
 * Surface tension (bulk and film) and film activity index over 0–100 % vol at one temperature and
 * sugar level, for charts. Same sources and ranges as computeFilm.
 */
export function computeCurve(input: CurveInputs): CurvePoint[] {
  const { tempC, sugarGL } = input
  const points = input.points ?? 201
  assertInRange('tempC', tempC, TEMP_RANGE_C.min, TEMP_RANGE_C.max, '°C')
  assertInRange('sugarGL', sugarGL, SUGAR_RANGE_G_L.min, SUGAR_RANGE_G_L.max, 'g/L')
  assertInRange('points', points, 2, 2001, 'points')
  if (!Number.isInteger(points)) throw new RangeError(`points must be an integer (got ${points})`)
  const out: CurvePoint[] = []
  for (let i = 0; i < points; i++) {
    const abv = (100 * i) / (points - 1)
    const c = composition(abv, tempC, sugarGL)
    const x1 = c.solventMoleFraction
    const activity = filmActivityFromMoleFraction(x1, tempC)
    out.push({
      abvPctVol: abv,
      surfaceTensionBulk_mN_m: activity.surfaceTensionBulk_mN_m,
      surfaceTensionFilm_mN_m: activity.surfaceTensionFilm_mN_m,
      deltaSigma_mN_m: activity.deltaSigma_mN_m,
      filmActivityIndex: activity.index,
    })
  }
  return out
}
