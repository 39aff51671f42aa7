/**
 * The room's air next to the glass: diffusivities of ethanol and water vapour in air, the air's
 * own properties, and the mass- and heat-transfer coefficients of the wetted wall above the liquid.
 *
 * The wall is treated as a vertical plate of height L (the wetted wall above the liquid line) in
 * room air that is both buoyant (the vapour-laden, cooled air at the film is denser or lighter
 * than the room's) and gently moving (a room's draughts). Both are laminar here; the two
 * contributions combine by Churchill's rule Sh³ = Sh_natural³ + Sh_forced³.
 */
import { GAS_CONSTANT_J_MOL_K, GRAVITY_M_S2, KELVIN_AT_0C, MOLAR_MASS_ETHANOL_G_MOL, MOLAR_MASS_WATER_G_MOL, STANDARD_ATMOSPHERE_PA } from './constants'
import { assertInRange } from './ranges'

/** Molar mass of dry air, g/mol (U.S. Standard Atmosphere 1976). */
const MOLAR_MASS_AIR_G_MOL = 28.9645

/**
 * Diffusion volumes of Fuller, Schettler & Giddings, Ind. Eng. Chem. 58(5), 18 (1966), Table of
 * atomic and structural diffusion-volume increments: C 16.5, H 1.98, O 5.48; air 20.1; H2O 12.7
 * (from memory; the 1969 revision in Poling et al. gives C 15.9, H 2.31, O 6.11, air 19.7, H2O 13.1).
 * Ethanol C2H6O = 2·16.5 + 6·1.98 + 5.48 = 50.36.
 */
const FULLER_VOLUMES = { ethanol: 2 * 16.5 + 6 * 1.98 + 5.48, water: 12.7, air: 20.1 } as const

/**
 * Binary diffusivity of ethanol vapour in air, m²/s, Fuller, Schettler & Giddings (1966):
 * D = 1.00×10⁻³ T^1.75 (1/M_A + 1/M_B)^½ / (P [atm] (V_A^⅓ + V_B^⅓)²) cm²/s.
 * At 25 °C and 1 atm: 1.23×10⁻⁵ m²/s (measured ≈ 1.2×10⁻⁵, from memory).
 */
export function diffusivityEthanolAir_m2_s(T_K: number, P_Pa: number = STANDARD_ATMOSPHERE_PA): number {
  return fuller(T_K, P_Pa, MOLAR_MASS_ETHANOL_G_MOL, FULLER_VOLUMES.ethanol)
}

/** Fuller–Schettler–Giddings for water vapour in air, m²/s: the cross-check of Massman's fit. */
export function diffusivityWaterAirFuller_m2_s(T_K: number, P_Pa: number = STANDARD_ATMOSPHERE_PA): number {
  return fuller(T_K, P_Pa, MOLAR_MASS_WATER_G_MOL, FULLER_VOLUMES.water)
}

function fuller(T_K: number, P_Pa: number, M: number, V: number): number {
  assertInRange('T_K', T_K, 250, 350, 'K')
  const cm2s = (1e-3 * T_K ** 1.75 * Math.sqrt(1 / M + 1 / MOLAR_MASS_AIR_G_MOL))
    / ((P_Pa / STANDARD_ATMOSPHERE_PA) * (Math.cbrt(V) + Math.cbrt(FULLER_VOLUMES.air)) ** 2)
  return cm2s * 1e-4
}

/**
 * Diffusivity of water vapour in air, m²/s: Massman, Atmos. Environ. 32, 1111 (1998), Table 2,
 * D = 2.178×10⁻⁵ (T/273.15)^1.81 (p0/p) m²/s. At 25 °C and 1 atm: 2.55×10⁻⁵ m²/s.
 */
export function diffusivityWaterAir_m2_s(T_K: number, P_Pa: number = STANDARD_ATMOSPHERE_PA): number {
  assertInRange('T_K', T_K, 250, 350, 'K')
  return 2.178e-5 * (T_K / KELVIN_AT_0C) ** 1.81 * (STANDARD_ATMOSPHERE_PA / P_Pa)
}

