/**
 * The one description of a flight card, used by the PDF and by the print page alike: what each
 * pour is, how much ethanol it holds, what the glass model predicts and what to look for.
 * Pure: the caller loads the flight and the venue.
 */
import { describePour, type FilmResult } from './science'
import { formatTemperature, formatVolume } from './pours'
import { PRODUCT_KIND_LABELS, type Allergen, type ProductKind } from './products'
import type { GlassShape } from './glassDiagram'
import type { FlightCard } from './types/cards'
import { cautionLines } from './cautions'

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
  product: { name: string, kind: ProductKind, producer: string, vintageOrBatch: string | null, allergens: Allergen[] }
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
  tastingNote?: { html: string, text: string } | null
}

export interface CardFlightInput {
  id: number
  name: string
  version: number
  summary: string
  pours: CardPourInput[]
  totals: { ethanolGrams: number, standardDrinks: number, volumeMl: number }
  intro?: { html: string, text: string } | null
}

const ALLERGEN_LABELS: Record<Allergen, string> = {
  sulfites: 'sulfites', gluten: 'gluten', milk: 'milk', egg: 'egg', fish: 'fish', nuts: 'tree nuts', soy: 'soy', celery: 'celery',
  mustard: 'mustard', sesame: 'sesame', lupin: 'lupin', molluscs: 'molluscs', crustaceans: 'crustaceans', peanuts: 'peanuts',
}

/** Why it happens, said once per card (each pour's own numbers are in its lines). */
const CARD_WHY = 'Why: ethanol leaves the thin film on the glass faster than water, so the film turns more watery and its surface tension rises above the wine\'s. That stronger pull draws liquid up the wall (the Gibbs–Marangoni effect) until the ridge at the top grows too heavy and falls back as tears.'

export function buildFlightCard(opts: { venue: CardVenue, flight: CardFlightInput, publicUrl: string, guestName?: string | null, sessionLabel?: string | null }): FlightCard {
  const { venue, flight } = opts
  const tempUnit = venue.temperatureUnit === 'f' ? 'F' : 'C'
  const pours = flight.pours.map((p) => {
    const lines = describePour(p.film, { temperatureUnit: tempUnit })
    // Each pour keeps its own sentences; the "Why" and the quality sentence are said once per card.
    // The card already states the strength and temperature, so "At 12 % ABV and 50 °F, swirl…"
    // becomes "Swirl…".
    const lookFor = lines.slice(0, -1).filter(l => !l.startsWith('Why:'))
      .map(l => l.replace(/^At [\d.]+ % ABV and -?[\d.]+ °[CF], (\w)/, (_, c: string) => c.toUpperCase()))
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
      prediction: p.film.predictions,
      lookFor,
      tastingNote: p.tastingNote?.text ?? null,
      allergens: p.product.allergens.map(a => ALLERGEN_LABELS[a]),
      pourUrl: `${opts.publicUrl}/${p.position}`,
    }
  })
  return {
    venue: { name: venue.name, address: venue.address, legalAge: venue.legalAge },
    flight: { id: flight.id, name: flight.name, version: flight.version, summary: flight.summary },
    guestName: opts.guestName ?? null,
    sessionLabel: opts.sessionLabel ?? null,
    pours,
    totals: {
      ethanolGrams: round(flight.totals.ethanolGrams, 1),
      standardDrinks: round(flight.totals.standardDrinks, 1),
      volumeText: formatVolume(flight.totals.volumeMl, venue.volumeUnit),
      definition: `one standard drink = ${venue.standardDrinkGrams} g of ethanol`,
    },
    why: CARD_WHY,
    quality: 'Tears say nothing about quality: they come from alcohol and evaporation. Sugar slows them; it does not make them.',
    cautions: cautionLines(venue),
    qrUrl: opts.publicUrl,
  }
}

function round(v: number, digits: number) {
  const f = 10 ** digits
  return Math.round(v * f) / f
}
