import { execFileSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { resolve } from 'node:path'
import { SHOTS_DIR } from './browser'

/** Reads a PDF with poppler's tools: page count and size, fonts, text, and a PNG of a page. */
export function inspectPdf(bytes: Buffer, pngName?: string) {
  const dir = mkdtempSync(resolve(tmpdir(), 'larmoir-pdf-'))
  const file = resolve(dir, 'card.pdf')
  writeFileSync(file, bytes)
  const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' })
  const pages = Number(info.match(/^Pages:\s+(\d+)/m)?.[1])
  const size = info.match(/^Page size:\s+([\d.]+) x ([\d.]+) pts/m)
  const fonts = execFileSync('pdffonts', [file], { encoding: 'utf8' }).split('\n').slice(2).filter(Boolean)
    .map(l => ({ name: l.split(/\s+/)[0]!, embedded: / yes +yes /.test(l) || /\byes\b/.test(l.slice(60, 70)) }))
  const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' })
  // Drawing order: a card's columns one after the other, as the card reads.
  const raw = execFileSync('pdftotext', ['-raw', file, '-'], { encoding: 'utf8' })
  const pageText = (n: number) => execFileSync('pdftotext', ['-f', String(n), '-l', String(n), file, '-'], { encoding: 'utf8' })
  if (pngName) execFileSync('pdftoppm', ['-png', '-r', '110', '-f', '1', '-l', '1', '-singlefile', file, resolve(SHOTS_DIR, pngName)])
  return { pages, width: Number(size?.[1]), height: Number(size?.[2]), fonts, text, raw, pageText }
}

/** A stretch of a PDF's text with the font it is set in (poppler's pdftohtml -xml), page by page; size in points. */
export interface PdfRun { page: number, text: string, family: string, size: number, color: string }

/**
 * pdftohtml writes font sizes in whole pixels at its zoom, which it caps at 3 (poppler 22): a size
 * reads to a third of a point, 8.5 pt as 8.67 and 8.4 pt as 8.33. pdftohtml leaves rotated text out.
 */
const RUN_ZOOM = 3

export function pdfRuns(bytes: Buffer): PdfRun[] {
  const dir = mkdtempSync(resolve(tmpdir(), 'larmoir-pdf-'))
  const file = resolve(dir, 'card.pdf')
  writeFileSync(file, bytes)
  const xml = execFileSync('pdftohtml', ['-xml', '-i', '-zoom', String(RUN_ZOOM), '-stdout', file], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 })
  const fonts = new Map([...xml.matchAll(/<fontspec id="(\d+)" size="([\d.]+)" family="([^"]+)" color="([^"]+)"/g)].map(m => [m[1]!, { size: Number(m[2]) / RUN_ZOOM, family: m[3]!.replace(/^[A-Z]{6}\+/, ''), color: m[4]! }]))
  const runs: PdfRun[] = []
  for (const page of xml.split(/<page number="/).slice(1)) {
    const n = Number(page.match(/^(\d+)/)?.[1])
    for (const m of page.matchAll(/<text [^>]*font="(\d+)"[^>]*>(.*?)<\/text>/g)) {
      const font = fonts.get(m[1]!)!
      const text = m[2]!.replace(/<[^>]+>/g, '').replace(/&amp;/g, '&').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;/g, '\'')
      runs.push({ page: n, text, ...font })
    }
  }
  return runs
}

/** Units a figure may not be parted from at a line's end (the card's text binds them: shared/cardText.ts bindUnits). */
const UNIT_START = /^(?:mm\/s|mm|s|°[CF]|fl|oz|%|g\/L|g|mL|L|PM|AM|mPa·s|mN\/m|\/s)(?![\p{L}\d])/u

/**
 * Places where a PDF's text breaks a figure from its unit or a unit in two: a line that ends in a
 * figure followed by a line that starts with a unit, or a line that ends in "/" ("6.9 mm/" ⏎ "s").
 * Read from poppler's pdftotext -raw, line by line in reading order.
 */
export function unitBreaks(bytes: Buffer): string[] {
  const dir = mkdtempSync(resolve(tmpdir(), 'larmoir-pdf-'))
  const file = resolve(dir, 'card.pdf')
  writeFileSync(file, bytes)
  const lines = execFileSync('pdftotext', ['-raw', file, '-'], { encoding: 'utf8' }).split('\n').map(l => l.trim()).filter(Boolean)
  const out: string[] = []
  for (let i = 0; i + 1 < lines.length; i++) {
    const a = lines[i]!
    const b = lines[i + 1]!
    // A unit split at its slash ("mm/" ⏎ "s"); a long web address cut at a slash is not a unit.
    if ((/\d$/.test(a) && UNIT_START.test(b)) || (/(?:^|[\s\d])(?:mm|mN|g|km|m)\/$/.test(a) && /^(?:s|m|L)\b/.test(b))) out.push(`${a} ⏎ ${b}`)
  }
  return out
}
