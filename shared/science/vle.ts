/**
 * Vapour–liquid equilibrium of ethanol (1) + water (2): Antoine vapour pressures, NRTL and Wilson
 * activity coefficients, modified Raoult's law, bubble points and the azeotrope.
 *
 * Conventions: `x1` / `y1` are ethanol mole fractions (0–1) in liquid / vapour; temperatures in K
 * where the name says `_K`, pressures in Pa.
 */
import { GAS_CONSTANT_CAL_MOL_K, KELVIN_AT_0C, STANDARD_ATMOSPHERE_PA } from './constants'
import { assertInRange } from './ranges'

/** Antoine constants, log10(P/Pa) = A − B/(T/K + C). Poling, Prausnitz & O'Connell, 5th ed. */
const ANTOINE_ETHANOL = { A: 10.33675, B: 1648.22, C: -42.232, minT_K: 276.5, maxT_K: 369.5 } as const
/** Antoine constants for water, Poling, Prausnitz & O'Connell, 5th ed. */
const ANTOINE_WATER = { A: 10.11564, B: 1687.537, C: -42.98, minT_K: 273.2, maxT_K: 473.2 } as const

/**
 * Lowest temperature at which the model evaluates the Antoine equations, K. Ethanol's published
 * range starts at 276.5 K; 273.15–276.5 K is a 3.35 K extrapolation (0 °C → 1.58 kPa, vs ~1.6 kPa
 * in handbook tables, from memory).
 */
const ANTOINE_MODEL_MIN_T_K = KELVIN_AT_0C

/**
 * Upper end of the bubble-point search, K: just above water's normal boiling point, so the
 * water-rich end (x1 → 0) can be solved at 1 atm. Above 369.5 K the ethanol Antoine constants are
 * extrapolated by at most 4 K, where the ethanol term is small (x1 < ~0.03).
 */
const BUBBLE_POINT_MAX_T_K = 373.5

/** NRTL parameters for ethanol (1) + water (2), DECHEMA set as distributed with ChemSep. cal/mol. */
const NRTL_ETHANOL_WATER = { A12_cal_mol: -57.9601, A21_cal_mol: 1241.7396, alpha12: 0.2937 } as const

/** Wilson parameters, ChemSep set: Λij = exp(aij + bij/T). */
const WILSON_ETHANOL_WATER = { a12: -1.17693, b12_K: -192.381, a21: 1.17693, b21_K: -480.801 } as const

export type ActivityModel = 'nrtl' | 'wilson'

export interface ActivityCoefficients {
  gamma1: number
  gamma2: number
}

function checkT(T_K: number, maxT_K: number): void {
  assertInRange('T_K', T_K, ANTOINE_MODEL_MIN_T_K, maxT_K, 'K')
}

/**
 * Saturation pressure of ethanol, Pa. Antoine, Poling et al. 5th ed.; valid 276.5–369.5 K
 * (accepted from 273.15 K, see ANTOINE_MODEL_MIN_T_K).
 */
export function saturationPressureEthanol_Pa(T_K: number): number {
  checkT(T_K, ANTOINE_ETHANOL.maxT_K)
  return 10 ** (ANTOINE_ETHANOL.A - ANTOINE_ETHANOL.B / (T_K + ANTOINE_ETHANOL.C))
}

/** Saturation pressure of water, Pa. Antoine, Poling et al. 5th ed.; valid 273.2–473.2 K (accepted from 273.15 K). */
export function saturationPressureWater_Pa(T_K: number): number {
  checkT(T_K, ANTOINE_WATER.maxT_K)
  return 10 ** (ANTOINE_WATER.A - ANTOINE_WATER.B / (T_K + ANTOINE_WATER.C))
}

/**
 * Activity coefficients from NRTL (Renon & Prausnitz 1968) with the DECHEMA parameters above:
 * τ12 = A12/(RT), τ21 = A21/(RT), G = exp(−α τ).
 * Valid for the data the set was regressed on (isobaric VLE around 1 atm, ~351–373 K); used here
 * down to 273 K as well, an extrapolation documented in docs/science.md.
 */
export function activityCoefficientsNrtl(x1: number, T_K: number): ActivityCoefficients {
  assertInRange('x1', x1, 0, 1, '(mole fraction)')
  assertInRange('T_K', T_K, 200, 500, 'K')
  return nrtl(x1, T_K)
}

