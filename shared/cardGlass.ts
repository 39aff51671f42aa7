/**
 * The part of a pour's glass drawing the flight card shows in its row of glasses: the outer part
 * of the right half (the wall the band climbs, its tears and the liquid beside it), so that six
 * glasses of any shape stand side by side at the card's glass height. The PDF
 * (server/cards/cardGlass.ts) and the print page (components/card/CardGlass.vue) crop alike.
 */
import { glassDiagramGeometry } from './glassDiagram'
import type { CardPour } from './types/cards'

export function cardGlassCrop(pour: Pick<CardPour, 'glass' | 'prediction'>) {
  const g = glassDiagramGeometry(pour.glass, pour.prediction)
  const [, , , height] = g.viewBox.split(' ').map(Number) as [number, number, number, number]
  const r = pour.glass.bowlDiameterMm / 2
  // From a third of the way out from the axis to just past the wall.
  const x = 6 + r * 1.35
  const width = r * 0.65 + 6
  return { g, x, width, height, viewBox: `${x.toFixed(1)} 0 ${width.toFixed(1)} ${height.toFixed(1)}` }
}
