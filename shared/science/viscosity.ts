/**
 * Dynamic viscosity of ethanol–water mixtures and of sugared drinks, mPa·s.
 */
import { KELVIN_AT_0C } from './constants'
import { assertInRange } from './ranges'

/**
 * Bingham & Jackson, Bull. Bureau of Standards 14, 59 (1917), 20 °C column:
 * [ethanol mass fraction, η mPa·s] (the data the 20 °C fit reproduces).
 */
export const BINGHAM_JACKSON_20C: readonly (readonly [number, number])[] = [
  [0, 1.005], [0.1, 1.538], [0.2, 2.183], [0.3, 2.71], [0.4, 2.91], [0.5, 2.87],
  [0.6, 2.67], [0.7, 2.37], [0.8, 2.008], [0.9, 1.61], [1, 1.2],
]

/**
 * Same source, 0 °C and 40 °C columns as recalled (from memory; only the 20 °C column was read
 * directly), [ethanol mass fraction, η mPa·s]. Used to fit the temperature term.
 */
export const BINGHAM_JACKSON_0C_MEMORY: readonly (readonly [number, number])[] = [
  [0, 1.792], [0.1, 3.311], [0.2, 5.319], [0.3, 6.94], [0.4, 7.14], [0.5, 6.58],
  [0.6, 5.75], [0.7, 4.76], [0.8, 3.69], [0.9, 2.73], [1, 1.773],
]
export const BINGHAM_JACKSON_40C_MEMORY: readonly (readonly [number, number])[] = [
  [0, 0.653], [0.1, 0.907], [0.2, 1.16], [0.3, 1.368], [0.4, 1.482], [0.5, 1.499],
  [0.6, 1.447], [0.7, 1.344], [0.8, 1.203], [0.9, 1.021], [1, 0.834],
]

/**
 * 20 °C fit: ln η = (1 − w) ln η_w + w ln η_e + w(1 − w) Σ_k G_k (2w − 1)^k, w = ethanol mass
 * fraction, η_w = 1.005 and η_e = 1.200 mPa·s (the table's own end points). Least squares on the
 * nine interior Bingham & Jackson points; largest relative residual 0.39 %.
 */
const VISCOSITY_FIT_20C = {
  etaWater_mPa_s: 1.005,
  etaEthanol_mPa_s: 1.2,
  G: [3.845645650507661, -1.3727228973052084, 0.9803698274726486, 1.0832763012189193, -1.1844994929537274],
} as const

/**
 * Temperature term, Vogel form: ln η(w,T) = ln η(w,20 °C) + E(w) [1/(T − T_V) − 1/(293.15 K − T_V)],
 * T_V = 140 K (water's Vogel temperature, η = 0.02414 · 10^(247.8 K/(T − 140 K)) mPa·s — a widely
 * used correlation, from memory), E(w) = Σ_k E_k w^k in K, least squares on the 0 °C and 40 °C
 * columns above (from memory). Largest relative residual 5.3 % (0 °C) and 5.2 % (40 °C); at 10 °C
 * and 30 °C the model agrees with the recalled table within 2.5 %. E(0) = 587 K against 571 K for
 * water's own Vogel constant (247.8 × ln 10).
 */
const VISCOSITY_TEMPERATURE_TERM = {
  vogelT_K: 140,
  E_K: [587.4621664202074, 2099.5206016716015, -3848.8045599023826, 1612.424056694286],
} as const

/** Largest relative residuals of the viscosity fit, fraction (20 °C seen data; 0/40 °C memory data). */
export const VISCOSITY_FIT_MAX_RELATIVE_RESIDUAL = { at20C: 0.0039, at0C: 0.053, at40C: 0.052 } as const

/**
 * Viscosity of an ethanol–water mixture, mPa·s, from the fits above (Bingham & Jackson 1917).
 * Valid w = 0–1, 0–40 °C (the table's range).
 * @param massFraction ethanol mass fraction, 0–1
 */
export function viscosityHydroalcoholic_mPa_s(massFraction: number, tempC: number): number {
  assertInRange('massFraction', massFraction, 0, 1, '(mass fraction)')
  assertInRange('tempC', tempC, 0, 40, '°C')
  const w = massFraction
  const d = 2 * w - 1
  const { etaWater_mPa_s, etaEthanol_mPa_s, G } = VISCOSITY_FIT_20C
  let rk = 0
  for (let k = G.length - 1; k >= 0; k--) rk = rk * d + (G[k] ?? 0)
  const ln20 = (1 - w) * Math.log(etaWater_mPa_s) + w * Math.log(etaEthanol_mPa_s) + w * (1 - w) * rk
  const { vogelT_K, E_K } = VISCOSITY_TEMPERATURE_TERM
  let E = 0
  for (let k = E_K.length - 1; k >= 0; k--) E = E * w + (E_K[k] ?? 0)
  const T = tempC + KELVIN_AT_0C
  const v = 1 / (T - vogelT_K) - 1 / (20 + KELVIN_AT_0C - vogelT_K)
  return Math.exp(ln20 + E * v)
}

/**
 * Relative viscosity of sucrose solutions at 20 °C, ln η_rel = Σ_k S_k s^k (k = 1..3), s = sugar
 * mass fraction, fitted to the sucrose table 10–50 % mass: η = 1.336, 1.945, 3.187, 6.162,
 * 15.431 mPa·s with water 1.002 (CRC Handbook "Concentrative properties" sucrose table, from
 * memory). Largest relative residual 0.75 %. The initial slope S_1 = 2.77 is the Einstein-like
 * intrinsic viscosity per unit mass fraction.
 */
const SUGAR_RELATIVE_VISCOSITY_FIT = { S: [2.7663020637594564, 0.8373400124807032, 9.115725927482552] } as const

/**
 * Factor by which dissolved sugar multiplies the solvent's viscosity, dimensionless.
 * Sucrose table fit above, used for residual sugar in general (glucose and fructose solutions are
 * within a few per cent of sucrose at the same mass fraction below ~20 %, from memory) and for
 * the water–ethanol solvent as if it were water (the relative viscosity of sugar in hydroalcoholic
 * solvents is not in the sources used here). Temperature dependence of the ratio is left out:
 * the ratio at 0 °C exceeds the 20 °C one by about 5 % at 30 % sugar (from memory).
 * Valid sugar mass fraction 0–0.5.
 * @param sugarMassFraction sugar mass fraction of the drink, 0–0.5
 */
export function sugarViscosityFactor(sugarMassFraction: number): number {
  assertInRange('sugarMassFraction', sugarMassFraction, 0, 0.5, '(mass fraction)')
  const s = sugarMassFraction
  const S = SUGAR_RELATIVE_VISCOSITY_FIT.S
  return Math.exp(s * ((S[0] ?? 0) + s * ((S[1] ?? 0) + s * (S[2] ?? 0))))
}

/**
 * Viscosity of a drink, mPa·s: hydroalcoholic viscosity × sugar factor (both above).
 * @param solventMassFraction ethanol mass fraction of the water–ethanol solvent, 0–1
 * @param sugarMassFraction sugar mass fraction of the drink, 0–0.5
 */
export function viscosity_mPa_s(solventMassFraction: number, tempC: number, sugarMassFraction: number): number {
  return viscosityHydroalcoholic_mPa_s(solventMassFraction, tempC) * sugarViscosityFactor(sugarMassFraction)
}
