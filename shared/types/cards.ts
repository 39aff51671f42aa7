import type { GlassShape } from '../glassDrawing'
import type { LiquidColour } from '../liquidColours'
import type { RoomAir, TearPrediction } from '../science'
import type { ImageView, RenderedText } from './content'
import type { CardPaper } from '../paper'

/**
 * A pour's predicted figures as the card's table prints them, ranges without units (the rows name
 * them): band height mm, tears after s, tears around the glass, sliding speed mm/s. A pour without
 * a band says 'low' (legs from the swirl), 'none' or 'foam'; '—' where a figure does not apply.
 */
export interface CardFigures { band: string, onset: string, around: string, speed: string }

/** One pour's lines on a flight card. */
export interface CardPour {
  position: number
  name: string
  kind: string
  producer: string
  vintageOrBatch: string | null
  abvText: string
  volumeText: string
  servedAtText: string
  ethanolGrams: number
  standardDrinks: number
  filmActivityIndex: number
  glass: GlassShape
  /** The liquid's colour: the product's, or its kind's usual one. */
  colour: LiquidColour
  prediction: TearPrediction
  /** The predicted figures the card's table prints under the pour's glass. */
  figures: CardFigures
  /** What sets this pour apart within its flight, with the prediction's range (shared/flightContrast.ts); null for a flight of one. */
  contrast: string | null
  /** The product's published tasting note: HTML for the print page, blocks for the PDF. */
  tastingNote: RenderedText | null
  allergens: string[]
  pourUrl: string
}

/** The room's air a card's predictions assume, and the line the card prints about it. */
export interface CardRoom {
  relativeHumidityPct: number
  /** °C to a tenth. */
  airTempC: number
  /** 'session': the host read the room for this session; 'venue': the venue's usual reading. */
  source: 'session' | 'venue'
  /** When the host read it (UTC, ISO 8601); null for the venue's usual reading. */
  readAt: string | null
  /** "Room: 70 °F, 62 % RH (read at 1:40 PM)", in the venue's temperature unit and clock. */
  text: string
}

/**
 * A flight card: the one description the PDF and the print page both render (shared/cards.ts
 * builds it; GET /api/cards/flights/[id], and per seated guest in a session's cards).
 */
export interface FlightCard {
  venue: { name: string, address: string, legalAge: number }
  flight: { id: number, name: string, version: number, summary: string }
  /** Marketing's published introduction to the flight. */
  intro: RenderedText | null
  guestName: string | null
  sessionLabel: string | null
  pours: CardPour[]
  totals: { ethanolGrams: number, standardDrinks: number, volumeText: string, definition: string }
  /** The room's air every pour's figures on this card were computed for. */
  room: CardRoom
  /** Which pours' figures are tuned by this venue's readings (shared/calibrationText.ts); null: all published defaults. */
  calibration: string | null
  why: string
  quality: string
  cautions: string[]
  /** How to read the band off the millimetre scale along the card's edge. */
  ruler: string
  /** The paper the venue prints its cards on unless the host picks another (shared/paper.ts). */
  paper: CardPaper
  qrUrl: string
}

/** Every seated guest's card for one session (GET /api/cards/sessions/[id]). */
export interface SessionCards { sessionId: number, cards: FlightCard[] }

/** One pour explained, as a card's QR code opens it (GET /api/pours/[flightId]/[position]). */
export interface PourPage {
  venue: { name: string, temperatureUnit: 'c' | 'f' }
  flight: { id: number, name: string, pourCount: number }
  /** The flight's published introduction. */
  intro: RenderedText | null
  pour: CardPour
  photo: ImageView | null
  description: string[]
  /** One sentence when this glass's figures are tuned by the venue's readings; null on the defaults. */
  calibration: string | null
  /** The room's air the pour's predictions and description were computed for (the film's own input). */
  room: RoomAir
  servingTempC: number
  residualSugarGL: number
  abvPctVol: number
  viscosity_mPa_s: number
  surfaceTensionBulk_mN_m: number
  surfaceTensionFilm_mN_m: number
}