/**
 * Dynamic viscosity of air, Pa·s, Sutherland's law μ = μ0 (T/T0)^1.5 (T0 + S)/(T + S) with
 * μ0 = 1.716×10⁻⁵ Pa·s at T0 = 273.15 K and S = 110.4 K (White, Viscous Fluid Flow, 3rd ed.,
 * Table 1-2 — from memory). 20 °C → 1.81×10⁻⁵ Pa·s.
 */
export function airViscosity_Pa_s(T_K: number): number {
  return (1.716e-5 * (T_K / 273.15) ** 1.5 * (273.15 + 110.4)) / (T_K + 110.4)
}

/**
 * Thermal conductivity of air, W/(m·K), Sutherland form k = k0 (T/T0)^1.5 (T0 + S)/(T + S),
 * k0 = 0.0241 W/(m·K) at 273.15 K, S = 194 K (White, Viscous Fluid Flow, Table 1-3 — from memory).
 * 20 °C → 0.0257 W/(m·K).
 */
export function airConductivity_W_m_K(T_K: number): number {
  return (0.0241 * (T_K / 273.15) ** 1.5 * (273.15 + 194)) / (T_K + 194)
}

/** Isobaric specific heat of air, J/(kg·K), near room temperature (1005–1007; from memory). */
const AIR_CP_J_KG_K = 1006

/** Density of moist air, kg/m³, ideal gas: ρ = P M̄ / (R T), vapour mole fractions yE, yW. */
export function moistAirDensity_kg_m3(T_K: number, yEthanol: number, yWater: number, P_Pa: number = STANDARD_ATMOSPHERE_PA): number {
  const M = yEthanol * MOLAR_MASS_ETHANOL_G_MOL + yWater * MOLAR_MASS_WATER_G_MOL + (1 - yEthanol - yWater) * MOLAR_MASS_AIR_G_MOL
  return (P_Pa * M * 1e-3) / (GAS_CONSTANT_J_MOL_K * T_K)
}

/** How the air moves near the glass. */
export interface AirMotion {
  /** Speed of the room's draughts past the glass, m/s (still indoor air: ~0.05–0.2). */
  airSpeed_m_s: number
  /** Height of the wetted wall above the liquid line, m (the plate length in the correlations). */
  wallHeight_m: number
}

/**
 * Room air is never perfectly still: indoor air speeds are usually 0.05–0.2 m/s away from fans and
 * vents (ASHRAE Standard 55 treats < 0.2 m/s as still air — from memory); 0.1 m/s is the middle.
 */
export const DEFAULT_AIR_SPEED_M_S = 0.1

/** Wetted wall above the liquid after a swirl, m: about 4 cm in a tasting glass (common practice, no source). */
export const DEFAULT_WETTED_WALL_M = 0.04

/**
 * Mean Sherwood (or Nusselt) number of a vertical plate, laminar and turbulent natural convection:
 * Churchill & Chu, Int. J. Heat Mass Transfer 18, 1323 (1975), Eq. 4 (from memory), the
 * correlation recommended in Bird, Stewart & Lightfoot, Transport Phenomena, 2nd ed., §14.5:
 *   Sh = {0.825 + 0.387 Ra^(1/6) / [1 + (0.492/Sc)^(9/16)]^(8/27)}², Ra = Gr·Sc.
 */
export function naturalConvectionSherwood(rayleigh: number, schmidt: number): number {
  const r = Math.max(0, rayleigh)
  return (0.825 + (0.387 * r ** (1 / 6)) / (1 + (0.492 / schmidt) ** (9 / 16)) ** (8 / 27)) ** 2
}

/**
 * Mean Sherwood (or Nusselt) number of a flat plate in laminar forced flow along it,
 * Sh = 0.664 Re^½ Sc^⅓ (Pohlhausen; Bird, Stewart & Lightfoot, 2nd ed., §14.4 and §22.2 — from memory).
 */
