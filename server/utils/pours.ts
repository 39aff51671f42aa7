import { computeFilm, ethanolGrams, type DrinkKind, type FilmResult, type RoomAir } from '../../shared/science'
import type { Venue } from '../db/schema/venues'
import type { AppliedCalibration } from '../../shared/science/calibration'

export interface PourNumbers {
  abvPctVol: number
  residualSugarGL: number
  servingTempC: number
  volumeMl: number
  /** Glass wall angle from horizontal, degrees; the model's default glass when absent. */
  wallAngleDeg?: number
  /** Inside diameter of the glass's bowl, mm (how many tears fit around); the model's default when absent. */
  bowlDiameterMm?: number
  /** What the glass holds, as the model sees it (`drinkKindOf` of the product's kind). */
  kind: DrinkKind
  /** The glass's calibration at this venue (`appliedCalibrations`); null or absent: the published defaults. */
  calibration?: AppliedCalibration | null
}

export interface PourFacts {
  ethanolGrams: number
  standardDrinks: number
  filmActivityIndex: number
  film: FilmResult
}

/**
 * Everything the glass model says about one pour in this room's air, under the venue's
 * standard-drink definition. Derived on every read from the current numbers, never stored, so it
 * cannot go stale.
 */
export function pourFacts(p: PourNumbers, venue: Pick<Venue, 'standardDrinkGrams'>, room: RoomAir): PourFacts {
  const film = filmFor(p, room)
  const grams = ethanolGrams(p.volumeMl, p.abvPctVol)
  return { ethanolGrams: grams, standardDrinks: grams / venue.standardDrinkGrams, filmActivityIndex: film.filmActivityIndex, film }
}

/**
 * computeFilm memoised by its inputs, every one of them in the key (a pure function, so a cached
 * result can never go stale). Bounded: the oldest entries go first past FILM_CACHE_MAX.
 */
const FILM_CACHE_MAX = 20_000
const filmCache = new Map<string, FilmResult>()
function filmFor(p: PourNumbers, room: RoomAir): FilmResult {
  const { abvPctVol, servingTempC: tempC, residualSugarGL: sugarGL, wallAngleDeg, bowlDiameterMm, kind } = p
  // The pour's volume sets how fast it loses its alcohol; clamp to the model's range (5–500 mL).
  const pourVolumeMl = Math.min(500, Math.max(5, p.volumeMl))
  const calibration = p.calibration ?? null
  const c = calibration
  const calibrationKey = c ? `${c.parameters.exchangeFactor},${c.parameters.massTransferFactor},${c.sdLn.exchangeFactor},${c.sdLn.massTransferFactor},${c.correlation ?? ''},${c.observations}` : ''
  const key = `${abvPctVol}|${tempC}|${sugarGL}|${wallAngleDeg ?? ''}|${bowlDiameterMm ?? ''}|${pourVolumeMl}|${kind}|${room.relativeHumidityPct}|${room.airTempC}|${calibrationKey}`
  let film = filmCache.get(key)
  if (!film) {
    film = computeFilm({ abvPctVol, tempC, sugarGL, wallAngleDeg, bowlDiameterMm: bowlDiameterMm === undefined ? undefined : Math.min(150, Math.max(30, bowlDiameterMm)), pourVolumeMl, kind, room: { relativeHumidityPct: room.relativeHumidityPct, airTempC: room.airTempC } }, { calibration })
    if (filmCache.size >= FILM_CACHE_MAX) filmCache.delete(filmCache.keys().next().value!)
    filmCache.set(key, film)
  }
  return film
}
