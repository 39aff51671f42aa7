import type { FlightStatus } from '../flights'
import type { LiquidColour } from '../liquidColours'
import type { Allergen, ProductKind, ProductStatus } from '../products'
import type { FilmResult } from '../science'
import type { ImageView, RenderedText, ShownImage } from './content'
import type { PublicSession } from './sessions'

/** A glass shape as the diagram and the glass model read it (GET /api/glasses). */
export interface GlassView { id: number, name: string, bowlDiameterMm: number, wallAngleDeg: number, fillHeightMm: number }

/** One pour of a flight with everything the glass model says about it. */
export interface FlightPourView {
  position: number
  productId: number
  product: { code: string, name: string, kind: ProductKind, producer: string, vintageOrBatch: string | null, colour: LiquidColour | null, allergens: Allergen[], status: ProductStatus }
  abvPctVol: number
  residualSugarGL: number
  /** Calendar date of the lab measurement used, YYYY-MM-DD. */
  measuredOn: string
  volumeMl: number
  servingTempC: number
  note: string | null
  glass: GlassView
  ethanolGrams: number
  standardDrinks: number
  filmActivityIndex: number
  film: FilmResult
  /** The product's published tasting note (drafts never reach guests or cards). */
  tastingNote: RenderedText | null
  photo: ImageView | null
}

/** A flight's totals per guest against the venue's per-guest limit. */
export interface FlightTotalsView { volumeMl: number, ethanolGrams: number, standardDrinks: number, limitGrams: number, overLimit: boolean }

/** Live figures for pours being edited (POST /api/flights/preview). */
export interface FlightPreview { pours: FlightPourView[], totals: FlightTotalsView }

/** A whole flight (GET /api/flights/[id]; the builder's save, publish and other actions answer it too). */
export interface FlightView extends FlightPreview {
  id: number
  lineageId: number
  version: number
  name: string
  summary: string
  /** Marketing's published introduction. */
  intro: RenderedText | null
  status: FlightStatus
  publishedAt: string | null
  updatedAt: string
  sessionCount: number
  /** Published or retired with sessions: its pours are fixed; a change needs a new version. */
  locked: boolean
}

/** A flight on the staff list (GET /api/flights): its pours in brief. */
export interface FlightListItem extends Omit<FlightView, 'pours'> {
  pourCount: number
  pours: { position: number, name: string, kind: ProductKind, abvPctVol: number, filmActivityIndex: number }[]
}

/** A flight on the public list (GET /api/flights/published). */
export interface PublishedFlight {
  id: number
  name: string
  summary: string
  pourCount: number
  kinds: ProductKind[]
  standardDrinks: number
  priceFromMinor: number | null
  currency: string
  nextSessions: PublicSession[]
  sessionCount: number
  /** Shortest and longest session open for booking, minutes; null without sessions. */
  lengthMinutes: { min: number, max: number } | null
  /** The pours' photos in pour order (those that have one): the flight's line-up and link previews. */
  photos: ImageView[]
}

/**
 * One pour as the public flight page shows it: the flight view's pour without the model's
 * intermediate quantities (only the room it assumed and its predictions) and with the tasting note
 * as HTML only. shared/flightPage.ts makes it.
 */
export interface GuestPour extends Omit<FlightPourView, 'film' | 'tastingNote' | 'note' | 'measuredOn' | 'productId' | 'residualSugarGL' | 'ethanolGrams' | 'product' | 'glass' | 'photo'> {
  product: Omit<FlightPourView['product'], 'code' | 'status'>
  glass: Omit<GlassView, 'id'>
  photo: ShownImage | null
  film: { inputs: Pick<FilmResult['inputs'], 'room'>, predictions: GuestPrediction }
  tastingNote: { html: string } | null
}

/** The predictions the guest's pour shows: the glass drawing's, the tear figures' and the index meter's. */
export type GuestPrediction = Pick<FilmResult['predictions'], 'tearsExpected' | 'bandVisible' | 'suppressedBy' | 'climbFlux_mm2_s'
  | 'clearBandHeight_mm' | 'meniscusHeight_mm' | 'tearWidth_mm' | 'tearFallSpeed_mm_s' | 'tearSpacing_mm' | 'tearsAround'> & {
    ranges: Omit<FilmResult['predictions']['ranges'], 'filmThickness_um'>
  }

/** The public flight page's data (shared/flightPage.ts): what the page shows, no more. */
export interface GuestFlight {
  id: number
  name: string
  summary: string
  /** Marketing's introduction as HTML, and the first 200 characters of its text for the page's description. */
  intro: { html: string, text: string } | null
  totals: Pick<FlightTotalsView, 'volumeMl' | 'ethanolGrams' | 'standardDrinks'>
  pours: GuestPour[]
}
