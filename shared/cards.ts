/**
 * The one description of a flight card, used by the PDF and by the print page alike: what each
 * pour is, how much ethanol it holds, what the glass model predicts and what to look for.
 * Pure: the caller loads the flight and the venue.
 */
import { rangeText, type FilmResult, type RoomAir } from './science'
import { flightContrasts } from './flightContrast'
import { formatTemperature, formatVolume } from './pours'
import { PRODUCT_KIND_LABELS, type Allergen, type ProductKind } from './products'
import type { GlassShape } from './glassDrawing'
import { liquidColourOf, type LiquidColour } from './liquidColours'
import type { CardFigures, CardRoom, FlightCard } from './types/cards'
import { cautionLines } from './cautions'
import { standardDrinkDefinition } from './utils/drinks'
import { venueCardPaper, type CardPaper } from './paper'
import type { RenderedText } from './types/content'
import { calibrationCardLine } from './calibrationText'

export interface CardVenue {
  name: string
  address: string
  cautions: string
  legalAge: number
  volumeUnit: 'ml' | 'floz'
  temperatureUnit: 'c' | 'f'
  standardDrinkKind: string
  standardDrinkGrams: number
  timeZone: string
  country: string
  cardPaper: CardPaper | null
}

export interface CardPourInput {
  position: number
  product: { name: string, kind: ProductKind, producer: string, vintageOrBatch: string | null, allergens: Allergen[], colour: LiquidColour | null }
  abvPctVol: number
  residualSugarGL: number
  volumeMl: number
  servingTempC: number
  glass: GlassShape
  ethanolGrams: number
  standardDrinks: number
  filmActivityIndex: number
  film: FilmResult
  /** The product's published tasting note. */
  tastingNote?: RenderedText | null
}

export interface CardFlightInput {
  id: number
  name: string
  version: number
  summary: string
  pours: CardPourInput[]
  totals: { ethanolGrams: number, standardDrinks: number, volumeMl: number }
  /** Marketing's published introduction. */
  intro?: RenderedText | null
}

/** The room's air the caller computed the pours for: the session's reading, or the venue's usual one. */
export interface CardRoomInput {
  air: RoomAir
  source: CardRoom['source']
  readAt: Date | string | null
}

/** "Room: 70 °F, 62 % RH — read for this session": the one line a card prints about the air it assumed. */
function cardRoom(room: CardRoomInput, temperatureUnit: 'c' | 'f'): CardRoom {
  const { relativeHumidityPct, airTempC } = room.air
  const why = room.source === 'session' ? 'read for this session' : 'the room\'s usual air'
  return {
    relativeHumidityPct,
    airTempC,
    source: room.source,
    readAt: room.readAt === null ? null : new Date(room.readAt).toISOString(),
    text: `Room: ${formatTemperature(airTempC, temperatureUnit)}, ${Math.round(relativeHumidityPct)} % RH — ${why}`,
  }
}

/** The card's margin on every side, points (the PDF's page margin and the print page's @page margin). */
export const CARD_MARGIN_PT = 14

/**
 * The card's type sizes, points: never smaller than 9 pt for what a guest reads at the table and
 * 8.5 pt for the note and the fine print, so that a card reads in a dim room (the PDF and the print
 * page both use these).
 */
export const CARD_TYPE_PT = { venue: 8.5, title: 17, sub: 9.5, body: 9, pourTitle: 10.5, note: 8.5, fine: 8.5 } as const

/** Height of each glass in the card's row of glasses, mm (at least 30 mm, so a guest can read it). */
export const CARD_GLASS_MM = 30

/**
 * How a card is fitted to its page, tried in order until it fits (both the PDF and the print page
 * walk this list). The type never shrinks below CARD_TYPE_PT: first the note's lists run on
 * ("• pear  • quince") instead of one item a line, then the lines close up a little, then the
 * explanation of why tears form is left to the pour pages the QR code opens, then the space between
 * blocks halves. Past the last step the card flows onto a second page.
 */
export interface CardFit { compactLists: boolean, leading: number, why: boolean, /** × the space between blocks */ gaps: number }
export const CARD_FIT_STEPS: readonly CardFit[] = [
  { compactLists: false, leading: 1.18, why: true, gaps: 1 },
  { compactLists: true, leading: 1.18, why: true, gaps: 1 },
  { compactLists: true, leading: 1.12, why: true, gaps: 1 },
  { compactLists: true, leading: 1.18, why: false, gaps: 1 },
  { compactLists: true, leading: 1.12, why: false, gaps: 1 },
  { compactLists: true, leading: 1.08, why: false, gaps: 1 },
  { compactLists: true, leading: 1.08, why: false, gaps: 0.5 },
]

const ALLERGEN_LABELS: Record<Allergen, string> = {
  sulfites: 'sulfites', gluten: 'gluten', milk: 'milk', egg: 'egg', fish: 'fish', nuts: 'tree nuts', soy: 'soy', celery: 'celery',
  mustard: 'mustard', sesame: 'sesame', lupin: 'lupin', molluscs: 'molluscs', crustaceans: 'crustaceans', peanuts: 'peanuts',
}

/** Why it happens, said once per card (each pour's own numbers are in its lines). */
const CARD_WHY = 'Why: ethanol leaves the thin film on the glass faster than water, so the film\'s surface tension rises above the rest of the pour. That pull draws liquid up the wall (the Gibbs–Marangoni effect) until the ridge at the top grows too heavy and falls back as tears. The ranges are for a clean glass in still air in this room; a draught or traces of detergent change them.'

