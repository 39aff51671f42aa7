/**
 * The card's fonts, parsed once per process and shared by every PDF: pdfkit would otherwise parse
 * each Lora face again for every document, lay out every word again, and build the same font
 * subsets again, which was most of a card's time (docs/performance.md, goal 3).
 *
 * pdfkit takes a fontkit font object in place of the font's bytes (PDFFontFactory accepts anything
 * with `layout`). The one given here is the parsed font with two memos in front of it:
 * - `layout(text)`: a word's glyphs and positions, kept by its text. pdfkit scales the positions
 *   it gets in place, so every call returns fresh copies of them; the glyphs are fontkit's own
 *   shared objects, which pdfkit only reads.
 * - `createSubset()`: a subset whose `encode()` is kept by the glyphs it holds, in order. The same
 *   card (or a session's cards, which share their glyphs but for the guests' names) embeds the
 *   same subset, so it is encoded once.
 * Both are bounded; a word or subset seen again after the bound was reached is simply made again.
 */
import * as fontkit from 'fontkit'

const LAYOUT_MAX = 20_000
const SUBSETS_MAX = 64

interface GlyphPosition { xAdvance: number, yAdvance: number, xOffset: number, yOffset: number }
interface GlyphRun { glyphs: unknown[], positions: GlyphPosition[] }
interface Subset { glyphs: number[], encode: () => Uint8Array }
interface FontkitFont { layout: (text: string, features?: unknown) => GlyphRun, createSubset: () => Subset }

const parsed = new WeakMap<Buffer, object>()

/** The font object pdfkit should be given for these font bytes (an sfnt), one per buffer. */
export function sharedFont(sfnt: Buffer): object {
  let font = parsed.get(sfnt)
  if (!font) {
    font = memoised(fontkit.create(sfnt) as unknown as FontkitFont)
    parsed.set(sfnt, font)
  }
  return font
}

function memoised(font: FontkitFont): object {
  const runs = new Map<string, GlyphRun>()
  const subsets = new Map<string, Uint8Array>()
  const layout = (text: string, features?: unknown) => {
    if (features) return font.layout(text, features)
    let run = runs.get(text)
    if (!run) {
      const made = font.layout(text)
      run = { glyphs: made.glyphs, positions: made.positions.map(copyPosition) }
      if (runs.size >= LAYOUT_MAX) runs.clear()
      runs.set(text, run)
    }
    const positions = run.positions.map(copyPosition)
    let width: number | undefined
    return {
      glyphs: run.glyphs,
      positions,
      // The sum of the advances, as fontkit's GlyphRun gives it; pdfkit reads it only after scaling
      // the positions, and then again for every use of the word, so it is summed once.
      get advanceWidth() { return width ??= positions.reduce((w, p) => w + p.xAdvance, 0) },
    }
  }
  const createSubset = () => {
    const subset = font.createSubset()
    const encode = subset.encode.bind(subset)
    subset.encode = () => {
      const key = subset.glyphs.join(',')
      let bytes = subsets.get(key)
      if (!bytes) {
        bytes = encode()
        if (subsets.size >= SUBSETS_MAX) subsets.delete(subsets.keys().next().value!)
        subsets.set(key, bytes)
      }
      return bytes
    }
    return subset
  }
  // The parsed font stays the prototype: every other property and method is fontkit's own.
  return Object.assign(Object.create(font) as object, { layout, createSubset })
}

function copyPosition(p: GlyphPosition): GlyphPosition {
  return { xAdvance: p.xAdvance, yAdvance: p.yAdvance, xOffset: p.xOffset, yOffset: p.yOffset }
}