function nrtl(x1: number, T_K: number): ActivityCoefficients {
  const x2 = 1 - x1
  const RT = GAS_CONSTANT_CAL_MOL_K * T_K
  const t12 = NRTL_ETHANOL_WATER.A12_cal_mol / RT
  const t21 = NRTL_ETHANOL_WATER.A21_cal_mol / RT
  const G12 = Math.exp(-NRTL_ETHANOL_WATER.alpha12 * t12)
  const G21 = Math.exp(-NRTL_ETHANOL_WATER.alpha12 * t21)
  const d1 = x1 + x2 * G21
  const d2 = x2 + x1 * G12
  const lng1 = x2 * x2 * (t21 * (G21 / d1) ** 2 + (t12 * G12) / (d2 * d2))
  const lng2 = x1 * x1 * (t12 * (G12 / d2) ** 2 + (t21 * G21) / (d1 * d1))
  return { gamma1: Math.exp(lng1), gamma2: Math.exp(lng2) }
}

/**
 * Activity coefficients from Wilson (1964) with the ChemSep parameters above, Λij = exp(aij + bij/T).
 * Valid as for NRTL; used as an independent cross-check.
 */
export function activityCoefficientsWilson(x1: number, T_K: number): ActivityCoefficients {
  assertInRange('x1', x1, 0, 1, '(mole fraction)')
  assertInRange('T_K', T_K, 200, 500, 'K')
  return wilson(x1, T_K)
}

function wilson(x1: number, T_K: number): ActivityCoefficients {
  const x2 = 1 - x1
  const L12 = Math.exp(WILSON_ETHANOL_WATER.a12 + WILSON_ETHANOL_WATER.b12_K / T_K)
  const L21 = Math.exp(WILSON_ETHANOL_WATER.a21 + WILSON_ETHANOL_WATER.b21_K / T_K)
  const s1 = x1 + L12 * x2
  const s2 = x2 + L21 * x1
  const common = L12 / s1 - L21 / s2
  return { gamma1: Math.exp(-Math.log(s1) + x2 * common), gamma2: Math.exp(-Math.log(s2) - x1 * common) }
}

function gammas(x1: number, T_K: number, model: ActivityModel): ActivityCoefficients {
  return model === 'wilson' ? wilson(x1, T_K) : nrtl(x1, T_K)
}

/** Partial pressures over a liquid and the equilibrium vapour composition. */
export interface VapourState {
  /** Ethanol partial pressure x1 γ1 P1sat, Pa. */
  pEthanol_Pa: number
  /** Water partial pressure x2 γ2 P2sat, Pa. */
  pWater_Pa: number
  /** Total (bubble) pressure, Pa. */
  total_Pa: number
  /** Ethanol mole fraction of the equilibrium vapour, 0–1. */
  y1: number
  /** Relative volatility α12 = γ1 P1sat / (γ2 P2sat), dimensionless. */
  relativeVolatility: number
}

/**
 * Modified Raoult's law, y_i P = x_i γ_i P_i^sat, at liquid temperature T.
 * Sources: Antoine (Poling et al.) and NRTL/Wilson above. Valid 273.15–369.5 K.
 */
export function vapourState(x1: number, T_K: number, model: ActivityModel = 'nrtl'): VapourState {
  assertInRange('x1', x1, 0, 1, '(mole fraction)')
  checkT(T_K, ANTOINE_ETHANOL.maxT_K)
  return vapourStateUnchecked(x1, T_K, model)
}

/** Saturation pressures and γ without range checks, for inner loops (callers check once). */
export function vapourStateUnchecked(x1: number, T_K: number, model: ActivityModel = 'nrtl'): VapourState {
  const p1s = 10 ** (ANTOINE_ETHANOL.A - ANTOINE_ETHANOL.B / (T_K + ANTOINE_ETHANOL.C))
  const p2s = 10 ** (ANTOINE_WATER.A - ANTOINE_WATER.B / (T_K + ANTOINE_WATER.C))
  const { gamma1, gamma2 } = gammas(x1, T_K, model)
  const pE = x1 * gamma1 * p1s
  const pW = (1 - x1) * gamma2 * p2s
  const total = pE + pW
  return {
    pEthanol_Pa: pE,
    pWater_Pa: pW,
    total_Pa: total,
    y1: pE / total,
    relativeVolatility: (gamma1 * p1s) / (gamma2 * p2s),
  }
}

