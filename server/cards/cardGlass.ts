/**
 * One pour's glass in the card's row of glasses: the crop of the shared glass drawing that
 * shared/cardGlass.ts chooses, drawn with the drawing's own PDF renderer (pdfDrawing.ts), scaled
 * to a given height so every glass on the card reads at the same size whatever its shape.
 */
import { cardGlassCrop } from '../../shared/cardGlass'
import type { CardPour } from '../../shared/types/cards'
import { drawGlassPdf } from './pdfDrawing'

/** Width the glass takes at `height` points tall. */
export function cardGlassWidth(pour: CardPour, height: number): number {
  const c = cardGlassCrop(pour)
  return (c.width / c.height) * height
}

export function drawCardGlass(doc: PDFKit.PDFDocument, pour: CardPour, x: number, y: number, width: number, height: number) {
  const c = cardGlassCrop(pour)
  const scale = Math.min(width / c.width, height / c.height)
  doc.save()
  doc.rect(x, y, c.width * scale, c.height * scale).clip()
  // drawGlassPdf puts the whole drawing's box at (x, y); shift it so the crop's left edge lands there.
  drawGlassPdf(doc, c.drawing, { x: x - (c.x - c.drawing.viewBox.x) * scale, y, height: c.height * scale })
  doc.restore()
}
