/**
 * Evaporative depletion of a batch of liquid into dry air at equilibrium (the Rayleigh problem):
 * the textbook limit the climbing-film model (climbingFilm.ts) reduces to when the room is dry and
 * both vapours leave with the same transfer coefficient. Kept as a check of the film physics.
 *
 * The film is a batch of liquid that evaporates into the room air while the bulk below barely
 * changes. Open-air evaporation is not boiling: the film stays at the glass temperature, and the
 * vapour leaving it has, at each instant, the composition the modified Raoult law gives at that
 * temperature (α = γ1 P1sat / (γ2 P2sat)). This is the Rayleigh (batch distillation) problem.
 */
import { meanMolarMass_g_mol, massFractionFromMoleFraction } from './composition'
import { KELVIN_AT_0C } from './constants'
import { TEMP_RANGE_C, assertInRange } from './ranges'
import { type ActivityModel, vapourStateUnchecked } from './vle'

/** Number of classical Runge–Kutta steps for the Rayleigh integration (error < 1e-9 in x1; see tests). */
const RAYLEIGH_RK4_STEPS = 40

/** Composition of the evaporated film. */
export interface FilmState {
  /** Ethanol mole fraction of the film, 0–1. */
  x1Film: number
  /** Ethanol mass fraction of the film's solvent, 0–1. */
  massFractionFilm: number
  /** Fraction of the film's volatile mass evaporated (the input), 0–1. */
  massLossFraction: number
  /** The same loss counted in moles, 1 − n/n0, 0–1. */
  moleLossFraction: number
}

/**
 * Composition of a film that has lost `massLossFraction` of its water + ethanol by open-air
 * evaporation at the liquid temperature, by the Rayleigh equation d ln n / d x1 = 1/(y1 − x1)
 * (Lord Rayleigh, Phil. Mag. 4, 521, 1902 — from memory), y1 from the modified Raoult law with
 * NRTL at tempC. Integrated in the film mass m = n·M̄: d x1 / d ln m = (y1 − x1) M̄_liquid / M̄_vapour
 * (the same equation, since dm = M̄_vapour dn), by RK4 from ln m = 0 to ln(1 − f); the mole loss
 * follows from n/n0 = (m/m0) · M̄(x0)/M̄(x). Sugar is non-volatile and does not enter.
 * Valid x1 0–1, 0–40 °C, f 0–0.9.
 * @param x1Bulk ethanol mole fraction of the bulk liquid, 0–1
 */
export function filmComposition(
  x1Bulk: number,
  tempC: number,
  massLossFraction: number,
  model: ActivityModel = 'glass',
): FilmState {
  assertInRange('x1Bulk', x1Bulk, 0, 1, '(mole fraction)')
  assertInRange('tempC', tempC, TEMP_RANGE_C.min, TEMP_RANGE_C.max, '°C')
  assertInRange('massLossFraction', massLossFraction, 0, 0.9, '(mass fraction)')
  const T = tempC + KELVIN_AT_0C
  const rate = (x: number): number => {
    const xc = Math.min(1, Math.max(0, x))
    const y = vapourStateUnchecked(xc, T, model).y1
    return ((y - xc) * meanMolarMass_g_mol(xc)) / meanMolarMass_g_mol(y)
  }
  let x = x1Bulk
  if (x > 0 && x < 1 && massLossFraction > 0) {
    const h = Math.log(1 - massLossFraction) / RAYLEIGH_RK4_STEPS // negative step in ln m
    for (let i = 0; i < RAYLEIGH_RK4_STEPS; i++) {
      const k1 = rate(x)
      const k2 = rate(x + 0.5 * h * k1)
      const k3 = rate(x + 0.5 * h * k2)
      const k4 = rate(x + h * k3)
      x += (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4)
    }
    x = Math.min(1, Math.max(0, x))
  }
  const moleRatio = ((1 - massLossFraction) * meanMolarMass_g_mol(x1Bulk)) / meanMolarMass_g_mol(x)
  return {
    x1Film: x,
    massFractionFilm: massFractionFromMoleFraction(x),
    massLossFraction,
    moleLossFraction: 1 - moleRatio,
  }
}

/**
 * The Rayleigh integral ln(n/n0) = ∫_{x0}^{x} dx/(y1 − x) by composite Simpson quadrature, for
 * checking filmComposition against the equation in its textbook form. Valid for 0 < x, x0 < 1 on
 * the same side of any azeotrope.
 */
export function rayleighLnMoleRatio(x0: number, x: number, tempC: number, intervals = 2000, model: ActivityModel = 'glass'): number {
  assertInRange('x0', x0, 0, 1, '(mole fraction)')
  assertInRange('x', x, 0, 1, '(mole fraction)')
  const T = tempC + KELVIN_AT_0C
  const f = (xi: number): number => 1 / (vapourStateUnchecked(xi, T, model).y1 - xi)
  const n = intervals % 2 === 0 ? intervals : intervals + 1
  const h = (x - x0) / n
  let s = f(x0) + f(x)
  for (let i = 1; i < n; i++) s += (i % 2 === 1 ? 4 : 2) * f(x0 + i * h)
  return (s * h) / 3
}
