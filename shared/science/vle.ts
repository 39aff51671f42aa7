/**
 * Vapour–liquid equilibrium of ethanol (1) + water (2): Antoine vapour pressures, NRTL and Wilson
 * activity coefficients, modified Raoult's law, bubble points and the azeotrope.
 *
 * Conventions: `x1` / `y1` are ethanol mole fractions (0–1) in liquid / vapour; temperatures in K
 * where the name says `_K`, pressures in Pa.
 */
import { GAS_CONSTANT_CAL_MOL_K, GAS_CONSTANT_J_MOL_K, KELVIN_AT_0C, STANDARD_ATMOSPHERE_PA } from './constants'
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

/**
 * 'nrtl': the DECHEMA set, regressed on boiling data near 1 atm (bubble points, the azeotrope).
 * 'glass': NRTL refitted at each temperature to dilute-solution data valid at 0–40 °C
 * (activityCoefficientsGlass below) — the set every glass-temperature computation uses.
 * 'wilson': the ChemSep Wilson set, an independent 1 atm cross-check.
 */
export type ActivityModel = 'nrtl' | 'glass' | 'wilson'

/**
 * Henry's-law solubility of ethanol in water at 298.15 K, Hcp = 1.9 mol/(m³·Pa), and its
 * temperature dependence d ln Hcp / d(1/T) = 6400 K: the recommended literature-review values in
 * Sander, "Compilation of Henry's law constants (version 4.0) for water as solvent", Atmos. Chem.
 * Phys. 15, 4399 (2015), entry for ethanol (CAS 64-17-5), citing Sander et al. (2011); the
 * compilation's reviews and measurements lie at 1.7–2.0 mol/(m³·Pa) and 5700–6600 K.
 */
const HENRY_ETHANOL_WATER = { Hcp298_mol_m3_Pa: 1.9, dlnH_dInvT_K: 6400, spreadRelative: 0.08 } as const

/** Density of liquid water, kg/m³, from the Kell-type cubic through 0, 20 and 40 °C (999.84, 998.21, 992.22; IAPWS-95 — from memory). */
function waterDensity_kg_m3(tempC: number): number {
  return 999.84 + tempC * (0.0171 + tempC * (-0.006085 + tempC * 0.0000297))
}

/**
 * Infinite-dilution activity coefficient of ethanol in water from Henry's law: the Henry
 * volatility K = p/x = c_w / Hcp (c_w = molar concentration of water) divided by ethanol's vapour
 * pressure, γ1∞ = K / P1sat. Sander (2015) and Antoine (Poling et al.). At 25 °C: γ1∞ ≈ 3.7; it
 * rises with temperature (≈ 2.6 at 0 °C, 4.5 at 40 °C), as the exothermic mixing of dilute
 * ethanol with water requires. Valid 273.15–313.15 K (the Henry data's range).
 */
export function ethanolDiluteGammaFromHenry(T_K: number): number {
  assertInRange('T_K', T_K, ANTOINE_MODEL_MIN_T_K, 313.15, 'K')
  return henryGamma(T_K, 1)
}

function henryGamma(T_K: number, hcpFactor: number): number {
  const H = hcpFactor * HENRY_ETHANOL_WATER.Hcp298_mol_m3_Pa * Math.exp(HENRY_ETHANOL_WATER.dlnH_dInvT_K * (1 / T_K - 1 / 298.15))
  const cWater = (waterDensity_kg_m3(T_K - KELVIN_AT_0C) / 18.015) * 1000 // mol/m³
  const p1s = 10 ** (ANTOINE_ETHANOL.A - ANTOINE_ETHANOL.B / (T_K + ANTOINE_ETHANOL.C))
  return cWater / H / p1s
}

/** Uncertainty knobs of the glass-temperature set: multiply Henry's Hcp and γ2∞ (1 = nominal). */
export interface GlassSetFactors {
  henry?: number
  waterDiluteGamma?: number
}

/**
 * NRTL parameters (τ12, τ21, α = DECHEMA's 0.2937) at glass temperature, solved so that
 *  - ln γ1∞ = τ21 + τ12 exp(−α τ12) equals the Henry's-law value (ethanolDiluteGammaFromHenry), and
 *  - ln γ2∞ = τ12 + τ21 exp(−α τ21) keeps the DECHEMA set's value for water in ethanol (that end of
 *    the set is tied to the azeotrope data, which sit at high ethanol content).
 * Two equations, two unknowns, Newton's method from the DECHEMA values (converges in < 8 steps).
 */
