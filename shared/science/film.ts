/**
 * Evaporative depletion of the thin film that climbs the glass wall above the meniscus.
 *
 * The film is a batch of liquid that evaporates into the room air while the bulk below barely
 * changes. Open-air evaporation is not boiling: the film stays at the glass temperature, and the
 * vapour leaving it has, at each instant, the composition the modified Raoult law gives at that
 * temperature (α = γ1 P1sat / (γ2 P2sat)). This is the Rayleigh (batch distillation) problem.
 */
import { meanMolarMass_g_mol, massFractionFromMoleFraction } from './composition'
import { GAS_CONSTANT_J_MOL_K, KELVIN_AT_0C, MOLAR_MASS_ETHANOL_G_MOL, MOLAR_MASS_WATER_G_MOL } from './constants'
import { TEMP_RANGE_C, assertInRange } from './ranges'
import { type ActivityModel, type VapourState, vapourStateUnchecked } from './vle'

/**
 * Fraction of its volatile (water + ethanol) mass that the film at the top of the climbing band has
 * lost by evaporation, relative to the liquid at the meniscus. An estimate, not a measured value:
 * a film ~20–40 µm thick (areal mass ~0.02–0.04 kg/m²) losing ~1–2×10⁻⁴ kg m⁻² s⁻¹ (see
 * EVAPORATION_MASS_TRANSFER_COEFF_M_S) over the ~5–20 s a parcel takes to climb a ~1 cm band loses
 * a few per cent; 5 % is the middle of that range and puts the predicted clear band of a 12–14 %
 * vol wine at 20 °C at about a centimetre, the height commonly seen (common practice, no source).
 * In the small-loss limit the 0–10 index, the film thickness and the tear speed do not depend on it
 * (Δσ ∝ f; τ⁴ ∝ (Δσ/f)·J, see predictions.ts); the band height and tear onset time scale about
 * linearly with it.
 */
export const FILM_MASS_LOSS_FRACTION = 0.05

/**
 * Mass-transfer coefficient for evaporation from the wetted glass wall into still room air, m/s:
 * k = D/δ with water-vapour diffusivity in air ≈ 2.5×10⁻⁵ m²/s at 20 °C (from memory) and a
 * diffusion layer δ ≈ 5 mm for a glass standing in still indoor air (estimate). The same k is
 * used for ethanol and water, so evaporation is governed by the partial pressures alone (see
 * docs/science.md for what this leaves out: ethanol's lower diffusivity, humidity).
 */
const EVAPORATION_MASS_TRANSFER_COEFF_M_S = 5e-3

/** Number of classical Runge–Kutta steps for the Rayleigh integration (error < 1e-9 in x1; see tests). */
const RAYLEIGH_RK4_STEPS = 40

/** Evaporation fluxes from a liquid surface into dry, still air (pressures and vapour as in VapourState, vle.ts). */
export interface EvaporationFlux extends Pick<VapourState, 'pEthanol_Pa' | 'pWater_Pa' | 'relativeVolatility' | 'y1'> {
  /** Ethanol mass flux, kg/(m²·s). */
  ethanol_kg_m2_s: number
  /** Water mass flux, kg/(m²·s). */
  water_kg_m2_s: number
  /** Total mass flux, kg/(m²·s). */
  total_kg_m2_s: number
}

/**
 * Evaporation mass fluxes J_i = k M_i p_i / (R T), p_i = x_i γ_i P_i^sat (modified Raoult law at
 * the liquid temperature; NRTL by default), far-field vapour pressures taken as zero (dry air).
 * Sources: Antoine (Poling et al.), NRTL (DECHEMA); k from EVAPORATION_MASS_TRANSFER_COEFF_M_S.
 * Valid 0–40 °C, x1 0–1.
 * @param x1 ethanol mole fraction of the liquid, 0–1
 */
export function evaporationFlux(x1: number, tempC: number, model: ActivityModel = 'nrtl'): EvaporationFlux {
  assertInRange('x1', x1, 0, 1, '(mole fraction)')
  assertInRange('tempC', tempC, TEMP_RANGE_C.min, TEMP_RANGE_C.max, '°C')
  const T = tempC + KELVIN_AT_0C
  const v = vapourStateUnchecked(x1, T, model)
  const c = EVAPORATION_MASS_TRANSFER_COEFF_M_S / (GAS_CONSTANT_J_MOL_K * T) / 1000 // g → kg
  const je = c * MOLAR_MASS_ETHANOL_G_MOL * v.pEthanol_Pa
  const jw = c * MOLAR_MASS_WATER_G_MOL * v.pWater_Pa
  return {
    ethanol_kg_m2_s: je,
    water_kg_m2_s: jw,
    total_kg_m2_s: je + jw,
    pEthanol_Pa: v.pEthanol_Pa,
    pWater_Pa: v.pWater_Pa,
    relativeVolatility: v.relativeVolatility,
    y1: v.y1,
  }
}

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
  massLossFraction: number = FILM_MASS_LOSS_FRACTION,
  model: ActivityModel = 'nrtl',
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
export function rayleighLnMoleRatio(x0: number, x: number, tempC: number, intervals = 2000, model: ActivityModel = 'nrtl'): number {
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
