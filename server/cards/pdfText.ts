/**
 * A note's blocks (shared/markdown.ts: paragraphs, list items, bold and italic runs) laid out for
 * pdfkit. pdfkit wraps one font at a time, so the words are placed here: one layout feeds both the
 * measuring and the drawing, and the two cannot disagree.
 */
import type { TextBlock, TextRun } from '../../shared/types/content'
import { bindUnits } from '../../shared/cardText'

/** The four faces of Lora the cards embed, by the names renderCardsPdf registers them under. */
export const FACES = { regular: 'Lora', bold: 'Lora-SemiBold', italic: 'Lora-Italic', boldItalic: 'Lora-SemiBoldItalic' } as const

export interface RichStyle {
  size: number
  /** Distance from one line to the next, × size. */
  leading: number
  color: string
  linkColor: string
  /** Extra space above each block after the first, in points. */
  blockGap: number
  /** Indent per list level, in points (the marker sits in it). */
  indent: number
  /** Lists run on: items follow each other on shared lines, each after its marker (tight cards). */
  compactLists?: boolean
}

interface Piece { text: string, font: string, x: number, y: number, href?: string }
export interface RichLayout { pieces: Piece[], height: number, style: RichStyle }

function faceOf(run: TextRun, heading: boolean): string {
  const bold = run.bold || heading
  if (bold && run.italic) return FACES.boldItalic
  if (bold) return FACES.bold
  return run.italic ? FACES.italic : FACES.regular
}

/** A word: the pieces of text with no space between them, possibly in several faces ("**pear**,"). */
interface Word { parts: { text: string, font: string, href?: string, width: number }[], width: number, spaceBefore: number }

/** Spaces a line may break at; a no-break space (after a run-on marker) holds its neighbours together. */
const BREAK = /([ \t\u2003]+)/
const ITEM_SEPARATOR = '\u2003'

/** Each list's items joined into one paragraph: "• pear  • quince  • salt". */
export function compactLists(blocks: TextBlock[]): TextBlock[] {
  const out: TextBlock[] = []
  // The list being run on: its depth, and whether it is numbered (a change of kind starts a new list).
  let list: { depth: number, ordered: boolean } | null = null
  for (const b of blocks) {
    const ordered = /^\d/.test(b.marker ?? '')
    const last = out.at(-1)
    const continues = list && last && (b.depth > list.depth || (b.depth === list.depth && b.kind === 'item' && ordered === list.ordered))
      && (last.quote ?? false) === (b.quote ?? false)
    if (continues) {
      last!.runs.push({ text: ITEM_SEPARATOR }, ...(b.marker ? [{ text: `${b.marker}\u00a0` }] : []), ...b.runs)
      continue
    }
    if (b.kind !== 'item') {
      list = null
      out.push(b)
      continue
    }
    list = { depth: b.depth, ordered }
    out.push({ kind: 'paragraph', runs: [{ text: `${b.marker}\u00a0` }, ...b.runs], depth: Math.max(0, b.depth - 1), ...(b.quote ? { quote: true as const } : {}) })
  }
  return out
}

/**
 * What the layout has measured and laid out with one set of fonts, kept across documents: a card
 * lays out each piece several times (fitting, then drawing), a session's cards share every piece
 * but the guest's name, and the same card is printed again and again. Both are pure functions of
 * the fonts and their inputs, so a kept answer is the answer. Bounded: cleared when full.
 */
interface TextMemo { widths: Map<string, number>, layouts: Map<string, RichLayout> }
const MEMO_MAX = 20_000
const memoOfFonts = new WeakMap<object, TextMemo>()
const memoOfDoc = new WeakMap<PDFKit.PDFDocument, TextMemo>()

/** Lets `layoutRich` on `doc` reuse what was measured before with the same fonts (`fonts`: any object that stands for them). */
export function shareTextMemo(doc: PDFKit.PDFDocument, fonts: object): void {
  let memo = memoOfFonts.get(fonts)
  if (!memo) {
    memo = { widths: new Map(), layouts: new Map() }
    memoOfFonts.set(fonts, memo)
  }
  memoOfDoc.set(doc, memo)
}

function remember<V>(map: Map<string, V>, key: string, make: () => V): V {
  let value = map.get(key)
  if (value === undefined) {
    value = make()
    if (map.size >= MEMO_MAX) map.clear()
    map.set(key, value)
  }
  return value
}

