/**
 * Flight cards as PDF, made with pdfkit and the Lora font shipped with the app (embedded from its
 * .woff files; nothing is fetched at run time). One card is one page of A5 or US half letter:
 *
 *   the venue, the flight, whom it was poured for and when; the flight's introduction;
 *   a row of the flight's glasses, each drawn to scale with its band marked (32 mm tall);
 *   the pours in two columns — what it is, what sets it apart in this flight, what to watch for, the note;
 *   the flight's standard drinks, the room, why tears form, the cautions and the QR code to the pour pages;
 *   along the right edge, a millimetre scale to hold against the glass.
 *
 * No text is set below CARD_TYPE_PT (9 pt to read, 8.5 pt for notes and fine print). When a card
 * runs long it walks CARD_FIT_STEPS (run-on lists, closer lines, the "why" left to the pour pages)
 * before anything flows onto a second page. All text goes through pdfText.ts, which breaks lines
 * only at spaces, so "4.7–6.2 mm/s" never splits. Pure: fonts come in as bytes.
 */
import PDFDocument from 'pdfkit'
import QRCode from 'qrcode'
import { CARD_FIT_STEPS, CARD_GLASS_MM, CARD_MARGIN_PT, CARD_TYPE_PT, type CardFit } from '../../shared/cards'
import { CARD_PAPER_POINTS, type CardPaper } from '../../shared/paper'
import type { FlightCard } from '../../shared/types/cards'
import type { TextBlock, TextRun } from '../../shared/types/content'
import { FACES, drawRich, layoutRich, shareTextMemo, type RichLayout } from './pdfText'
import { sfntOf } from './woff'
import { sharedFont } from './fontCache'
import { drawCardGlass, cardGlassWidth } from './cardGlass'
import { cardAllergens, cardFacts, leadSplit } from '../../shared/cardText'

export interface CardFonts { regular: Buffer, semibold: Buffer, italic: Buffer, semiboldItalic: Buffer }

const INK = '#1e2326'
const SOFT = '#3d464b'
const AMBER = '#c98a2b'
const LAGOON = '#25665f'
const RULE = '#d9d2c5'
const MARGIN = CARD_MARGIN_PT
const T = CARD_TYPE_PT
const MM = 72 / 25.4
/** The band along the right edge that holds the millimetre scale, points. */
const RULER_BAND = 18
const QR = 50
const COLUMN_GAP = 10
const POUR_GAP = 6
const GLASS_GAP = 6

