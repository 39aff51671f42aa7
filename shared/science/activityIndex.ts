/**
 * Film activity index, 0–10: how strongly evaporation drives the climbing film of a pour.
 *
 * Built from the two quantities that make the film climb:
 *  - the Marangoni driving force Δσ = σ(film) − σ(bulk), mN/m, after the film has lost
 *    FILM_MASS_LOSS_FRACTION of its volatile mass (film.ts), and
 *  - the ethanol evaporation flux from the bulk composition, kg/(m²·s) (∝ x1 γ1 P1sat), which sets
 *    how fast evaporation renews that difference.
 * The index is proportional to their product, D = Δσ · J_ethanol, scaled so that 10 is the largest
 * D over 0–100 % vol at 20 °C with no sugar (INDEX_REFERENCE below) and capped at 10 (warmer pours
 * can exceed the 20 °C maximum; `relative` keeps the uncapped ratio). Negative Δσ (film enriched in
 * ethanol, at and beyond the azeotrope) gives 0. Sugar does not enter: it changes how fast the
 * liquid moves, not what drives it.
 */
import { composition } from './composition'
import { FILM_MASS_LOSS_FRACTION, type FilmState, evaporationFlux, filmComposition } from './film'
import { ABV_RANGE_PCT_VOL, TEMP_RANGE_C, assertInRange } from './ranges'
import { mixtureSigmaUnchecked } from './surfaceTension'

/**
 * Anchor of the scale: the maximum of D = Δσ · J_ethanol over 0–100 % vol at 20 °C, 0 g/L, with the
 * model's constants, in (mN/m)·kg/(m²·s), and where it occurs. Computed by
 * `findIndexReference()` and checked against it by the unit tests.
 */
export const INDEX_REFERENCE = { drive: 5.143917792295875e-4, abvPctVol: 13.94, tempC: 20 } as const

/** Temperature at which the index is anchored, °C. */
const INDEX_ANCHOR_TEMP_C = 20

/** The index and the quantities it is built from. */
export interface FilmActivity {
  /** Film activity index, 0–10. */
  index: number
  /** Uncapped ratio D / D_ref (1 = the 20 °C maximum). */
  relative: number
  /** Marangoni driving force σ(film) − σ(bulk), mN/m (may be negative beyond the azeotrope). */
  deltaSigma_mN_m: number
  /** Ethanol evaporation flux from the bulk composition into dry still air, kg/(m²·s). */
  ethanolFlux_kg_m2_s: number
  /** D = max(Δσ, 0) · J_ethanol, (mN/m)·kg/(m²·s). */
  drive: number
  /** Surface tension of the bulk, mN/m. */
  surfaceTensionBulk_mN_m: number
  /** Surface tension of the evaporated film, mN/m. */
  surfaceTensionFilm_mN_m: number
  /** Composition of the evaporated film. */
  film: FilmState
}

/**
 * Film activity from the solvent's ethanol mole fraction and temperature (no range checks beyond
 * those of the called functions). Sources: film.ts (Rayleigh depletion, NRTL, Antoine),
 * surfaceTension.ts (Connors–Wright fit). Valid x1 0–1, 0–40 °C.
 */
export function filmActivityFromMoleFraction(x1: number, tempC: number): FilmActivity {
  const film = filmComposition(x1, tempC, FILM_MASS_LOSS_FRACTION)
  const sigmaBulk = mixtureSigmaUnchecked(x1, tempC)
  const sigmaFilm = mixtureSigmaUnchecked(film.x1Film, tempC)
  const deltaSigma = sigmaFilm - sigmaBulk
  const flux = evaporationFlux(x1, tempC).ethanol_kg_m2_s
  const drive = Math.max(0, deltaSigma) * flux
  const relative = drive / INDEX_REFERENCE.drive
  return {
    index: Math.min(10, 10 * relative),
    relative,
    deltaSigma_mN_m: deltaSigma,
    ethanolFlux_kg_m2_s: flux,
    drive,
    surfaceTensionBulk_mN_m: sigmaBulk,
    surfaceTensionFilm_mN_m: sigmaFilm,
    film,
  }
}

/**
 * Film activity index, 0–10, of a drink of given ABV (% vol at 20 °C), temperature (°C) and residual
 * sugar (g/L; it only changes the solvent's strength through the volume sugar takes up).
 * Valid ABV 0–100, 0–40 °C, sugar 0–400 g/L. Throws RangeError outside.
 */
export function filmActivityIndex(abvPctVol: number, tempC: number, sugarGL = 0): number {
  assertInRange('abvPctVol', abvPctVol, ABV_RANGE_PCT_VOL.min, ABV_RANGE_PCT_VOL.max, '% vol')
  assertInRange('tempC', tempC, TEMP_RANGE_C.min, TEMP_RANGE_C.max, '°C')
  const c = composition(abvPctVol, tempC, sugarGL)
  return filmActivityFromMoleFraction(c.solventMoleFraction, tempC).index
}

/**
 * Recomputes the scale's anchor: golden-section search of D over 0–100 % vol at 20 °C, 0 g/L, after
 * a 1 % vol scan to bracket the maximum. Used by the tests to check INDEX_REFERENCE.
 */
export function findIndexReference(): { drive: number, abvPctVol: number } {
  const D = (abv: number): number =>
    filmActivityFromMoleFraction(composition(abv, INDEX_ANCHOR_TEMP_C, 0).solventMoleFraction, INDEX_ANCHOR_TEMP_C).drive
  let best = 0
  for (let a = 1; a <= 100; a++) if (D(a) > D(best)) best = a
  let lo = Math.max(0, best - 1)
  let hi = Math.min(100, best + 1)
  const g = (Math.sqrt(5) - 1) / 2
  while (hi - lo > 1e-6) {
    const m1 = hi - g * (hi - lo)
    const m2 = lo + g * (hi - lo)
    if (D(m1) < D(m2)) lo = m1
    else hi = m2
  }
  const abv = 0.5 * (lo + hi)
  return { drive: D(abv), abvPctVol: abv }
}