export function layoutRich(doc: PDFKit.PDFDocument, source: TextBlock[], width: number, style: RichStyle): RichLayout {
  const memo = memoOfDoc.get(doc)
  if (!memo) return layoutUncached(doc, source, width, style, (font, text) => doc.font(font).fontSize(style.size).widthOfString(text))
  const measure = (font: string, text: string) => remember(memo.widths, `${font}\u0000${style.size}\u0000${text}`, () => doc.font(font).fontSize(style.size).widthOfString(text))
  return remember(memo.layouts, JSON.stringify([source, width, style]), () => layoutUncached(doc, source, width, style, measure))
}

function layoutUncached(doc: PDFKit.PDFDocument, source: TextBlock[], width: number, style: RichStyle, measure: (font: string, text: string) => number): RichLayout {
  const blocks = style.compactLists ? compactLists(source) : source
  const lineH = style.size * style.leading
  const pieces: Piece[] = []
  let y = 0
  blocks.forEach((block, bi) => {
    if (bi > 0) y += style.blockGap
    const left = style.indent * block.depth + (block.quote ? style.indent : 0)
    if (block.marker) pieces.push({ text: block.marker, font: FACES.regular, x: left - measure(FACES.regular, block.marker) - style.size * 0.35, y })
    const lineW = Math.max(width - left, style.size * 4)
    // Hard breaks split a block into lines that each wrap on their own.
    for (const line of splitLines(block.runs)) {
      const words = wordsOf(line, block.kind === 'heading', measure)
      let x = 0
      let started = false
      for (const w of words) {
        if (started && x + w.spaceBefore + w.width > lineW) {
          y += lineH
          x = 0
          started = false
        }
        if (started) x += w.spaceBefore
        for (const part of w.parts) {
          // A word longer than the line is cut where it runs out.
          let text = part.text
          while (x + measure(part.font, text) > lineW && text.length > 1) {
            let n = text.length - 1
            while (n > 1 && x + measure(part.font, text.slice(0, n)) > lineW) n--
            pieces.push({ text: text.slice(0, n), font: part.font, x: left + x, y, href: part.href })
            text = text.slice(n)
            y += lineH
            x = 0
          }
          pieces.push({ text, font: part.font, x: left + x, y, href: part.href })
          x += measure(part.font, text)
        }
        started = true
      }
      y += lineH
    }
  })
  return { pieces: joinPieces(pieces, measure), height: y, style }
}

export function drawRich(doc: PDFKit.PDFDocument, layout: RichLayout, x: number, y: number) {
  for (const p of layout.pieces) {
    doc.font(p.font).fontSize(layout.style.size).fillColor(p.href ? layout.style.linkColor : layout.style.color)
      .text(p.text, x + p.x, y + p.y, { lineBreak: false, ...(p.href ? { link: p.href, underline: true } : {}) })
  }
}

function splitLines(runs: TextRun[]): TextRun[][] {
  const lines: TextRun[][] = [[]]
  for (const r of runs) {
    bindUnits(r.text).split('\n').forEach((text, i) => {
      if (i > 0) lines.push([])
      if (text) lines.at(-1)!.push({ ...r, text })
    })
  }
  return lines
}

function wordsOf(runs: TextRun[], heading: boolean, measure: (font: string, text: string) => number): Word[] {
  const words: Word[] = []
  let pendingSpace = 0
  let current: Word | null = null
  for (const run of runs) {
    const font = faceOf(run, heading)
    for (const chunk of run.text.split(BREAK)) {
      if (!chunk) continue
      if (BREAK.test(chunk)) {
        current = null
        pendingSpace = measure(font, chunk.includes(ITEM_SEPARATOR) ? ITEM_SEPARATOR : ' ')
        continue
      }
      const part = { text: chunk, font, href: run.href, width: measure(font, chunk) }
      if (current) {
        current.parts.push(part)
        current.width += part.width
      }
      else {
        current = { parts: [part], width: part.width, spaceBefore: pendingSpace }
        words.push(current)
        pendingSpace = 0
      }
    }
  }
  return words
}

/**
 * Pieces on one line in the same face become one string (spaces put back), so the PDF's text reads
 * as words and sentences, not one word at a time.
 */
function joinPieces(pieces: Piece[], measure: (font: string, text: string) => number): Piece[] {
  const out: Piece[] = []
  for (const p of pieces) {
    const last = out.at(-1)
    if (last && last.y === p.y && last.font === p.font && last.href === p.href) {
      const end = last.x + measure(last.font, last.text)
      const gap = p.x - end
      const space = measure(p.font, ' ')
      if (Math.abs(gap) < 0.01) {
        last.text += p.text
        continue
      }
      if (Math.abs(gap - space) < 0.01) {
        last.text += ` ${p.text}`
        continue
      }
    }
    out.push({ ...p })
  }
  return out
}
