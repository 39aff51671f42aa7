/**
 * The one description of a flight card, used by the PDF and by the print page alike: what each
 * pour is, how much ethanol it holds, what the glass model predicts and what to look for.
 * Pure: the caller loads the flight and the venue.
 */
import { describePour, type FilmResult, type RoomAir } from './science'
import { formatTemperature, formatVolume } from './pours'
import { PRODUCT_KIND_LABELS, type Allergen, type ProductKind } from './products'
import type { GlassShape } from './glassDrawing'
import { liquidColourOf, type LiquidColour } from './liquidColours'
import type { CardRoom, FlightCard } from './types/cards'
import { cautionLines } from './cautions'
import { standardDrinkDefinition, standardDrinksLine } from './utils/drinks'
import type { RenderedText } from './types/content'

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
export const CARD_MARGIN_PT = 22

/**
 * How a card is fitted to its page, tried in order until it fits (both the PDF and the print page
 * walk this list): the type scale, and whether a note's lists run on ("• pear  • quince") instead of
 * one item a line. Past the last step the card flows onto a second page.
 */
export interface CardFit { scale: number, compactLists: boolean }
export const CARD_FIT_STEPS: readonly CardFit[] = [
  { scale: 1, compactLists: false },
  { scale: 0.95, compactLists: false },
  { scale: 0.95, compactLists: true },
  { scale: 0.9, compactLists: true },
  { scale: 0.86, compactLists: true },
]

const ALLERGEN_LABELS: Record<Allergen, string> = {
  sulfites: 'sulfites', gluten: 'gluten', milk: 'milk', egg: 'egg', fish: 'fish', nuts: 'tree nuts', soy: 'soy', celery: 'celery',
  mustard: 'mustard', sesame: 'sesame', lupin: 'lupin', molluscs: 'molluscs', crustaceans: 'crustaceans', peanuts: 'peanuts',
}

/** Why it happens, said once per card (each pour's own numbers are in its lines). */
const CARD_WHY = 'Why: ethanol leaves the thin film on the glass faster than water, so the film turns more watery and its surface tension rises above the rest of the pour. That stronger pull draws liquid up the wall (the Gibbs–Marangoni effect) until the ridge at the top grows too heavy and falls back as tears. The ranges are for a clean glass in still air in this room; a draught or traces of detergent change them.'

/**
 * `room` is the air the flight's pours were computed for (the caller passes the same one to the
 * glass model), so what the card says it assumed is what its figures assume.
 */
export function buildFlightCard(opts: { venue: CardVenue, flight: CardFlightInput, publicUrl: string, room: CardRoomInput, guestName?: string | null, sessionLabel?: string | null }): FlightCard {
  const { venue, flight } = opts
  const tempUnit = venue.temperatureUnit === 'f' ? 'F' : 'C'
  const pours = flight.pours.map((p) => {
    const lines = describePour(p.film, { temperatureUnit: tempUnit, brief: true })
    // Each pour keeps its own sentences; the "Why" and the quality sentence are said once per card.
    // The card already states the strength and temperature, so "At 12 % ABV and 50 °F, swirl…"
    // becomes "Swirl…".
    const lookFor = lines.slice(0, -1).filter(l => !l.startsWith('Why:'))
      .map(l => l.replace(/^At [\d.]+\u00a0% ABV and -?[\d.]+\u00a0°[CF],? (\w)/, (_, c: string) => c.toUpperCase()))
    return {
      position: p.position,
      name: p.product.name,
      kind: PRODUCT_KIND_LABELS[p.product.kind],
      producer: p.product.producer,
      vintageOrBatch: p.product.vintageOrBatch,
      abvText: `${p.abvPctVol} % ABV`,
      volumeText: formatVolume(p.volumeMl, venue.volumeUnit),
      servedAtText: formatTemperature(p.servingTempC, venue.temperatureUnit),
      ethanolGrams: round(p.ethanolGrams, 1),
      standardDrinks: round(p.standardDrinks, 2),
      filmActivityIndex: round(p.filmActivityIndex, 1),
      glass: p.glass,
      colour: liquidColourOf(p.product),
      prediction: p.film.predictions,
      lookFor,
      tastingNote: p.tastingNote ?? null,
      allergens: p.product.allergens.map(a => ALLERGEN_LABELS[a]),
      pourUrl: `${opts.publicUrl}/${p.position}`,
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
    why: CARD_WHY,
    quality: 'Tears say nothing about quality: they come from alcohol and evaporation. Sugar slows them; it does not make them.',
    // The fixed block of responsible service (a manager cannot remove it), then the venue's own lines.
    cautions: cautionLines(venue, { standardDrinksLine: standardDrinksLine('flight', flight.totals.standardDrinks, venue) }),
    qrUrl: opts.publicUrl,
  }
}

function round(v: number, digits: number) {
  const f = 10 ** digits
  return Math.round(v * f) / f
}