export async function renderCardsPdf(cards: FlightCard[], opts: { paper: CardPaper, fonts: CardFonts, title?: string, onCard?: (done: number, total: number) => void }): Promise<Buffer> {
  const { width, height } = CARD_PAPER_POINTS[opts.paper]
  const doc = new PDFDocument({ size: [width, height], margin: MARGIN, autoFirstPage: false, info: { Title: opts.title ?? cards[0]?.flight.name ?? 'Flight cards', Creator: 'Larmoir' } })
  // The shipped .woff files, unwrapped (server/cards/woff.ts) and parsed once per process, their
  // layouts and subsets shared by every document (server/cards/fontCache.ts).
  const face = (woff: Buffer) => sharedFont(sfntOf(woff)) as unknown as Buffer
  doc.registerFont(FACES.regular, face(opts.fonts.regular))
  doc.registerFont(FACES.bold, face(opts.fonts.semibold))
  doc.registerFont(FACES.italic, face(opts.fonts.italic))
  doc.registerFont(FACES.boldItalic, face(opts.fonts.semiboldItalic))
  shareTextMemo(doc, sfntOf(opts.fonts.regular))
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))
  // One QR image per distinct URL (a session's cards share it).
  // One QR code per distinct URL (a session's cards share it), drawn as vector squares.
  const qrCache = new Map<string, QrModules>()
  for (let i = 0; i < cards.length; i++) {
    const card = cards[i]!
    let qr = qrCache.get(card.qrUrl)
    if (!qr) {
      const { modules } = QRCode.create(card.qrUrl, { errorCorrectionLevel: 'M' })
      qr = { size: modules.size, dark: Array.from(modules.data, v => Boolean(v)) }
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
/** A QR code's modules, row by row (qrcode's own matrix). */
interface QrModules { size: number, dark: boolean[] }

/** One piece of text: blocks of runs in one size and colour (pdfText.ts lays it out). */
interface Piece { blocks: TextBlock[], size: number, color: string, gap: number, rule?: true }

const para = (runs: TextRun[]): TextBlock[] => [{ kind: 'paragraph', depth: 0, runs }]
const plain = (text: string, extra: Partial<TextRun> = {}): TextBlock[] => para([{ text, ...extra }])

/** A contrast sentence with its lead in semibold (shared/cardText.ts). */
function leadRuns(text: string): TextRun[] {
  const { lead, rest } = leadSplit(text)
  return lead ? [{ text: lead, bold: true }, { text: rest }] : [{ text: rest }]
}

function pourPieces(card: FlightCard, pour: Pour, fit: CardFit): Piece[] {
  const factRuns: TextRun[] = [{ text: cardFacts(card, pour) }]
  return [
    // One paragraph: "3  Tidewater Albariño · 2024 · 12.5 % ABV · 2.0 fl oz at 50 °F. Second-highest band…".
    { blocks: para([{ text: `${pour.position}\u00a0\u00a0${pour.name}`, bold: true }, { text: ' · ' }, ...factRuns, ...(pour.contrast ? [{ text: '. ' }, ...leadRuns(pour.contrast)] : [{ text: '.' }])]), size: T.body, color: INK, gap: 0 },
    ...(pour.tastingNote?.blocks.length ? [{ blocks: pour.tastingNote.blocks, size: T.note, color: INK, gap: 3 * fit.gaps, rule: true as const }] : []),
  ]
}

/** The header's title lines, beside the QR code, and then the flight's introduction below both. */
function headPieces(card: FlightCard): Piece[] {
  const sub = [card.guestName ? `Poured for ${card.guestName}` : null, card.sessionLabel].filter(Boolean).join(' · ')
  return [
    { blocks: plain(card.venue.name.toUpperCase()), size: T.venue, color: LAGOON, gap: 0 },
    { blocks: plain(card.flight.name, { bold: true }), size: T.title, color: INK, gap: 1 },
    ...(sub ? [{ blocks: plain(sub, { italic: true }), size: T.sub, color: SOFT, gap: 1 }] : []),
    // Marketing's introduction says more than the manager's one-line summary: the card prints one of them.
  ]
}

function introPieces(card: FlightCard): Piece[] {
  return card.intro?.blocks.length
    ? [{ blocks: card.intro.blocks, size: T.body, color: INK, gap: 3 }]
    : card.flight.summary ? [{ blocks: plain(card.flight.summary), size: T.body, color: SOFT, gap: 3 }] : []
}

/**
 * What follows the pours, in the same two columns: the flight's standard drinks, its allergens, the
 * room the figures assume, why tears form, that they say nothing of quality, and the cautions — each
 * a group of its own, so that the columns can balance.
 */
function footGroups(card: FlightCard, fit: CardFit): Piece[][] {
  const al = cardAllergens(card)
  return [
    [{ blocks: plain(`This flight: ${card.totals.standardDrinks.toFixed(1)} standard drinks, ${card.totals.ethanolGrams.toFixed(1)}\u00a0g of ethanol in ${card.totals.volumeText} (${card.totals.definition}).`, { bold: true }), size: T.body, color: INK, gap: 0 }],
    ...(al ? [[{ blocks: plain(al, { bold: true }), size: T.body, color: INK, gap: 0 }]] : []),
    // The air the figures assume: the host's reading for the session, or the venue's usual room.
    [{ blocks: plain(card.room.text), size: T.body, color: INK, gap: 0 }],
    // Said only when some figures are tuned by the venue's own readings.
    ...(card.calibration ? [[{ blocks: plain(card.calibration), size: T.fine, color: INK, gap: 0 }]] : []),
    ...(fit.why ? [[{ blocks: plain(card.why), size: T.fine, color: SOFT, gap: 0 }]] : []),
    [{ blocks: plain(card.quality, { italic: true }), size: T.fine, color: SOFT, gap: 0 }],
    ...card.cautions.map(line => [{ blocks: plain(line), size: T.fine, color: INK, gap: 0 }]),
  ]
}

/** A note's indent: the amber rule beside it. */
const NOTE_INSET = 6

function layout(doc: PDFKit.PDFDocument, piece: Piece, width: number, fit: CardFit): RichLayout {
  return layoutRich(doc, piece.blocks, width - (piece.rule ? NOTE_INSET : 0), {
    size: piece.size, leading: fit.leading, color: piece.color, linkColor: LAGOON, blockGap: piece.size * 0.3,
    indent: piece.size * 1.3, compactLists: fit.compactLists,
  })
}

function measure(doc: PDFKit.PDFDocument, pieces: Piece[], width: number, fit: CardFit): number {
  return pieces.reduce((h, p) => h + p.gap + layout(doc, p, width, fit).height, 0)
}

function draw(doc: PDFKit.PDFDocument, pieces: Piece[], x: number, y: number, width: number, fit: CardFit): number {
  for (const p of pieces) {
    y += p.gap
    const laid = layout(doc, p, width, fit)
    if (p.rule) doc.moveTo(x + 0.7, y + 1).lineTo(x + 0.7, y + laid.height - 1).lineWidth(1.4).strokeColor(AMBER).stroke()
    drawRich(doc, laid, x + (p.rule ? NOTE_INSET : 0), y)
    y += laid.height
  }
  return y
}

/** Where everything goes on one page of a given size. */
interface Frame { left: number, textW: number, colW: number, bottom: number, headW: number }

function frameOf(width: number, height: number): Frame {
  const textW = width - 2 * MARGIN - RULER_BAND
  return { left: MARGIN, textW, colW: (textW - COLUMN_GAP) / 2, bottom: height - MARGIN, headW: textW - QR - 10 }
}

const HEAD_RULE_GAP = 6
const GLASS_ROW = CARD_GLASS_MM * MM
/** The table under the glasses, one row per figure (the count of tears around the glass is on the pour pages and in the drawing). */
const FIGURE_ROWS: { key: keyof FlightCard['pours'][number]['figures'] | 'drinks', label: string }[] = [
  { key: 'band', label: 'band, mm' },
  { key: 'onset', label: 'tears after, s' },
  { key: 'speed', label: 'sliding, mm/s' },
  { key: 'drinks', label: 'standard drinks' },
]
const TABLE_LINE = T.fine * 1.14
const TABLE_LABEL_W = 66
/** Pours per row of glasses; a longer flight takes two rows. */
const GLASSES_PER_ROW = 6
const tableHeight = (n: number) => Math.ceil(n / GLASSES_PER_ROW) * (GLASS_ROW + 2 + TABLE_LINE * FIGURE_ROWS.length) + GLASS_GAP

/**
 * Where a sequence of blocks splits into two columns so that the taller column is as short as it
 * can be (order kept): the index of the first block of the second column.
 */
function columns(heights: number[]): number {
  const total = heights.reduce((a, b) => a + b, 0)
  let best = heights.length
  let bestTall = total
  let left = 0
  for (let i = 0; i <= heights.length; i++) {
    const tall = Math.max(left, total - left)
    if (tall < bestTall) {
      bestTall = tall
      best = i
    }
    left += heights[i] ?? 0
  }
  return best
}

/** A block of the two columns: a pour's pieces or one group of the foot, and the space after it. */
interface Block { pieces: Piece[], after: number, rule?: true }

function blocksOf(card: FlightCard, fit: CardFit): Block[] {
  const foot = footGroups(card, fit)
  return [
    ...card.pours.map(p => ({ pieces: pourPieces(card, p, fit), after: POUR_GAP * fit.gaps })),
    ...foot.map((pieces, i) => ({ pieces, after: 2 * fit.gaps, ...(i === 0 ? { rule: true as const } : {}) })),
  ]
}

/** Space above the first block of the foot: a thin rule across the column. */
const FOOT_RULE = 8

const blockHeight = (doc: PDFKit.PDFDocument, b: Block, f: Frame, fit: CardFit) => measure(doc, b.pieces, f.colW, fit) + b.after + (b.rule ? FOOT_RULE : 0)

interface Plan { fit: CardFit, headH: number, split: number, colH: number, fits: boolean }

function plan(doc: PDFKit.PDFDocument, card: FlightCard, f: Frame, height: number, fit: CardFit): Plan {
  const headH = headHeight(doc, card, f, fit) + HEAD_RULE_GAP * 2
  const heights = blocksOf(card, fit).map(b => blockHeight(doc, b, f, fit))
  const split = columns(heights)
  const colH = Math.max(heights.slice(0, split).reduce((a, b) => a + b, 0), heights.slice(split).reduce((a, b) => a + b, 0))
  return { fit, headH, split, colH, fits: MARGIN + headH + tableHeight(card.pours.length) + colH <= height - MARGIN }
}

function drawCard(doc: PDFKit.PDFDocument, card: FlightCard, qr: QrModules, width: number, height: number) {
  const f = frameOf(width, height)
  // The first fit step at which the card fits its page, else the last.
  let p = plan(doc, card, f, height, CARD_FIT_STEPS[0]!)
  for (let i = 1; i < CARD_FIT_STEPS.length && !p.fits; i++) p = plan(doc, card, f, height, CARD_FIT_STEPS[i]!)
  const fit = p.fit
  doc.addPage()
  ruler(doc, card, width, height, fit)

  draw(doc, headPieces(card), f.left, MARGIN, f.headW, fit)
  qrCode(doc, qr, f)
  const head = headLayout(doc, card, f, fit)
  draw(doc, introPieces(card), f.left, head.top, head.width, fit)
  let y = head.bottom + HEAD_RULE_GAP
  hrule(doc, f, y, f.left, f.textW)
  y += HEAD_RULE_GAP
  y = glassTable(doc, card, f, y)

  // Two columns; a card too long for one page goes on with the rest on the next.
  const blocks = blocksOf(card, fit)
  const top = y
  ;[blocks.slice(0, p.split), blocks.slice(p.split)].forEach((col, c) => {
    let cy = top
    const x = f.left + c * (f.colW + COLUMN_GAP)
    for (const b of col) {
      const h = blockHeight(doc, b, f, fit)
      if (cy + h > f.bottom + 0.5 && cy > MARGIN + 1) {
        doc.addPage()
        ruler(doc, card, width, height, fit)
        cy = MARGIN
      }
      if (b.rule) {
        hrule(doc, f, cy + FOOT_RULE / 2 - 1, x, f.colW)
        cy += FOOT_RULE
      }
      cy = draw(doc, b.pieces, x, cy, f.colW, fit) + b.after
    }
  })
}

function hrule(doc: PDFKit.PDFDocument, f: Frame, y: number, x: number, w: number) {
  doc.moveTo(x, y).lineTo(x + w, y).lineWidth(0.6).strokeColor(RULE).stroke()
}

/**
 * The flight's glasses side by side, each CARD_GLASS_MM tall and drawn to its own scale (the
 * wall of the glass with its band and tears), and under each its number and predicted figures, so
 * that the pours compare across one table. The rows' names, with their units, stand at the left.
 */
function glassTable(doc: PDFKit.PDFDocument, card: FlightCard, f: Frame, top: number): number {
  let y = top
  for (let start = 0; start < card.pours.length; start += GLASSES_PER_ROW) {
    const row = card.pours.slice(start, start + GLASSES_PER_ROW)
    const slot = (f.textW - TABLE_LABEL_W) / Math.max(row.length, Math.min(card.pours.length, GLASSES_PER_ROW))
    const rows = y + GLASS_ROW + 2
    doc.font(FACES.regular).fontSize(T.fine).fillColor(SOFT)
    FIGURE_ROWS.forEach((r, i) => doc.text(r.label, f.left, rows + TABLE_LINE * i, { width: TABLE_LABEL_W, lineBreak: false }))
    row.forEach((pour, i) => {
      const x = f.left + TABLE_LABEL_W + i * slot
      const w = Math.min(slot - 4, cardGlassWidth(pour, GLASS_ROW))
      drawCardGlass(doc, pour, x + (slot - w) / 2, y, w, GLASS_ROW)
      // The pour's number at the top left of its glass.
      doc.font(FACES.bold).fontSize(T.body).fillColor(INK).text(String(pour.position), x + (slot - w) / 2 - 1, y, { width: 14, lineBreak: false })
      FIGURE_ROWS.forEach((r, j) => {
        const text = r.key === 'drinks' ? pour.standardDrinks.toFixed(2) : pour.figures[r.key]
        doc.font(FACES.regular).fontSize(T.fine).fillColor(INK).text(text, x, rows + TABLE_LINE * j, { width: slot, align: 'center', lineBreak: false })
      })
    })
    y = rows + TABLE_LINE * FIGURE_ROWS.length
  }
  return y + GLASS_GAP
}

/** Top of the page down to the end of the QR code's caption. */
const QR_BLOCK = MARGIN + QR + CARD_TYPE_PT.fine * 1.3 + 2

/**
 * Where the introduction goes: beside the QR code under the title, or below both at the full
 * width, whichever ends higher. Returns its top, its width and the header's bottom.
 */
function headLayout(doc: PDFKit.PDFDocument, card: FlightCard, f: Frame, fit: CardFit) {
  const titleEnd = MARGIN + measure(doc, headPieces(card), f.headW, fit)
  const intro = introPieces(card)
  const beside = Math.max(titleEnd + measure(doc, intro, f.headW, fit), QR_BLOCK)
  const below = Math.max(titleEnd, QR_BLOCK) + measure(doc, intro, f.textW, fit)
  return beside <= below ? { top: titleEnd, width: f.headW, bottom: beside } : { top: Math.max(titleEnd, QR_BLOCK), width: f.textW, bottom: below }
}

function headHeight(doc: PDFKit.PDFDocument, card: FlightCard, f: Frame, fit: CardFit): number {
  return headLayout(doc, card, f, fit).bottom - MARGIN
}

/** The QR code to the pour pages, at the header's right. */
function qrCode(doc: PDFKit.PDFDocument, qr: QrModules, f: Frame) {
  const qx = f.left + f.textW - QR
  // A quiet zone of one module on each side (ISO/IEC 18004 asks for four; the white card around it gives the rest).
  const cell = QR / (qr.size + 2)
  doc.save()
  qr.dark.forEach((on, i) => {
    if (on) doc.rect(qx + cell * (1 + (i % qr.size)), MARGIN + cell * (1 + Math.floor(i / qr.size)), cell + 0.02, cell + 0.02)
  })
  doc.fill(INK)
  doc.restore()
  doc.font(FACES.regular).fontSize(T.fine).fillColor(SOFT).text('Scan for more', qx - 14, MARGIN + QR + 1, { width: QR + 28, align: 'center', lineBreak: false })
}

/** Length of the printed scale, mm: taller than any band the glass model predicts (it caps them at 60 mm). */
const RULER_MM = 80

/**
 * A millimetre scale along the card's right edge: a tick every millimetre, longer every 5 and
 * numbered every 10, with 0 at the bottom for the liquid's surface. At 1 mm = 72/25.4 pt it reads
 * true when the card is printed at actual size.
 */
function ruler(doc: PDFKit.PDFDocument, card: FlightCard, width: number, height: number, fit: CardFit) {
  // 13 pt (4.6 mm) from the paper's edge: inside what office printers print.
  const edge = width - 13
  const zero = height - MARGIN - 20
  const top = zero - RULER_MM * MM
  doc.save()
  doc.moveTo(edge, zero + 0.4).lineTo(edge, top - 0.4).lineWidth(0.8).strokeColor(INK).stroke()
  for (let mm = 0; mm <= RULER_MM; mm++) {
    const yy = zero - mm * MM
    const len = mm % 10 === 0 ? 10 : mm % 5 === 0 ? 6 : 3.5
    doc.moveTo(edge - len, yy).lineTo(edge, yy).lineWidth(mm % 10 === 0 ? 0.8 : 0.45).strokeColor(INK).stroke()
    // Each number sits just above its tick, clear of the 1 mm ticks at the edge and of the text.
    if (mm % 10 === 0) doc.font(FACES.regular).fontSize(T.fine).fillColor(INK).text(String(mm), edge - 24, yy - T.fine * 1.15, { width: 20, align: 'right', lineBreak: false })
  }
  // How to use it, read up the edge above the scale.
  const along = top - T.fine * 1.2 - (QR_BLOCK + 6)
  const hint = layout(doc, { blocks: plain(card.ruler), size: T.fine, color: INK, gap: 0 }, along, fit)
  doc.translate(edge - hint.height + 1, top - T.fine * 1.2).rotate(-90)
  drawRich(doc, hint, 0, 0)
  doc.restore()
}
