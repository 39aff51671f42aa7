/**
 * Card PDF benchmark (not a test): median time to make one 6-pour flight card and a 40-guest
 * session's cards as one PDF. Run with `npm run bench`. Uses the same card-data and PDF code as
 * the server, with an invented flight computed by the glass model.
 */
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { DEFAULT_ROOM_AIR, computeFilm, ethanolGrams, flightTotals } from '../shared/science'
import { buildFlightCard } from '../shared/cards'
import { renderCardsPdf } from '../server/cards/cardPdf'

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
const card = (guest?: string) => buildFlightCard({ venue, flight: { id: 1, name: 'Bench flight', version: 1, summary: 'Six pours', pours, totals }, publicUrl: 'http://localhost:3000/pour/1', guestName: guest, room: { air: DEFAULT_ROOM_AIR, source: 'venue', readAt: null } })

async function median(label: string, runs: number, fn: () => Promise<unknown>) {
  const times: number[] = []
  let size = 0
  for (let i = 0; i < runs; i++) {
    const t = performance.now()
    const out = await fn()
    times.push(performance.now() - t)
    if (Buffer.isBuffer(out)) size = out.length
  }
  times.sort((a, b) => a - b)
  console.log(`${label}: median ${times[Math.floor(runs / 2)]!.toFixed(1)} ms, p90 ${times[Math.floor(runs * 0.9)]!.toFixed(1)} ms over ${runs} runs, ${(size / 1024).toFixed(0)} KiB`)
}

await median('one 6-pour card PDF (A5)', 30, () => renderCardsPdf([card()], { paper: 'a5', fonts }))
await median('40-guest session PDF (A5)', 10, () => renderCardsPdf(Array.from({ length: 40 }, (_, i) => card(`Guest ${i + 1}`)), { paper: 'a5', fonts }))
