import { computeFilm, ethanolGrams, type FilmResult } from '../../shared/science'
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
  const film = filmFor(p.abvPctVol, p.servingTempC, p.residualSugarGL, p.wallAngleDeg)
  const grams = ethanolGrams(p.volumeMl, p.abvPctVol)
  return { ethanolGrams: grams, standardDrinks: grams / venue.standardDrinkGrams, filmActivityIndex: film.filmActivityIndex, film }
}

/**
 * computeFilm memoised by its inputs (a pure function, so a cached result can never go stale).
 * Bounded: the oldest entries go first past FILM_CACHE_MAX.
 */
const FILM_CACHE_MAX = 20_000
const filmCache = new Map<string, FilmResult>()
function filmFor(abvPctVol: number, tempC: number, sugarGL: number, wallAngleDeg?: number): FilmResult {
  const key = `${abvPctVol}|${tempC}|${sugarGL}|${wallAngleDeg ?? ''}`
  let film = filmCache.get(key)
  if (!film) {
    film = computeFilm({ abvPctVol, tempC, sugarGL, wallAngleDeg })
    if (filmCache.size >= FILM_CACHE_MAX) filmCache.delete(filmCache.keys().next().value!)
    filmCache.set(key, film)
  }
  return film
}
