import { computeFilm, ethanolGrams, type FilmResult } from '../science'
import type { Venue } from '../db/schema/venues'

export interface PourNumbers {
  abvPctVol: number
  residualSugarGL: number
  servingTempC: number
  volumeMl: number
  /** Glass wall angle from horizontal, degrees; the model's default glass when absent. */
  wallAngleDeg?: number
}

export interface PourFacts {
  ethanolGrams: number
  standardDrinks: number
  filmActivityIndex: number
  film: FilmResult
}

/**
 * Everything the glass model says about one pour, under the venue's standard-drink definition.
 * Derived on every read from the current numbers, never stored, so it cannot go stale.
 */
export function pourFacts(p: PourNumbers, venue: Pick<Venue, 'standardDrinkGrams'>): PourFacts {
  const film = computeFilm({ abvPctVol: p.abvPctVol, tempC: p.servingTempC, sugarGL: p.residualSugarGL, wallAngleDeg: p.wallAngleDeg })
  const grams = ethanolGrams(p.volumeMl, p.abvPctVol)
  return { ethanolGrams: grams, standardDrinks: grams / venue.standardDrinkGrams, filmActivityIndex: film.filmActivityIndex, film }
}
