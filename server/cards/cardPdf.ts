/**
 * Flight cards as PDF, made with pdfkit and the Lora font shipped with the app (embedded from its
 * .woff files; nothing is fetched at run time). A card of up to six pours, with the flight's
 * introduction and each pour's tasting note, fits one A5 or half-letter page: when the text runs
 * long the card walks CARD_FIT_STEPS (shared/cards.ts: slightly smaller type, then run-on lists)
 * before anything flows onto a second page. Notes keep their Markdown structure (shared/markdown.ts blocks, laid out by
 * pdfText.ts). Pure: fonts come in as bytes.
 */
import PDFDocument from 'pdfkit'
import QRCode from 'qrcode'
import { glassDrawing } from '../../shared/glassDrawing'
import { drawGlassPdf } from './pdfDrawing'
import { CARD_FIT_STEPS, CARD_MARGIN_PT, type CardFit } from '../../shared/cards'
import { CARD_PAPER_POINTS, type CardPaper } from '../../shared/paper'
import type { FlightCard } from '../../shared/types/cards'
import type { TextBlock } from '../../shared/types/content'
import { FACES, drawRich, layoutRich } from './pdfText'

export interface CardFonts { regular: Buffer, semibold: Buffer, italic: Buffer, semiboldItalic: Buffer }

const INK = '#1e2326'
const SOFT = '#4a5459'
const FAINT = '#7b868c'
const AMBER = '#c98a2b'
const LAGOON = '#25665f'
const MARGIN = CARD_MARGIN_PT
const GLASS_COL = 34
const QR = 54
const GAP = 5

