/**
 * The colour of what is in the glass, in the words the trade writes on a tasting sheet, from
 * colourless new-make spirit to near-black stout. Each word carries the fill the glass drawing
 * paints the liquid with (shared/glassDrawing.ts): a mid-depth tone of the colour as it looks in a
 * tasting glass against white (common practice, no source; chosen by eye against the words' usual
 * meaning). A product's colour is chosen by the manager or the lab sheet; a product without one is
 * drawn in its kind's usual colour (DEFAULT_COLOUR_BY_KIND).
 */
import type { ProductKind } from './products'

export const LIQUID_COLOURS = [
  'water_white', 'pale_straw', 'straw', 'gold', 'deep_gold', 'amber', 'copper', 'mahogany',
  'pale_pink', 'salmon', 'ruby', 'garnet', 'deep_garnet', 'tawny', 'brown', 'black',
] as const
export type LiquidColour = (typeof LIQUID_COLOURS)[number]

export const LIQUID_COLOUR_LABELS: Record<LiquidColour, string> = {
  water_white: 'Water-white',
  pale_straw: 'Pale straw',
  straw: 'Straw',
  gold: 'Gold',
  deep_gold: 'Deep gold',
  amber: 'Amber',
  copper: 'Copper',
  mahogany: 'Mahogany',
  pale_pink: 'Pale pink',
  salmon: 'Salmon',
  ruby: 'Ruby',
  garnet: 'Garnet',
  deep_garnet: 'Deep garnet',
  tawny: 'Tawny',
  brown: 'Brown',
  black: 'Near black',
}

/** The liquid's fill, sRGB hex, and how opaque a pour of it looks in the glass (0–1). */
export const LIQUID_COLOUR_FILL: Record<LiquidColour, { hex: string, opacity: number }> = {
  water_white: { hex: '#e8eef0', opacity: 0.55 },
  pale_straw: { hex: '#efe3a4', opacity: 0.7 },
  straw: { hex: '#e6cf78', opacity: 0.75 },
  gold: { hex: '#d9ad45', opacity: 0.8 },
  deep_gold: { hex: '#c8922b', opacity: 0.82 },
  amber: { hex: '#b8741f', opacity: 0.85 },
  copper: { hex: '#a85a2a', opacity: 0.85 },
  mahogany: { hex: '#6e3420', opacity: 0.9 },
  pale_pink: { hex: '#f1c3bd', opacity: 0.7 },
  salmon: { hex: '#e89a84', opacity: 0.78 },
  ruby: { hex: '#8e1b2e', opacity: 0.88 },
  garnet: { hex: '#7a1f2b', opacity: 0.9 },
  deep_garnet: { hex: '#531420', opacity: 0.93 },
  tawny: { hex: '#9c5a2e', opacity: 0.88 },
  brown: { hex: '#5b3519', opacity: 0.92 },
  black: { hex: '#1f1410', opacity: 0.96 },
}

/** A product's colour when none is set: its kind's most usual one (common practice, no source). */
export const DEFAULT_COLOUR_BY_KIND: Record<ProductKind, LiquidColour> = {
  still_wine: 'straw',
  sparkling: 'pale_straw',
  fortified: 'tawny',
  spirit: 'amber',
  beer: 'gold',
  cider: 'gold',
  low_alcohol: 'pale_straw',
  other: 'straw',
}

export function liquidColourOf(product: { kind: ProductKind, colour?: LiquidColour | null }): LiquidColour {
  return product.colour ?? DEFAULT_COLOUR_BY_KIND[product.kind]
}
