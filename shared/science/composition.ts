/**
 * Composition of a hydroalcoholic drink: ABV ↔ ethanol mass fraction ↔ mole fraction ↔ density,
 * with a correction for dissolved sugar.
 *
 * Conventions: `abvPctVol` is % vol at 20 °C as a lab sheet reports it; `massFraction` and
 * `moleFraction` are of ethanol, 0–1; densities in kg/m³; temperatures in °C; sugar in g/L.
 */
import { MOLAR_MASS_ETHANOL_G_MOL, MOLAR_MASS_WATER_G_MOL } from './constants'
import { ABV_RANGE_PCT_VOL, SUGAR_RANGE_G_L, assertInRange } from './ranges'

/** OIML R 22 (1975) coefficients A1…A12, kg/m³ (EU Directive 76/766/EEC, Annex). */
const OIML_A: readonly number[] = [
  9.982012300e2, -1.929769495e2, 3.891238958e2, -1.668103923e3, 1.352215441e4, -8.829278388e4,
  3.062874042e5, -6.138381234e5, 7.470172998e5, -5.478461354e5, 2.234460334e5, -3.903285426e4,
]

/** OIML R 22 coefficients B1…B6, kg/m³ per °C^k. */
const OIML_B: readonly number[] = [
  -2.0618513e-1, -5.2682542e-3, 3.6130013e-5, -3.8957702e-7, 7.169354e-9, -9.9739231e-11,
]

/** OIML R 22 coefficients C_{i,k}: row i (power of t − 20), column k (power of p), kg/m³. */
const OIML_C: readonly (readonly number[])[] = [
  [
    1.693433461530087e-1, -1.046914743455169e1, 7.196353469546523e1, -7.047478054272792e2,
    3.924090430035045e3, -1.210164659068747e4, 2.248646550400788e4, -2.605562982188164e4,
    1.852373922069467e4, -7.420201433430137e3, 1.285617841998974e3,
  ],
  [
    -1.19301300505701e-2, 2.517399633803461e-1, -2.170575700536993, 1.353034988843029e1,
    -5.029988758547014e1, 1.09635566657757e2, -1.422753946421155e2, 1.08043594285623e2,
    -4.414153236817392e1, 7.442971530188783,
  ],
  [
    -6.802995733503803e-4, 1.876837790289664e-2, -2.002561813734156e-1, 1.02299296671922,
    -2.895696483903638, 4.810060584300675, -4.672147440794683, 2.458043105903461,
    -5.411227621436812e-1,
  ],
  [4.075376675622027e-6, -8.76305857347111e-6, 6.515031360099368e-6, -1.51578483698721e-6],
  [-2.788074354782409e-8, 1.345612883493354e-8],
]

/** Temperature range of the OIML R 22 formula, °C. */
const OIML_TEMP_RANGE_C = { min: -20, max: 40 } as const

/** Reference temperature of ABV and of the OIML tables, °C. */
const ABV_REFERENCE_TEMP_C = 20

/**
 * Apparent specific volume of dissolved sugar, cm³/g. Partial molar volume at infinite dilution,
 * 25 °C: sucrose ≈ 211.3 cm³/mol (342.30 g/mol), glucose ≈ 112 cm³/mol (180.16 g/mol) — from
 * memory (standard partial-molar-volume tables); both give ≈ 0.62 cm³/g, so the same value serves
 * residual sugar (mostly glucose + fructose) and added sucrose. With ρ_water = 998.2 kg/m³ each g/L
 * adds 0.384 kg/m³, matching the ICUMSA sucrose density table within 0.3 kg/m³ up to 20 °Brix and
 * 2 kg/m³ at 40 °Brix (table values from memory).
 */
const SUGAR_APPARENT_SPECIFIC_VOLUME_CM3_G = 0.617

/** Bisection tolerance for ABV → mass fraction, in mass fraction. */
const ABV_INVERSION_TOLERANCE = 1e-12

/**
 * Density of an ethanol–water mixture, kg/m³.
 * Source: OIML R 22 (1975) International Alcoholometric Tables formula ρ(p, t), as reproduced in
 * EU Directive 76/766/EEC. Valid for p = 0…1 and t = −20…+40 °C (ITS-68 in the original; the
 * difference to ITS-90 is below the formula's resolution here).
 * @param massFraction ethanol mass fraction, 0–1
 * @param tempC temperature, °C
 */
export function densityHydroalcoholic_kg_m3(massFraction: number, tempC: number): number {
  assertInRange('massFraction', massFraction, 0, 1, '(mass fraction)')
  assertInRange('tempC', tempC, OIML_TEMP_RANGE_C.min, OIML_TEMP_RANGE_C.max, '°C')
  return oimlDensity(massFraction, tempC)
}

