/**
 * One pour's glass in the card's row of glasses: the outer part of the right half of the shared
 * glass drawing (the wall the band climbs), scaled to a given height so that every glass on
 * the card reads at the same size whatever its shape. Vectors only.
 */
import { cardGlassCrop } from '../../shared/cardGlass'
import type { CardPour } from '../../shared/types/cards'

const AMBER = '#c98a2b'
const FILM = '#e0a54a'
const RIDGE = '#8a5a12'
const OUTLINE = '#3d464b'

const crop = cardGlassCrop

/** Width the glass takes at `height` points tall. */
export function cardGlassWidth(pour: CardPour, height: number): number {
  const c = crop(pour)
  return (c.width / c.height) * height
}

export function drawCardGlass(doc: PDFKit.PDFDocument, pour: CardPour, x: number, y: number, width: number, height: number) {
  const { g, x: cx, width: cw, height: ch } = crop(pour)
  const scale = Math.min(width / cw, height / ch)
  doc.save()
  doc.rect(x, y, width, height).clip()
  doc.translate(x - cx * scale, y).scale(scale)
  doc.path(g.liquidPath).fillOpacity(0.45).fill(AMBER)
  if (g.swirl) doc.path(g.swirl.curtainRight).fillOpacity(0.3).fill(FILM)
  for (const ring of g.rings) doc.moveTo(ring.x1, ring.y).lineTo(ring.x2, ring.y).lineWidth(g.stroke * 1.6).strokeOpacity(1).strokeColor('#cdb88f').stroke()
  if (g.band) doc.path(g.band.right).fillOpacity(0.75).fill(FILM)
  doc.fillOpacity(0.85)
  for (const t of g.tears) doc.ellipse(t.x, t.y, t.rx, t.ry).fill(RIDGE)
  doc.fillOpacity(1)
  doc.path(g.outline).lineWidth(g.stroke).strokeColor(OUTLINE).stroke()
  doc.restore()
}
