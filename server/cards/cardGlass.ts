/**
 * One pour's glass in the card's row of glasses: the crop of the shared glass drawing that
 * shared/cardGlass.ts chooses, drawn with the drawing's own PDF renderer (pdfDrawing.ts), scaled
 * to a given height so every glass on the card reads at the same size whatever its shape.
 */
import { cardGlassCrop } from '../../shared/cardGlass'
import type { CardPour } from '../../shared/types/cards'
import { drawGlassPdf } from './pdfDrawing'

/**
 * The crop of each pour's drawing, by what it is drawn from (and by the pour object, which a
 * session's cards share): a card asks for it twice per pour. Bounded: cleared when full.
 */
const crops = new Map<string, ReturnType<typeof cardGlassCrop>>()
const CROPS_MAX = 500

const cropOfPour = new WeakMap<CardPour, ReturnType<typeof cardGlassCrop>>()

function cropOf(pour: CardPour) {
  let crop = cropOfPour.get(pour)
  if (crop) return crop
  const key = JSON.stringify([pour.glass, pour.prediction, pour.colour, pour.name])
  crop = crops.get(key)
  if (!crop) {
    crop = cardGlassCrop(pour)
    if (crops.size >= CROPS_MAX) crops.clear()
    crops.set(key, crop)
  }
  cropOfPour.set(pour, crop)
  return crop
}

/** Width the glass takes at `height` points tall. */
export function cardGlassWidth(pour: CardPour, height: number): number {
  const c = cropOf(pour)
  return (c.width / c.height) * height
}

export function drawCardGlass(doc: PDFKit.PDFDocument, pour: CardPour, x: number, y: number, width: number, height: number) {
  const c = cropOf(pour)
  const scale = Math.min(width / c.width, height / c.height)
  doc.save()
  doc.rect(x, y, c.width * scale, c.height * scale).clip()
  // drawGlassPdf puts the whole drawing's box at (x, y); shift it so the crop's left edge lands there.
  drawGlassPdf(doc, c.drawing, { x: x - (c.x - c.drawing.viewBox.x) * scale, y, height: c.height * scale })
  doc.restore()
}