/** Unchecked OIML R 22 evaluation (Horner in p), for inner loops that already checked inputs. */
function oimlDensity(p: number, tempC: number): number {
  const dt = tempC - 20
  // Σ A_k p^(k−1), k = 1..12
  let rho = 0
  for (let k = OIML_A.length - 1; k >= 0; k--) rho = rho * p + (OIML_A[k] ?? 0)
  // Σ B_k dt^k
  let bSum = 0
  for (let k = OIML_B.length - 1; k >= 0; k--) bSum = (bSum + (OIML_B[k] ?? 0)) * dt
  rho += bSum
  // Σ_i Σ_k C_{i,k} p^k dt^i
  let dtPow = 1
  for (const row of OIML_C) {
    dtPow *= dt
    let poly = 0
    for (let k = row.length - 1; k >= 0; k--) poly = (poly + (row[k] ?? 0)) * p
    rho += poly * dtPow
  }
  return rho
}

/** Density of pure ethanol at 20 °C from OIML R 22, kg/m³ (ρ(1, 20) = 789.24). */
export const ETHANOL_DENSITY_20C_KG_M3 = oimlDensity(1, ABV_REFERENCE_TEMP_C)

/**
 * ABV (% vol at 20 °C) of an ethanol–water mixture of given ethanol mass fraction.
 * Source: definition in OIML R 22: ABV = 100 · p · ρ(p, 20) / ρ(1, 20). Valid p = 0…1.
 */
export function abvFromMassFraction(massFraction: number): number {
  assertInRange('massFraction', massFraction, 0, 1, '(mass fraction)')
  return abvOf(massFraction)
}

function abvOf(p: number): number {
  return (100 * p * oimlDensity(p, ABV_REFERENCE_TEMP_C)) / ETHANOL_DENSITY_20C_KG_M3
}

/**
 * Ethanol mass fraction (0–1) of an ethanol–water mixture with the given ABV (% vol at 20 °C).
 * Numerical inversion of the OIML R 22 definition by bisection (ABV is strictly increasing in p),
 * converged to 1e-12 in mass fraction. Valid ABV 0–100.
 */
