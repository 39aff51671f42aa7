/**
 * Flight cards as PDF, made with pdfkit and the Lora font shipped with the app (embedded from its
 * .woff files; nothing is fetched at run time). A card of up to six pours fits one A5 or half-letter
 * page; longer ones (or long tasting notes) flow onto a second. Pure: fonts come in as bytes.
 */
import PDFDocument from 'pdfkit'
import QRCode from 'qrcode'
import { glassDiagramGeometry } from '../../shared/glassDiagram'
import type { FlightCard } from '../../shared/types/cards'

export type CardPaper = 'a5' | 'half-letter'
/** A5 is 148 × 210 mm; US half letter is 5.5 × 8.5 in (ISO 216; ANSI/ASME Y14.1), in PDF points. */
const PAPER_POINTS: Record<CardPaper, [number, number]> = { 'a5': [419.53, 595.28], 'half-letter': [396, 612] }
export interface CardFonts { regular: Buffer, semibold: Buffer, italic: Buffer }

const INK = '#1e2326'
const SOFT = '#4a5459'
const FAINT = '#7b868c'
const AMBER = '#c98a2b'
const LAGOON = '#25665f'
const MARGIN = 22
const GLASS_COL = 34
const QR = 54
const GAP = 5

export async function renderCardsPdf(cards: FlightCard[], opts: { paper: CardPaper, fonts: CardFonts, title?: string, onCard?: (done: number, total: number) => void }): Promise<Buffer> {
  const [width, height] = PAPER_POINTS[opts.paper]
  const doc = new PDFDocument({ size: [width, height], margin: MARGIN, autoFirstPage: false, info: { Title: opts.title ?? cards[0]?.flight.name ?? 'Flight cards', Creator: 'Larmoir' } })
  doc.registerFont('Lora', opts.fonts.regular)
  doc.registerFont('Lora-SemiBold', opts.fonts.semibold)
  doc.registerFont('Lora-Italic', opts.fonts.italic)
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))
  // One QR image per distinct URL (a session's cards share it).
  const qrCache = new Map<string, Buffer>()
  for (let i = 0; i < cards.length; i++) {
    const card = cards[i]!
    let qr = qrCache.get(card.qrUrl)
    if (!qr) {
      qr = await QRCode.toBuffer(card.qrUrl, { margin: 1, width: 160, errorCorrectionLevel: 'M' })
      qrCache.set(card.qrUrl, qr)
    }
    drawCard(doc, card, qr, width, height)
    opts.onCard?.(i + 1, cards.length)
    if (i % 5 === 4) await new Promise(r => setImmediate(r))
  }
  doc.end()
  return done
}

type Pour = FlightCard['pours'][number]

/**
 * Each piece of text with its font and size, in drawing order, so that measuring a block and
 * drawing it cannot disagree.
 */
function pourLines(pour: Pour): { font: string, size: number, color: string, text: string, gap: number }[] {
  const detail = [pour.kind, pour.vintageOrBatch, pour.abvText, `${pour.volumeText} at ${pour.servedAtText}`,
    `${pour.ethanolGrams.toFixed(1)} g ethanol = ${pour.standardDrinks.toFixed(2)} standard drinks`].filter(Boolean).join(' · ')
  return [
    { font: 'Lora', size: 6.6, color: SOFT, text: detail, gap: 0.5 },
    { font: 'Lora', size: 6.7, color: INK, text: pour.lookFor.join(' '), gap: 1.5 },
    ...(pour.tastingNote ? [{ font: 'Lora-Italic', size: 7, color: SOFT, text: pour.tastingNote, gap: 1.5 }] : []),
    ...(pour.allergens.length ? [{ font: 'Lora-SemiBold', size: 6.2, color: SOFT, text: `Contains ${pour.allergens.join(', ')}.`, gap: 0.5 }] : []),
  ]
}

function footLines(card: FlightCard): { font: string, size: number, color: string, text: string, gap: number }[] {
  return [
    { font: 'Lora-SemiBold', size: 8.5, color: INK, text: `This flight: ${card.totals.standardDrinks.toFixed(1)} standard drinks — ${card.totals.ethanolGrams.toFixed(1)} g of ethanol in ${card.totals.volumeText} (${card.totals.definition}).`, gap: 0 },
    { font: 'Lora', size: 6.5, color: SOFT, text: card.why, gap: 3 },
    { font: 'Lora-Italic', size: 6.5, color: SOFT, text: card.quality, gap: 1.5 },
    { font: 'Lora', size: 6.5, color: INK, text: card.cautions.join(' '), gap: 3 },
  ]
}

function measure(doc: PDFKit.PDFDocument, lines: ReturnType<typeof pourLines>, width: number): number {
  return lines.reduce((h, l) => h + l.gap + doc.font(l.font).fontSize(l.size).heightOfString(l.text, { width }), 0)
}

function draw(doc: PDFKit.PDFDocument, lines: ReturnType<typeof pourLines>, x: number, y: number, width: number): number {
  for (const l of lines) {
    doc.font(l.font).fontSize(l.size).fillColor(l.color).text(l.text, x, y + l.gap, { width })
    y = doc.y
  }
  return y
}

const TITLE_H = 12