export async function renderCardsPdf(cards: FlightCard[], opts: { paper: CardPaper, fonts: CardFonts, title?: string, onCard?: (done: number, total: number) => void }): Promise<Buffer> {
  const { width, height } = CARD_PAPER_POINTS[opts.paper]
  const doc = new PDFDocument({ size: [width, height], margin: MARGIN, autoFirstPage: false, info: { Title: opts.title ?? cards[0]?.flight.name ?? 'Flight cards', Creator: 'Larmoir' } })
  doc.registerFont(FACES.regular, opts.fonts.regular)
  doc.registerFont(FACES.bold, opts.fonts.semibold)
  doc.registerFont(FACES.italic, opts.fonts.italic)
  doc.registerFont(FACES.boldItalic, opts.fonts.semiboldItalic)
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

/** A piece of the card: plain text in one font (pdfkit wraps it), or a note's blocks (pdfText.ts). */
type Line = { font: string, size: number, color: string, text: string, gap: number, spacing?: number }
  | { blocks: TextBlock[], size: number, color: string, gap: number, compact: boolean, rule?: true }

/** A note's look: ink, not the soft grey of the fine print, a touch larger than the pour's lines. */
const note = (blocks: TextBlock[], fit: CardFit): Line => ({ blocks, size: 7.2 * fit.scale, color: INK, gap: 2.5 * fit.scale, compact: fit.compactLists, rule: true })

/**
 * Each piece of text with its font and size, in drawing order, so that measuring a block and
 * drawing it cannot disagree.
 */
function pourLines(pour: Pour, fit: CardFit): Line[] {
  const k = fit.scale
  const detail = [pour.kind, pour.vintageOrBatch, pour.abvText, `${pour.volumeText} at ${pour.servedAtText}`,
    `${pour.ethanolGrams.toFixed(1)} g ethanol = ${pour.standardDrinks.toFixed(2)} standard drinks`].filter(Boolean).join(' · ')
  // The allergens close the facts line, in bold, rather than taking a line of their own.
  const facts: TextBlock = { kind: 'paragraph', depth: 0, runs: [{ text: detail }, ...(pour.allergens.length ? [{ text: ' · ' }, { text: `Contains ${pour.allergens.join(', ')}.`, bold: true as const }] : [])] }
  return [
    { blocks: [facts], size: 6.6 * k, color: SOFT, gap: 0.5, compact: false },
    { font: FACES.regular, size: 6.7 * k, color: INK, text: pour.lookFor.join(' '), gap: 1.5 * k },
    ...(pour.tastingNote?.blocks.length ? [note(pour.tastingNote.blocks, fit)] : []),
  ]
}

function headerLines(card: FlightCard, fit: CardFit): Line[] {
  const k = fit.scale
  const sub = [card.guestName ? `Poured for ${card.guestName}` : null, card.sessionLabel].filter(Boolean).join(' · ')
  return [
    { font: FACES.regular, size: 7.5, color: LAGOON, text: card.venue.name.toUpperCase(), gap: 0, spacing: 0.8 },
    { font: FACES.bold, size: 15, color: INK, text: card.flight.name, gap: 1 },
    ...(sub ? [{ font: FACES.italic, size: 8.5, color: SOFT, text: sub, gap: 1 }] : []),
    ...(card.flight.summary ? [{ font: FACES.regular, size: 7.5 * k, color: SOFT, text: card.flight.summary, gap: 1 }] : []),
    ...(card.intro?.blocks.length ? [{ blocks: card.intro.blocks, size: 7.6 * k, color: INK, gap: 3 * k, compact: fit.compactLists }] : []),
  ]
}

function footLines(card: FlightCard): Line[] {
  return [
    { font: FACES.bold, size: 8.5, color: INK, text: `This flight: ${card.totals.standardDrinks.toFixed(1)} standard drinks — ${card.totals.ethanolGrams.toFixed(1)} g of ethanol in ${card.totals.volumeText} (${card.totals.definition}).`, gap: 0 },
    // The air the figures above assume: the host's reading for the session, or the venue's usual room.
    { font: FACES.regular, size: 6.5, color: INK, text: card.room.text, gap: 1.5 },
    { font: FACES.regular, size: 6.5, color: SOFT, text: card.why, gap: 3 },
    { font: FACES.italic, size: 6.5, color: SOFT, text: card.quality, gap: 1.5 },
    { font: FACES.regular, size: 6.5, color: INK, text: card.cautions.join(' '), gap: 3 },
  ]
}

/** A note's indent: the rule beside it, and the list markers. */
const NOTE_INSET = 5
const richStyle = (l: Extract<Line, { blocks: TextBlock[] }>) => ({ size: l.size, leading: LEADING, color: l.color, linkColor: LAGOON, blockGap: l.size * 0.25, indent: l.size * 1.3, compactLists: l.compact })
const richLayout = (doc: PDFKit.PDFDocument, l: Extract<Line, { blocks: TextBlock[] }>, width: number) => layoutRich(doc, l.blocks, width - (l.rule ? NOTE_INSET : 0), richStyle(l))

/**
 * Line spacing of the card's text, × the type size: tighter than Lora's own 1.28 (its ascent plus
 * descent), which is made for screens and long reading; a card is a few lines at a time.
 */
const LEADING = 1.17
const plainOptions = (doc: PDFKit.PDFDocument, l: Extract<Line, { text: string }>, width: number) =>
  ({ width, characterSpacing: l.spacing, lineGap: LEADING * l.size - doc.font(l.font).fontSize(l.size).currentLineHeight(true) })

function measure(doc: PDFKit.PDFDocument, lines: Line[], width: number): number {
  return lines.reduce((h, l) => h + l.gap + ('blocks' in l
    ? richLayout(doc, l, width).height
    : doc.font(l.font).fontSize(l.size).heightOfString(l.text, plainOptions(doc, l, width))), 0)
}

function draw(doc: PDFKit.PDFDocument, lines: Line[], x: number, y: number, width: number): number {
  for (const l of lines) {
    y += l.gap
    if ('blocks' in l) {
      const laid = richLayout(doc, l, width)
      const inset = l.rule ? NOTE_INSET : 0
      if (l.rule) doc.moveTo(x + 0.6, y + 1).lineTo(x + 0.6, y + laid.height - 1).lineWidth(1.2).strokeColor(AMBER).stroke()
      drawRich(doc, laid, x + inset, y)
      y += laid.height
    }
    else {
      doc.font(l.font).fontSize(l.size).fillColor(l.color).text(l.text, x, y, plainOptions(doc, l, width))
      y = doc.y
    }
  }
  return y
}

const TITLE_H = 12
/** Space under the header's text, then the rule, then space above the first pour. */
const HEADER_RULE = 5
const HEADER_AFTER = 7

interface Geometry { inner: number, textX: number, textW: number, footW: number, footH: number }

function blockHeight(doc: PDFKit.PDFDocument, pour: Pour, g: Geometry, fit: CardFit): number {
  return Math.max(TITLE_H + measure(doc, pourLines(pour, fit), g.textW), GLASS_COL * 1.05)
}

/** The first step of CARD_FIT_STEPS at which the whole card fits its page (else the last one). */
function fitCard(doc: PDFKit.PDFDocument, card: FlightCard, g: Geometry, height: number): CardFit {
  const steps = CARD_FIT_STEPS
  return steps.find((fit) => {
    const total = MARGIN + measure(doc, headerLines(card, fit), g.inner) + HEADER_RULE + HEADER_AFTER
      + card.pours.reduce((h, p) => h + blockHeight(doc, p, g, fit) + GAP, 0)
    return total <= height - MARGIN - g.footH
  }) ?? steps.at(-1)!
}

function drawCard(doc: PDFKit.PDFDocument, card: FlightCard, qr: Buffer, width: number, height: number) {
  const inner = width - 2 * MARGIN
  const footW = inner - QR - 10
  const g: Geometry = { inner, textX: MARGIN + GLASS_COL + 8, textW: inner - GLASS_COL - 8, footW, footH: Math.max(measure(doc, footLines(card), footW), QR + 10) + 10 }
  const { textX, textW, footH } = g
  const fit = fitCard(doc, card, g, height)
  doc.addPage()
  let y = header(doc, card, inner, fit)

  for (const pour of card.pours) {
    const lines = pourLines(pour, fit)
    const blockH = blockHeight(doc, pour, g, fit)
    if (y + blockH > height - MARGIN - footH && y + blockH > height - MARGIN) {
      doc.addPage()
      y = MARGIN
    }
    else if (y + blockH > height - MARGIN - footH) {
      // It fits on the page but not above the foot: keep it, and the foot goes on the next page.
    }
    drawGlass(doc, pour, MARGIN, y, GLASS_COL)
    doc.font(FACES.bold).fontSize(10).fillColor(INK).text(`${pour.position}  ${pour.name}`, textX, y, { width: textW - 84, lineBreak: false, ellipsis: true, continued: true })
      .font(FACES.regular).fontSize(6.8).fillColor(SOFT).text(`   ${pour.producer}`, { lineBreak: false, ellipsis: true })
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
  doc.font(FACES.regular).fontSize(6.5).fillColor(SOFT).text(`film activity ${value.toFixed(1)}`, x - 6, y + 1, { width: 56, align: 'right', lineBreak: false })
  doc.roundedRect(x + 53, y + 3.2, 23, 2.6, 1.3).fill('#fbefd9')
  doc.roundedRect(x + 53, y + 3.2, Math.max(1, 2.3 * Math.min(10, value)), 2.6, 1.3).fill(AMBER)
}

function header(doc: PDFKit.PDFDocument, card: FlightCard, inner: number, fit: CardFit): number {
  const y = draw(doc, headerLines(card, fit), MARGIN, MARGIN, inner) + HEADER_RULE
  doc.moveTo(MARGIN, y).lineTo(MARGIN + inner, y).lineWidth(0.5).strokeColor('#e3ddd2').stroke()
  return y + HEADER_AFTER
}

function foot(doc: PDFKit.PDFDocument, card: FlightCard, qr: Buffer, inner: number, footW: number, top: number) {
  doc.moveTo(MARGIN, top).lineTo(MARGIN + inner, top).lineWidth(0.5).strokeColor('#e3ddd2').stroke()
  draw(doc, footLines(card), MARGIN, top + 6, footW)
  doc.image(qr, MARGIN + inner - QR, top + 6, { width: QR, height: QR })
  doc.font(FACES.regular).fontSize(5.5).fillColor(FAINT).text('Scan: the glass explained', MARGIN + inner - QR - 8, top + 7 + QR, { width: QR + 16, align: 'center' })
}

/** The same glass diagram as the web pages, drawn as vectors at `size` points wide. */
function drawGlass(doc: PDFKit.PDFDocument, pour: FlightCard['pours'][number], x: number, y: number, size: number) {
  const drawing = glassDrawing({ glass: pour.glass, prediction: pour.prediction, colour: pour.colour, palette: 'light', label: pour.name, labels: false })
  const v = drawing.viewBox
  drawGlassPdf(doc, drawing, { x, y, height: Math.min(size * 1.1, (size * v.height) / v.width) })
}