export function forcedConvectionSherwood(reynolds: number, schmidt: number): number {
  return 0.664 * Math.sqrt(Math.max(0, reynolds)) * Math.cbrt(schmidt)
}

/** Transfer coefficients of the wetted wall. */
export interface WallTransfer {
  /** Mass-transfer coefficient of ethanol vapour, m/s. */
  kEthanol_m_s: number
  /** Mass-transfer coefficient of water vapour, m/s. */
  kWater_m_s: number
  /** Heat-transfer coefficient from the room air to the wall, W/(m²·K). */
  hAir_W_m2_K: number
  /** Diffusivity of ethanol vapour in air, m²/s. */
  diffusivityEthanol_m2_s: number
  /** Diffusivity of water vapour in air, m²/s. */
  diffusivityWater_m2_s: number
  /** Grashof number of the buoyant air at the wall (from the density difference). */
  grashof: number
}

/**
 * Mass- and heat-transfer coefficients of the wetted wall, from the density difference between
 * the air at the film (at the film's temperature, saturated with its vapours) and the room's air,
 * and the room's draughts; film temperature for the properties. Churchill's combination with
 * exponent 3 for assisting or opposing mixed convection (Churchill, AIChE J. 23, 10, 1977 — from
 * memory); k = Sh D / L, h = Nu k_air / L.
 */
export function wallTransfer(input: {
  surfaceT_K: number
  airT_K: number
  /** Vapour mole fractions in the air at the film surface. */
  surfaceYEthanol: number
  surfaceYWater: number
  /** Water vapour mole fraction of the room air. */
  roomYWater: number
  motion: AirMotion
  /**
   * Multiplier of the coefficients k_E, k_W and h (1 = the correlations as published): the
   * calibration's massTransferFactor (docs/science.md, "Calibration from observations"). One
   * factor for all three because one boundary layer carries the two vapours and the heat: the
   * Chilton–Colburn analogy (Bird, Stewart & Lightfoot, 2nd ed., §22.3 — from memory) makes
   * Sh/Sc^⅓ = Nu/Pr^⅓, so whatever the correlations get wrong about the air (draught, plate
   * length, the glass's surroundings) moves k and h together.
   */
  transferFactor?: number
}): WallTransfer {
  const Tm = 0.5 * (input.surfaceT_K + input.airT_K)
  const rhoS = moistAirDensity_kg_m3(input.surfaceT_K, input.surfaceYEthanol, input.surfaceYWater)
  const rhoInf = moistAirDensity_kg_m3(input.airT_K, 0, input.roomYWater)
  const rhoM = 0.5 * (rhoS + rhoInf)
  const mu = airViscosity_Pa_s(Tm)
  const nu = mu / rhoM
  const L = input.motion.wallHeight_m
  const gr = (GRAVITY_M_S2 * Math.abs(rhoS - rhoInf) / rhoM) * L ** 3 / (nu * nu)
  const re = (input.motion.airSpeed_m_s * L) / nu
  const dE = diffusivityEthanolAir_m2_s(Tm)
  const dW = diffusivityWaterAir_m2_s(Tm)
  const kAir = airConductivity_W_m_K(Tm)
  const alphaAir = kAir / (rhoM * AIR_CP_J_KG_K)
  const coefficient = (diffusivity: number): number => {
    const sc = nu / diffusivity
    const sh = Math.cbrt(naturalConvectionSherwood(gr * sc, sc) ** 3 + forcedConvectionSherwood(re, sc) ** 3)
    return (sh * diffusivity) / L
  }
  const factor = input.transferFactor ?? 1
  return {
    kEthanol_m_s: coefficient(dE) * factor,
    kWater_m_s: coefficient(dW) * factor,
    hAir_W_m2_K: (coefficient(alphaAir) / alphaAir) * kAir * factor,
    diffusivityEthanol_m2_s: dE,
    diffusivityWater_m2_s: dW,
    grashof: gr,
  }
}
