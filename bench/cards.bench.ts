/**
 * Card PDF benchmark (not a test): the time to make one 6-pour flight card and a 40-guest
 * session's cards as one PDF. Run with `npm run bench`. Uses the same card-data and PDF code as
 * the server, with an invented flight computed by the glass model. Each is timed three ways:
 * - first: the first PDF this process makes (fonts parsed, nothing laid out yet);
 * - changed: a new document each time whose content changed (one pour's note for the card, every
 *   guest's name for the session), as after an edit or for the next session: the fonts' layouts
 *   and subsets are shared (server/cards/fontCache.ts, pdfText.ts), the changed text is new;
 * - again: the same content asked for again, answered from the PDFs kept by their content key
 *   (server/cards/pdfCache.ts), as the server answers a second print of the same card.
 * Issue 17's goal 3 (≤ 100 ms for the card, ≤ 600 ms for the session) is read on "changed".
 */
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { DEFAULT_ROOM_AIR, computeFilm, ethanolGrams, flightTotals } from '../shared/science'
import { buildFlightCard } from '../shared/cards'
import { renderCardsPdf } from '../server/cards/cardPdf'
import { cachedCardsPdf } from '../server/cards/pdfCache'

const fontDir = resolve(import.meta.dirname, '../node_modules/@fontsource/lora/files')
const fonts = {
  regular: readFileSync(resolve(fontDir, 'lora-latin-400-normal.woff')),
  semibold: readFileSync(resolve(fontDir, 'lora-latin-600-normal.woff')),
  italic: readFileSync(resolve(fontDir, 'lora-latin-400-italic.woff')),
  semiboldItalic: readFileSync(resolve(fontDir, 'lora-latin-600-italic.woff')),
}
const glass = { name: 'Tulip wine glass', bowlDiameterMm: 84, wallAngleDeg: 78, fillHeightMm: 38 }
const invented = [
  ['Bench Cider', 'cider', 6, 5, 8, 90], ['Bench Brut', 'sparkling', 12, 8, 7, 60], ['Bench White', 'still_wine', 12.5, 3, 10, 60],
  ['Bench Red', 'still_wine', 14, 2, 16, 60], ['Bench Fortified', 'fortified', 19.5, 100, 16, 45], ['Bench Gin', 'spirit', 43, 0, 18, 15],
] as const
const pours = invented.map(([name, kind, abv, sugar, temp, ml], i) => {
  const film = computeFilm({ abvPctVol: abv, tempC: temp, sugarGL: sugar, wallAngleDeg: glass.wallAngleDeg })
  const g = ethanolGrams(ml, abv)
  return { position: i + 1, product: { name, kind, producer: 'Bench Cellars', vintageOrBatch: '2025', colour: null, allergens: ['sulfites' as const] }, abvPctVol: abv, residualSugarGL: sugar, volumeMl: ml, servingTempC: temp, glass, ethanolGrams: g, standardDrinks: g / 14, filmActivityIndex: film.filmActivityIndex, film }
})
const totals = flightTotals(pours, 14)
const venue = { name: 'Bench Tasting Room', address: '1 Bench Lane', cautions: 'Do not drive.\nLegal age only.', legalAge: 21, volumeUnit: 'ml' as const, temperatureUnit: 'c' as const, standardDrinkKind: 'us', standardDrinkGrams: 14, timeZone: 'UTC', country: 'US', cardPaper: null }
const note = (text: string) => ({ html: `<p>${text}</p>`, text, blocks: [{ kind: 'paragraph' as const, depth: 0, runs: [{ text }] }] })
const card = (guest?: string, edit = 0) => buildFlightCard({
  venue,
  flight: { id: 1, name: 'Bench flight', version: 1, summary: 'Six pours', pours: pours.map((p, i) => (i === 2 ? { ...p, tastingNote: note(`Quince, pear skin and a saline finish; edit ${edit}.`) } : p)), totals },
  publicUrl: 'http://localhost:3000/pour/1', guestName: guest, room: { air: DEFAULT_ROOM_AIR, source: 'venue', readAt: null },
})
const session = (run: number) => Array.from({ length: 40 }, (_, i) => card(`Guest ${run}-${i + 1}`))

async function time(fn: () => Promise<Buffer>): Promise<{ ms: number, size: number }> {
  const t = performance.now()
  const out = await fn()
  return { ms: performance.now() - t, size: out.length }
}

async function median(label: string, runs: number, fn: (run: number) => Promise<Buffer>) {
  const times: number[] = []
  let size = 0
  for (let i = 0; i < runs; i++) {
    const r = await time(() => fn(i))
    times.push(r.ms)
    size = r.size
  }
  times.sort((a, b) => a - b)
  console.log(`${label}: median ${times[Math.floor(runs / 2)]!.toFixed(1)} ms, p90 ${times[Math.floor(runs * 0.9)]!.toFixed(1)} ms over ${runs} runs, ${(size / 1024).toFixed(0)} KiB`)
}

const first = await time(() => renderCardsPdf([card()], { paper: 'a5', fonts }))
console.log(`one 6-pour card PDF (A5), first: ${first.ms.toFixed(1)} ms, ${(first.size / 1024).toFixed(0)} KiB`)
await median('one 6-pour card PDF (A5), changed', 30, run => renderCardsPdf([card(undefined, run + 1)], { paper: 'a5', fonts }))
await median('one 6-pour card PDF (A5), again', 30, () => cachedCardsPdf([card()], { paper: 'a5', fonts }))
await median('40-guest session PDF (A5), changed', 10, run => renderCardsPdf(session(run + 1), { paper: 'a5', fonts }))
await median('40-guest session PDF (A5), again', 10, () => cachedCardsPdf(session(0), { paper: 'a5', fonts }))
