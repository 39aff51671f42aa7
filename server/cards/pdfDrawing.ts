/**
 * The glass drawing (shared/glassDrawing.ts) as pdfkit vectors: the same primitives the web pages
 * render as SVG, scaled from millimetres to the height asked for, text in the card's Lora faces.
 */
import type { DrawItem, GlassDrawing } from '../../shared/glassDrawing'
import { FACES } from './pdfText'

function dashOf(doc: PDFKit.PDFDocument, dash: string | undefined) {
  if (!dash) return doc.undash()
  const [on, off] = dash.split(' ').map(Number) as [number, number]
  return doc.dash(on, { space: off ?? on })
}

function drawItem(doc: PDFKit.PDFDocument, it: DrawItem) {
  switch (it.kind) {
    case 'path':
      doc.path(it.d)
      dashOf(doc, it.dash)
      if (it.fill && it.fill !== 'none' && it.stroke) {
        doc.lineWidth(it.strokeWidth ?? 0.3).fillOpacity(it.fillOpacity ?? 1).strokeOpacity(1).fillAndStroke(it.fill, it.stroke)
      }
      else if (it.fill && it.fill !== 'none') doc.fillOpacity(it.fillOpacity ?? 1).fill(it.fill)
      else if (it.stroke) doc.lineWidth(it.strokeWidth ?? 0.3).strokeOpacity(1).stroke(it.stroke)
      break
    case 'ellipse':
      doc.ellipse(it.cx, it.cy, it.rx, it.ry).fillOpacity(it.fillOpacity ?? 1).fill(it.fill)
      break
    case 'line':
      dashOf(doc, it.dash)
      doc.moveTo(it.x1, it.y1).lineTo(it.x2, it.y2).lineCap('round').lineWidth(it.strokeWidth).strokeOpacity(1).stroke(it.stroke)
      break
    case 'text': {
      doc.undash().font(it.weight === 'semibold' ? FACES.bold : FACES.regular).fontSize(it.size).fillOpacity(1).fillColor(it.fill)
      const w = doc.widthOfString(it.text)
      const x = it.anchor === 'start' ? it.x : it.anchor === 'middle' ? it.x - w / 2 : it.x - w
      doc.text(it.text, x, it.y, { lineBreak: false, baseline: 'alphabetic' })
      break
    }
  }
}

/**
 * Draws `drawing` with its box's top left at (x, y) points, `height` points tall (the width follows
 * the drawing's proportions); returns the width drawn, points. The drawing's box allows more
 * width per character than Lora takes, so the labels stay inside it.
 */
export function drawGlassPdf(doc: PDFKit.PDFDocument, drawing: GlassDrawing, at: { x: number, y: number, height: number }): { width: number } {
  const v = drawing.viewBox
  const scale = at.height / v.height
  doc.save()
  doc.translate(at.x, at.y).scale(scale).translate(-v.x, -v.y)
  for (const it of drawing.items) drawItem(doc, it)
  doc.undash().fillOpacity(1).strokeOpacity(1)
  doc.restore()
  return { width: v.width * scale }
}
