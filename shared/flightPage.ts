import type { FlightPourView, FlightView, GuestFlight, GuestPour, GuestPrediction } from './types/flights'
import type { ListedSession, PublicSession } from './types/sessions'

/** Significant digits the guest page keeps of the model's predictions: more than any figure it prints. */
const SIGNIFICANT = 4

/** Every number in a plain value rounded to `digits` significant digits (others left as they are). */
export function roundSignificant<T>(value: T, digits = SIGNIFICANT): T {
  if (typeof value === 'number') return (Number.isFinite(value) && value !== 0 ? Number(value.toPrecision(digits)) : value) as T
  if (Array.isArray(value)) return value.map(v => roundSignificant(v, digits)) as T
  if (value && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, roundSignificant(v, digits)])) as T
  return value
}

function shownPrediction(p: FlightPourView['film']['predictions']): GuestPrediction {
  return {
    tearsExpected: p.tearsExpected, bandVisible: p.bandVisible, suppressedBy: p.suppressedBy, climbFlux_mm2_s: p.climbFlux_mm2_s,
    clearBandHeight_mm: p.clearBandHeight_mm, meniscusHeight_mm: p.meniscusHeight_mm, tearWidth_mm: p.tearWidth_mm,
    tearFallSpeed_mm_s: p.tearFallSpeed_mm_s, tearSpacing_mm: p.tearSpacing_mm, tearsAround: p.tearsAround,
    ranges: { clearBandHeight_mm: p.ranges.clearBandHeight_mm, tearOnset_s: p.ranges.tearOnset_s, tearFallSpeed_mm_s: p.ranges.tearFallSpeed_mm_s, tearsAround: p.ranges.tearsAround, swirlShow_s: p.ranges.swirlShow_s, filmActivityIndex: p.ranges.filmActivityIndex },
  }
}

/**
 * The public flight page's data from the flight view: what the page renders and nothing else, so
 * that its hydration payload stays small (the model's intermediate quantities, the notes' text
 * blocks and the staff's fields stay on the server). Predictions keep 4 significant digits; the page
 * prints 2 at most.
 */
export function guestFlight(view: FlightView): GuestFlight {
  const pours = view.pours.map((p): GuestPour => ({
    position: p.position,
    product: { name: p.product.name, kind: p.product.kind, producer: p.product.producer, vintageOrBatch: p.product.vintageOrBatch, colour: p.product.colour, allergens: p.product.allergens },
    abvPctVol: p.abvPctVol,
    volumeMl: p.volumeMl,
    servingTempC: p.servingTempC,
    glass: { name: p.glass.name, bowlDiameterMm: p.glass.bowlDiameterMm, wallAngleDeg: p.glass.wallAngleDeg, fillHeightMm: p.glass.fillHeightMm },
    standardDrinks: roundSignificant(p.standardDrinks),
    filmActivityIndex: roundSignificant(p.filmActivityIndex),
    film: { inputs: { room: p.film.inputs.room }, predictions: roundSignificant(shownPrediction(p.film.predictions)) },
    tastingNote: p.tastingNote ? { html: p.tastingNote.html } : null,
    photo: p.photo ? { src: p.photo.src, width: p.photo.width, height: p.photo.height, altText: p.photo.altText } : null,
  }))
  return {
    id: view.id,
    name: view.name,
    summary: view.summary,
    intro: view.intro ? { html: view.intro.html, text: view.intro.text.slice(0, 200) } : null,
    totals: roundSignificant({ volumeMl: view.totals.volumeMl, ethanolGrams: view.totals.ethanolGrams, standardDrinks: view.totals.standardDrinks }),
    pours,
  }
}

/** A session as the flight page lists it: the flight's name and id are the page's own. */
export function listedSession(s: PublicSession): ListedSession {
  const { flightId: _flight, flightName: _name, startsLocal: _local, ...listed } = s
  return listed
}

/** Sessions the flight page sends with its first render: the next few (the rest come on "Show more"). */
const FLIGHT_PAGE_FIRST_SESSIONS = 6

/** What the flight page says of the sessions on sale: the next few, how many in all, the lowest price and the lengths. */
export interface SessionsOnSale {
  first: ListedSession[]
  count: number
  fromPriceMinor: number | null
  minutes: { min: number, max: number } | null
}

/** The flight page's session summary from every session on sale (the lowest price among those a guest can still book), keeping only the first few whole. */
export function sessionsOnSale(list: PublicSession[], first = FLIGHT_PAGE_FIRST_SESSIONS): SessionsOnSale {
  if (!list.length) return { first: [], count: 0, fromPriceMinor: null, minutes: null }
  const minutes = list.map(s => s.durationMinutes)
  // "From" is what a guest can book now, as the home page's card says it: a full or closed session's
  // price is left out, and with none open there is no "from" price.
  const open = list.filter(s => s.bookable)
  return {
    first: list.slice(0, first).map(listedSession),
    count: list.length,
    fromPriceMinor: open.length ? Math.min(...open.map(s => s.priceMinor)) : null,
    minutes: { min: Math.min(...minutes), max: Math.max(...minutes) },
  }
}