function drawCard(doc: PDFKit.PDFDocument, card: FlightCard, qr: Buffer, width: number, height: number) {
  const inner = width - 2 * MARGIN
  const textX = MARGIN + GLASS_COL + 8
  const textW = inner - GLASS_COL - 8
  const footW = inner - QR - 10
  const footH = Math.max(measure(doc, footLines(card), footW), QR + 10) + 10
  doc.addPage()
  let y = header(doc, card, inner)

  for (const pour of card.pours) {
    const lines = pourLines(pour)
    const blockH = Math.max(TITLE_H + measure(doc, lines, textW), GLASS_COL * 1.05)
    if (y + blockH > height - MARGIN - footH && y + blockH > height - MARGIN) {
      doc.addPage()
      y = MARGIN
    }
    else if (y + blockH > height - MARGIN - footH) {
      // It fits on the page but not above the foot: keep it, and the foot goes on the next page.
    }
    drawGlass(doc, pour, MARGIN, y, GLASS_COL)
    doc.font('Lora-SemiBold').fontSize(10).fillColor(INK).text(`${pour.position}  ${pour.name}`, textX, y, { width: textW - 84, lineBreak: false, ellipsis: true, continued: true })
      .font('Lora').fontSize(6.8).fillColor(SOFT).text(`   ${pour.producer}`, { lineBreak: false, ellipsis: true })
    meter(doc, pour.filmActivityIndex, textX + textW - 76, y + 1)
    const end = draw(doc, lines, textX, y + TITLE_H, textW)
    y = Math.max(end, y + GLASS_COL * 1.05) + GAP
  }

  if (y > height - MARGIN - footH) {
    doc.addPage()
    y = MARGIN
  }
  foot(doc, card, qr, inner, footW, Math.max(y, height - MARGIN - footH))
}

/** "film activity 8.3" and a 0–10 bar, at the right of a pour's title. */
function meter(doc: PDFKit.PDFDocument, value: number, x: number, y: number) {
  doc.font('Lora').fontSize(6.5).fillColor(SOFT).text(`film activity ${value.toFixed(1)}`, x - 6, y + 1, { width: 56, align: 'right', lineBreak: false })
  doc.roundedRect(x + 53, y + 3.2, 23, 2.6, 1.3).fill('#fbefd9')
  doc.roundedRect(x + 53, y + 3.2, Math.max(1, 2.3 * Math.min(10, value)), 2.6, 1.3).fill(AMBER)
}

function header(doc: PDFKit.PDFDocument, card: FlightCard, inner: number): number {
  doc.font('Lora').fontSize(7.5).fillColor(LAGOON).text(card.venue.name.toUpperCase(), MARGIN, MARGIN, { width: inner, characterSpacing: 0.8 })
  doc.font('Lora-SemiBold').fontSize(15).fillColor(INK).text(card.flight.name, MARGIN, doc.y + 1, { width: inner })
  const sub = [card.guestName ? `Poured for ${card.guestName}` : null, card.sessionLabel].filter(Boolean).join(' · ')
  if (sub) doc.font('Lora-Italic').fontSize(8.5).fillColor(SOFT).text(sub, MARGIN, doc.y + 1, { width: inner })
  if (card.flight.summary) doc.font('Lora').fontSize(7.5).fillColor(SOFT).text(card.flight.summary, MARGIN, doc.y + 1, { width: inner })
  const y = doc.y + 5
  doc.moveTo(MARGIN, y).lineTo(MARGIN + inner, y).lineWidth(0.5).strokeColor('#e3ddd2').stroke()
  return y + 7
}

function foot(doc: PDFKit.PDFDocument, card: FlightCard, qr: Buffer, inner: number, footW: number, top: number) {
  doc.moveTo(MARGIN, top).lineTo(MARGIN + inner, top).lineWidth(0.5).strokeColor('#e3ddd2').stroke()
  draw(doc, footLines(card), MARGIN, top + 6, footW)
  doc.image(qr, MARGIN + inner - QR, top + 6, { width: QR, height: QR })
  doc.font('Lora').fontSize(5.5).fillColor(FAINT).text('Scan: the glass explained', MARGIN + inner - QR - 8, top + 7 + QR, { width: QR + 16, align: 'center' })
}

/** The same glass diagram as the web pages, drawn as vectors at `size` points wide. */
function drawGlass(doc: PDFKit.PDFDocument, pour: FlightCard['pours'][number], x: number, y: number, size: number) {
  const g = glassDiagramGeometry(pour.glass, pour.prediction)
  const [, , vw, vh] = g.viewBox.split(' ').map(Number) as [number, number, number, number]
  const scale = Math.min(size / vw, (size * 1.1) / vh)
  doc.save()
  doc.translate(x, y).scale(scale)
  doc.path(g.liquidPath).fillOpacity(0.45).fill(AMBER)
  if (g.band) {
    doc.path(g.band.left).fillOpacity(0.75).fill('#e0a54a')
    doc.path(g.band.right).fillOpacity(0.75).fill('#e0a54a')
  }
  doc.fillOpacity(0.85)
  for (const t of g.tears) doc.ellipse(t.x, t.y, t.rx, t.ry).fill('#8a5a12')
  doc.fillOpacity(1)
  doc.path(g.outline).lineWidth(g.stroke).strokeColor(SOFT).stroke()
  doc.restore()
}