function glassNrtlParameters(T_K: number, factors: GlassSetFactors = {}): { tau12: number, tau21: number, alpha12: number } {
  const alpha = NRTL_ETHANOL_WATER.alpha12
  const key = `${T_K}|${factors.henry ?? 1}|${factors.waterDiluteGamma ?? 1}`
  const hit = glassParamCache.get(key)
  if (hit) return hit
  const L1 = Math.log(henryGamma(T_K, 1 / (factors.henry ?? 1)))
  const L2 = Math.log(nrtl(1, T_K).gamma2 * (factors.waterDiluteGamma ?? 1))
  const RT = GAS_CONSTANT_CAL_MOL_K * T_K
  let t12 = NRTL_ETHANOL_WATER.A12_cal_mol / RT
  let t21 = NRTL_ETHANOL_WATER.A21_cal_mol / RT
  for (let i = 0; i < 30; i++) {
    const e12 = Math.exp(-alpha * t12)
    const e21 = Math.exp(-alpha * t21)
    const f1 = t21 + t12 * e12 - L1
    const f2 = t12 + t21 * e21 - L2
    const a = e12 * (1 - alpha * t12) // ∂f1/∂τ12
    const b = 1 // ∂f1/∂τ21
    const c = 1 // ∂f2/∂τ12
    const d = e21 * (1 - alpha * t21) // ∂f2/∂τ21
    const det = a * d - b * c
    const d12 = (f1 * d - b * f2) / det
    const d21 = (a * f2 - c * f1) / det
    t12 -= d12
    t21 -= d21
    if (Math.abs(d12) + Math.abs(d21) < 1e-13) break
  }
  const out = { tau12: t12, tau21: t21, alpha12: alpha }
  if (glassParamCache.size > 5000) glassParamCache.clear()
  glassParamCache.set(key, out)
  return out
}
const glassParamCache = new Map<string, { tau12: number, tau21: number, alpha12: number }>()

/**
 * Activity coefficients at glass temperature (0–40 °C): NRTL with glassNrtlParameters(T).
 * Sources: Sander (2015) for dilute ethanol, DECHEMA for dilute water; see docs/science.md for what
 * is and is not checked. Valid 273.15–313.15 K.
 */
export function activityCoefficientsGlass(x1: number, T_K: number, factors: GlassSetFactors = {}): ActivityCoefficients {
  assertInRange('x1', x1, 0, 1, '(mole fraction)')
  assertInRange('T_K', T_K, ANTOINE_MODEL_MIN_T_K, 313.15, 'K')
  return nrtlTau(x1, glassNrtlParameters(T_K, factors))
}

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
  const RT = GAS_CONSTANT_CAL_MOL_K * T_K
  return nrtlTau(x1, { tau12: NRTL_ETHANOL_WATER.A12_cal_mol / RT, tau21: NRTL_ETHANOL_WATER.A21_cal_mol / RT, alpha12: NRTL_ETHANOL_WATER.alpha12 })
}

function nrtlTau(x1: number, p: { tau12: number, tau21: number, alpha12: number }): ActivityCoefficients {
  const x2 = 1 - x1
  const t12 = p.tau12
  const t21 = p.tau21
  const G12 = Math.exp(-p.alpha12 * t12)
  const G21 = Math.exp(-p.alpha12 * t21)
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

function gammas(x1: number, T_K: number, model: ActivityModel, factors?: GlassSetFactors): ActivityCoefficients {
  if (model === 'glass') return nrtlTau(x1, glassNrtlParameters(T_K, factors))
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
export function vapourStateUnchecked(x1: number, T_K: number, model: ActivityModel = 'nrtl', factors?: GlassSetFactors): VapourState {
  const p1s = 10 ** (ANTOINE_ETHANOL.A - ANTOINE_ETHANOL.B / (T_K + ANTOINE_ETHANOL.C))
  const p2s = 10 ** (ANTOINE_WATER.A - ANTOINE_WATER.B / (T_K + ANTOINE_WATER.C))
  const { gamma1, gamma2 } = gammas(x1, T_K, model, factors)
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

/**
 * Molar enthalpy of vaporisation from the Antoine equation by Clausius–Clapeyron,
 * L = R ln10 · B T² / (T + C)², J/mol (ideal vapour, liquid volume neglected). At 25 °C it gives
 * 42.8 kJ/mol for ethanol and 44.1 kJ/mol for water (tabulated 42.3 and 44.0 — from memory).
 */
export function vaporisationEnthalpy_J_mol(species: 'ethanol' | 'water', T_K: number): number {
  const a = species === 'ethanol' ? ANTOINE_ETHANOL : ANTOINE_WATER
  return (GAS_CONSTANT_J_MOL_K * Math.LN10 * a.B * T_K * T_K) / ((T_K + a.C) ** 2)
}

/** d ln P_sat / dT from the Antoine equation, 1/K. */
export function saturationPressureLogSlope_1_K(species: 'ethanol' | 'water', T_K: number): number {
  const a = species === 'ethanol' ? ANTOINE_ETHANOL : ANTOINE_WATER
  return (Math.LN10 * a.B) / ((T_K + a.C) ** 2)
}
