/**
 * The part of a pour's glass drawing (shared/glassDrawing.ts) the flight card shows in its row of
 * glasses: from halfway out from the glass's axis to past the right wall, where the band climbs
 * beside its millimetre scale, the tears hang and the liquid shows its colour — so that six glasses of
 * any shape stand side by side at the card's glass height. The PDF (server/cards/cardGlass.ts) and
 * the print page (components/card/CardGlass.vue) crop alike.
 */
import { glassDrawing } from './glassDrawing'
import type { CardPour } from './types/cards'

export function cardGlassCrop(pour: Pick<CardPour, 'glass' | 'prediction' | 'colour' | 'name'>) {
  const drawing = glassDrawing({ glass: pour.glass, prediction: pour.prediction, colour: pour.colour, palette: 'light', label: pour.name, labels: false })
  const v = drawing.viewBox
  // The drawing puts the left wall at x = 0 at the liquid line, so the axis is at the bowl's radius.
  const x = 1.5 * (pour.glass.bowlDiameterMm / 2)
  const width = v.x + v.width - x
  return { drawing, x, y: v.y, width, height: v.height, viewBox: `${x.toFixed(1)} ${v.y.toFixed(1)} ${width.toFixed(1)} ${v.height.toFixed(1)}` }
}