/**
 * Bubble-point temperature, K, of a liquid of ethanol mole fraction x1 at pressure P (Pa):
 * solves Σ x_i γ_i(T) P_i^sat(T) = P by bisection (total pressure rises with T), to 1e-9 K.
 * Valid where the bubble point lies in 273.15–373.5 K (see BUBBLE_POINT_MAX_T_K), i.e. P from
 * about 0.6 kPa to 1 atm over the whole composition range.
 */
export function bubblePointTemperature_K(x1: number, P_Pa: number = STANDARD_ATMOSPHERE_PA, model: ActivityModel = 'nrtl'): number {
  assertInRange('x1', x1, 0, 1, '(mole fraction)')
  let lo: number = ANTOINE_MODEL_MIN_T_K
  let hi: number = BUBBLE_POINT_MAX_T_K
  const f = (T: number): number => vapourStateUnchecked(x1, T, model).total_Pa - P_Pa
  if (f(lo) > 0 || f(hi) < 0) {
    throw new RangeError(`bubble point for x1=${x1} at ${P_Pa} Pa lies outside ${lo}–${hi} K`)
  }
  while (hi - lo > 1e-9) {
    const mid = 0.5 * (lo + hi)
    if (f(mid) > 0) hi = mid
    else lo = mid
  }
  return 0.5 * (lo + hi)
}

/** An azeotrope found by the model. */
export interface Azeotrope {
  /** Ethanol mole fraction, 0–1. */
  x1: number
  /** Boiling temperature, K. */
  T_K: number
  /** Boiling temperature, °C. */
  tempC: number
}

/**
 * Ethanol–water azeotrope at pressure P (Pa): the x1 in [0.5, 0.9999] where y1 = x1 at the bubble
 * point, by bisection on y1 − x1 (to 1e-9). Returns null if the model has no azeotrope there (as
 * happens at low pressures). Valid 1 atm ± a few tens of kPa with these parameters.
 */
export function findAzeotrope(P_Pa: number = STANDARD_ATMOSPHERE_PA, model: ActivityModel = 'nrtl'): Azeotrope | null {
  const g = (x: number): number => {
    const T = bubblePointTemperature_K(x, P_Pa, model)
    return vapourStateUnchecked(x, T, model).y1 - x
  }
  let lo = 0.5
  let hi = 0.9999
  if (!(g(lo) > 0 && g(hi) < 0)) return null
  while (hi - lo > 1e-9) {
    const mid = 0.5 * (lo + hi)
    if (g(mid) > 0) lo = mid
    else hi = mid
  }
  const x1 = 0.5 * (lo + hi)
  const T_K = bubblePointTemperature_K(x1, P_Pa, model)
  return { x1, T_K, tempC: T_K - KELVIN_AT_0C }
}

/**
 * Composition (ethanol mole fraction) at which the relative volatility α = γ1P1sat/(γ2P2sat) equals 1
 * at liquid temperature T — where open-air evaporation stops changing the liquid's composition.
 * Bisection on α − 1 over x1 in [0.5, 1]; null if α > 1 throughout (no azeotrope at that
 * temperature). With the DECHEMA NRTL set this stays near x1 ≈ 0.89 from 0 to 40 °C; measured
 * isothermal data suggest the real azeotrope disappears below roughly 30 °C (from memory), where α
 * is then barely above 1 — either way evaporation hardly changes the film's composition there.
 * Valid 273.15–369.5 K.
 */
export function isothermalAzeotropeMoleFraction(T_K: number, model: ActivityModel = 'nrtl'): number | null {
  checkT(T_K, ANTOINE_ETHANOL.maxT_K)
  const g = (x: number): number => vapourStateUnchecked(x, T_K, model).relativeVolatility - 1
  let lo = 0.5
  let hi = 1
  if (!(g(lo) > 0 && g(hi) < 0)) return null
  while (hi - lo > 1e-10) {
    const mid = 0.5 * (lo + hi)
    if (g(mid) > 0) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}