/** How to use the millimetre scale printed along the card's edge. */
const CARD_RULER_HINT = 'Millimetres: hold this edge against the glass, 0 at the liquid\'s surface, and read where the clear band ends.'

/** A whole-number range for counts: "22–24", "20". */
function countRange(r: { low: number, high: number } | null, central: number | null): string {
  const lo = Math.max(1, Math.round(r?.low ?? central ?? 0))
  const hi = Math.max(lo, Math.round(r?.high ?? central ?? 0))
  return lo === hi ? `${lo}` : `${lo}–${hi}`
}

/** A range without its unit ("4.7–6.2"; "9" when both ends round alike). */
function bare(r: { low: number, high: number } | null, central: number | null): string {
  const v = r ?? (central === null ? null : { low: central, high: central })
  return v ? rangeText(v, '').replace(/^about /, '') : '—'
}

/**
 * What the card's table under the glasses prints for a pour: the band's height, when tears come
 * after a swirl, how many run around the glass and how fast they slide, each as its predicted
 * range without the unit (the row names it). A pour that shows no tears says what it shows instead.
 */
function cardFigures(film: FilmResult): CardFigures {
  const p = film.predictions
  const r = p.ranges
  if (p.suppressedBy === 'foam') return { band: 'foam', onset: '—', around: '—', speed: '—' }
  if (!p.tearsExpected || p.tearFallSpeed_mm_s === null) return { band: 'none', onset: '—', around: '—', speed: '—' }
  return {
    band: p.bandVisible ? bare(r.clearBandHeight_mm, p.clearBandHeight_mm) : 'low',
    onset: p.bandVisible ? bare(r.tearOnset_s, p.tearOnset_s) : 'swirl',
    around: countRange(r.tearsAround, p.tearsAround),
    speed: bare(r.tearFallSpeed_mm_s, p.tearFallSpeed_mm_s),
  }
}

/**
 * `room` is the air the flight's pours were computed for (the caller passes the same one to the
 * glass model), so what the card says it assumed is what its figures assume.
 */
export function buildFlightCard(opts: { venue: CardVenue, flight: CardFlightInput, publicUrl: string, room: CardRoomInput, guestName?: string | null, sessionLabel?: string | null, sessionId?: number | null }): FlightCard {
  const { venue, flight } = opts
  // A session's card ties what its guests record on the pour pages to that session (?s=).
  const tie = opts.sessionId ? `?s=${opts.sessionId}` : ''
  const contrasts = new Map(flightContrasts(flight.pours.map(p => ({ position: p.position, film: p.film }))).map(c => [c.position, c]))
  const pours = flight.pours.map((p) => {
    const contrast = contrasts.get(p.position)
    return {
      position: p.position,
      name: p.product.name,
      kind: PRODUCT_KIND_LABELS[p.product.kind],
      producer: p.product.producer,
      vintageOrBatch: p.product.vintageOrBatch,
      abvText: `${p.abvPctVol}\u00a0% ABV`,
      volumeText: formatVolume(p.volumeMl, venue.volumeUnit),
      servedAtText: formatTemperature(p.servingTempC, venue.temperatureUnit),
      ethanolGrams: round(p.ethanolGrams, 1),
      standardDrinks: round(p.standardDrinks, 2),
      filmActivityIndex: round(p.filmActivityIndex, 1),
      glass: p.glass,
      colour: liquidColourOf(p.product),
      prediction: p.film.predictions,
      figures: cardFigures(p.film),
      contrast: contrast ? [contrast.text, contrast.also].filter(Boolean).join(' ') : null,
      tastingNote: p.tastingNote ?? null,
      allergens: p.product.allergens.map(a => ALLERGEN_LABELS[a]),
      pourUrl: `${opts.publicUrl}/${p.position}${tie}`,
    }
  })
  return {
    venue: { name: venue.name, address: venue.address, legalAge: venue.legalAge },
    flight: { id: flight.id, name: flight.name, version: flight.version, summary: flight.summary },
    intro: flight.intro ?? null,
    guestName: opts.guestName ?? null,
    sessionLabel: opts.sessionLabel ?? null,
    pours,
    totals: {
      ethanolGrams: round(flight.totals.ethanolGrams, 1),
      standardDrinks: round(flight.totals.standardDrinks, 1),
      volumeText: formatVolume(flight.totals.volumeMl, venue.volumeUnit),
      definition: standardDrinkDefinition(venue),
    },
    room: cardRoom(opts.room, venue.temperatureUnit),
    calibration: calibrationCardLine(flight.pours.map(p => ({ position: p.position, glass: p.glass.name, calibration: p.film.calibration }))),
    why: CARD_WHY,
    quality: 'Tears say nothing about quality: alcohol and evaporation make them; sugar only slows them.',
    // The fixed block of responsible service (a manager cannot remove it), then the venue's own lines.
    // The flight's standard drinks are the card's own total line, so the cautions do not repeat them.
    cautions: cautionLines(venue, { short: true }),
    ruler: CARD_RULER_HINT,
    paper: venueCardPaper(venue),
    qrUrl: `${opts.publicUrl}${tie}`,
  }
}

function round(v: number, digits: number) {
  const f = 10 ** digits
  return Math.round(v * f) / f
}