export function massFractionFromAbv(abvPctVol: number): number {
  assertInRange('abvPctVol', abvPctVol, ABV_RANGE_PCT_VOL.min, ABV_RANGE_PCT_VOL.max, '% vol')
  if (abvPctVol === 0) return 0
  if (abvPctVol === 100) return 1
  let lo = 0
  let hi = 1
  while (hi - lo > ABV_INVERSION_TOLERANCE) {
    const mid = 0.5 * (lo + hi)
    if (abvOf(mid) < abvPctVol) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

/** Ethanol mole fraction (0–1) from ethanol mass fraction (0–1). Exact (molar masses above). */
export function moleFractionFromMassFraction(massFraction: number): number {
  assertInRange('massFraction', massFraction, 0, 1, '(mass fraction)')
  const nE = massFraction / MOLAR_MASS_ETHANOL_G_MOL
  const nW = (1 - massFraction) / MOLAR_MASS_WATER_G_MOL
  return nE / (nE + nW)
}

/** Ethanol mass fraction (0–1) from ethanol mole fraction (0–1). Exact (molar masses above). */
export function massFractionFromMoleFraction(moleFraction: number): number {
  assertInRange('moleFraction', moleFraction, 0, 1, '(mole fraction)')
  const mE = moleFraction * MOLAR_MASS_ETHANOL_G_MOL
  const mW = (1 - moleFraction) * MOLAR_MASS_WATER_G_MOL
  return mE / (mE + mW)
}

/** Mean molar mass of an ethanol–water mixture, g/mol, from the ethanol mole fraction (0–1). */
export function meanMolarMass_g_mol(moleFraction: number): number {
  return moleFraction * MOLAR_MASS_ETHANOL_G_MOL + (1 - moleFraction) * MOLAR_MASS_WATER_G_MOL
}

/**
 * ABV of the water–ethanol solvent alone, % vol, once dissolved sugar's volume is taken out.
 * A litre holding c g of sugar has (1 − v̄·c/1000) L of solvent, with v̄ the sugar's apparent
 * specific volume (see SUGAR_APPARENT_SPECIFIC_VOLUME_CM3_G); all the ethanol is in the solvent.
 * If the stated ABV and sugar together would need a solvent stronger than pure ethanol (an
 * impossible product, e.g. 90 % vol with 400 g/L), the solvent is capped at 100 % vol and
 * `capped` is true.
 * Valid ABV 0–100 % vol, sugar 0–400 g/L.
 */
export function solventAbv(abvPctVol: number, sugarGL: number): { solventAbvPctVol: number, capped: boolean } {
  assertInRange('abvPctVol', abvPctVol, ABV_RANGE_PCT_VOL.min, ABV_RANGE_PCT_VOL.max, '% vol')
  assertInRange('sugarGL', sugarGL, SUGAR_RANGE_G_L.min, SUGAR_RANGE_G_L.max, 'g/L')
  const solventVolumeFraction = 1 - (SUGAR_APPARENT_SPECIFIC_VOLUME_CM3_G * sugarGL) / 1000
  const raw = abvPctVol / solventVolumeFraction
  return raw > 100 ? { solventAbvPctVol: 100, capped: true } : { solventAbvPctVol: raw, capped: false }
}

/**
 * Density of a sugared hydroalcoholic drink, kg/m³:
 *   ρ = ρ_solvent + c · (1 − v̄ · ρ_solvent / 1000)
 * (mass balance with sugar of apparent specific volume v̄, cm³/g, at concentration c, g/L = kg/m³).
 * Source: OIML R 22 for ρ_solvent; v̄ from partial molar volumes of sucrose/glucose (from memory,
 * see SUGAR_APPARENT_SPECIFIC_VOLUME_CM3_G). Valid 0–400 g/L to about ±2 kg/m³ (v̄ is taken
 * constant and equal to its water value; in ethanol-rich solvents it is not measured here).
 * @param solventMassFraction ethanol mass fraction of the water–ethanol solvent, 0–1
 */
export function densityWithSugar_kg_m3(solventMassFraction: number, tempC: number, sugarGL: number): number {
  assertInRange('sugarGL', sugarGL, SUGAR_RANGE_G_L.min, SUGAR_RANGE_G_L.max, 'g/L')
  const rhoSolvent = densityHydroalcoholic_kg_m3(solventMassFraction, tempC)
  return rhoSolvent + sugarGL * (1 - (SUGAR_APPARENT_SPECIFIC_VOLUME_CM3_G * rhoSolvent) / 1000)
}

/** Everything the model needs to know about a drink's make-up at one temperature. */
export interface Composition {
  /** ABV as stated, % vol at 20 °C. */
  abvPctVol: number
  /** ABV of the water–ethanol solvent once the sugar's volume is removed, % vol. */
  solventAbvPctVol: number
  /** True when the stated ABV and sugar are incompatible and the solvent was capped at pure ethanol. */
  solventCapped: boolean
  /** Ethanol mass fraction of the water–ethanol solvent, 0–1 (what surface tension and VLE see). */
  solventMassFraction: number
  /** Ethanol mole fraction of the water–ethanol solvent, 0–1. */
  solventMoleFraction: number
  /** Ethanol mass fraction of the whole drink, sugar included, 0–1. */
  ethanolMassFraction: number
  /** Sugar mass fraction of the whole drink, 0–1. */
  sugarMassFraction: number
  /** Density of the water–ethanol solvent at tempC, kg/m³. */
  solventDensity_kg_m3: number
  /** Density of the drink at tempC, kg/m³. */
  density_kg_m3: number
  /** Ethanol concentration, g/L (= ABV/100 × 789.24, ethanol's volume being stated at 20 °C). */
  ethanol_g_L: number
}

/**
 * Composition and density of a drink from its lab-sheet numbers.
 * Sources and ranges: as for solventAbv, massFractionFromAbv, densityWithSugar_kg_m3.
 * @param abvPctVol ABV, % vol at 20 °C (0–100)
 * @param tempC liquid temperature, °C (−20…+40, the OIML range)
 * @param sugarGL residual sugar, g/L (0–400)
 */
export function composition(abvPctVol: number, tempC: number, sugarGL: number): Composition {
  const { solventAbvPctVol, capped } = solventAbv(abvPctVol, sugarGL)
  const p = massFractionFromAbv(solventAbvPctVol)
  const rhoSolvent = densityHydroalcoholic_kg_m3(p, tempC)
  const rho = densityWithSugar_kg_m3(p, tempC, sugarGL)
  const sugarMassFraction = sugarGL / rho
  return {
    abvPctVol,
    solventAbvPctVol,
    solventCapped: capped,
    solventMassFraction: p,
    solventMoleFraction: moleFractionFromMassFraction(p),
    ethanolMassFraction: p * (1 - sugarMassFraction),
    sugarMassFraction,
    solventDensity_kg_m3: rhoSolvent,
    density_kg_m3: rho,
    ethanol_g_L: (abvPctVol / 100) * ETHANOL_DENSITY_20C_KG_M3,
  }
}
