import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { DEFAULT_ROOM_AIR, computeFilm, ethanolGrams, flightTotals } from '../../shared/science'
import { buildFlightCard, type CardRoomInput } from '../../shared/cards'
import { renderNote } from '../../shared/markdown'
import { renderCardsPdf } from '../../server/cards/cardPdf'
import { compactLists } from '../../server/cards/pdfText'
import { inspectPdf, pdfRuns, unitBreaks } from '../support/pdf'
import { DEFAULT_GLASSES, DEMO_FLIGHTS, DEMO_PRODUCTS, DEMO_VENUE } from '../../server/demo/data'
import { DEMO_INTROS, DEMO_NOTES } from '../../server/demo/content'
import { drinkKindOf } from '../../shared/pours'

const fontDir = resolve(import.meta.dirname, '../../node_modules/@fontsource/lora/files')
const font = (name: string) => readFileSync(resolve(fontDir, name))
const fonts = { regular: font('lora-latin-400-normal.woff'), semibold: font('lora-latin-600-normal.woff'), italic: font('lora-latin-400-italic.woff'), semiboldItalic: font('lora-latin-600-italic.woff') }
const glass = { name: 'Tulip wine glass', bowlDiameterMm: 84, wallAngleDeg: 78, fillHeightMm: 38 }
/** Six invented pours, lightest to strongest (no real product). */
const INVENTED = [
  ['Unit Cider', 'cider', 6, 5, 8, 90], ['Unit Brut', 'sparkling', 12, 8, 7, 60], ['Unit White', 'still_wine', 12.5, 3, 10, 60],
  ['Unit Red', 'still_wine', 14, 2, 16, 60], ['Unit Fortified', 'fortified', 19.5, 100, 16, 45], ['Unit Gin', 'spirit', 43, 0, 18, 15],
] as const

function card(note: string, intro = 'Six pours along the **shore**: take _your_ time.', room: CardRoomInput = { air: DEFAULT_ROOM_AIR, source: 'venue', readAt: null }, sessionId?: number) {
  const pours = INVENTED.map(([name, kind, abv, sugar, temp, ml], i) => {
    const film = computeFilm({ abvPctVol: abv, tempC: temp, sugarGL: sugar, wallAngleDeg: glass.wallAngleDeg, room: room.air })
    const g = ethanolGrams(ml, abv)
    return { position: i + 1, product: { name, kind, producer: 'Unit Cellars', vintageOrBatch: '2025', colour: null, allergens: ['sulfites' as const] }, abvPctVol: abv, residualSugarGL: sugar, volumeMl: ml, servingTempC: temp, glass, ethanolGrams: g, standardDrinks: g / 14, filmActivityIndex: film.filmActivityIndex, film, tastingNote: renderNote(note) }
  })
  const venue = { name: 'Unit Tasting Room', address: '1 Unit Lane', cautions: 'Please do not drive after your tasting.\nYou must be of legal drinking age.', legalAge: 21, volumeUnit: 'ml' as const, temperatureUnit: 'c' as const, standardDrinkKind: 'us', standardDrinkGrams: 14, timeZone: 'UTC', country: 'PT', cardPaper: null }
  return buildFlightCard({ venue, flight: { id: 1, name: 'Unit flight', version: 1, summary: 'Six pours', pours, totals: flightTotals(pours, 14), intro: renderNote(intro) }, publicUrl: 'http://localhost:3000/pour/1', guestName: 'A Guest', room, sessionId })
}

/** A note as long as a venue's usual one: a sentence and a two-item list. */
const USUAL_NOTE = 'Green apple and **brioche**, then:\n\n- lemon _zest_\n- a **saline, chalky** finish'

/**
 * The demo's own flight card, built from the demo's data as the server builds it (the venue's usual
 * room, each pour's glass, volume and kind), for a named guest at a session: the longest header.
 */
function demoCard() {
  const room = { relativeHumidityPct: DEMO_VENUE.roomHumidityPct, airTempC: DEMO_VENUE.roomAirTempC }
  const flight = DEMO_FLIGHTS[0]!
  const pours = flight.pours.map((fp, i) => {
    const p = DEMO_PRODUCTS.find(x => x.code === fp.code)!
    const glass = DEFAULT_GLASSES.find(g => g.name === fp.glass)!
    const film = computeFilm({ abvPctVol: p.abvPctVol, tempC: fp.servingTempC, sugarGL: p.residualSugarGL, wallAngleDeg: glass.wallAngleDeg, bowlDiameterMm: glass.bowlDiameterMm, pourVolumeMl: fp.volumeMl, kind: drinkKindOf(p.kind), room })
    const g = ethanolGrams(fp.volumeMl, p.abvPctVol)
    return { position: i + 1, product: { ...p, colour: p.colour ?? null }, abvPctVol: p.abvPctVol, residualSugarGL: p.residualSugarGL, volumeMl: fp.volumeMl, servingTempC: fp.servingTempC, glass, ethanolGrams: g, standardDrinks: g / DEMO_VENUE.standardDrinkGrams, filmActivityIndex: film.filmActivityIndex, film, tastingNote: renderNote(DEMO_NOTES[p.code]!) }
  })
  const venue = { ...DEMO_VENUE, cardPaper: null }
  return buildFlightCard({ venue, flight: { id: 1, name: flight.name, version: 1, summary: flight.summary, pours, totals: flightTotals(pours, DEMO_VENUE.standardDrinkGrams), intro: renderNote(DEMO_INTROS[flight.name]!) }, publicUrl: 'http://localhost:3000/pour/1', guestName: 'Maren Achterberg', sessionLabel: 'Sat, Dec 5, 2026, 2:00 PM', room: { air: room, source: 'session', readAt: '2026-12-05T18:40:00Z' } })
}

describe('the demo flight\'s card', () => {
  it.each(['a5', 'half-letter'] as const)('%s: one page, nothing under 8.5 pt, no unit parted from its figure', async (paper) => {
    const bytes = await renderCardsPdf([demoCard()], { paper, fonts })
    expect(inspectPdf(bytes).pages).toBe(1)
    expect(pdfRuns(bytes).filter(r => r.size < 8.5).map(r => `${r.size}: ${r.text}`)).toEqual([])
    expect(unitBreaks(bytes)).toEqual([])
  }, 30_000)
})

describe('the card PDF with notes', () => {
  it.each(['a5', 'half-letter'] as const)('%s: six pours, each with a note and a list, fit one page per card', async (paper) => {
    const bytes = await renderCardsPdf([card(USUAL_NOTE), card('**Pear**.')], { paper, fonts })
    const pdf = inspectPdf(bytes)
    expect(pdf.pages).toBe(2)
    expect(pdf.pageText(1).replace(/\s+/g, ' ')).toContain('Scan for more')
    const runs = pdfRuns(bytes).filter(r => r.page === 1)
    expect(runs.filter(r => r.text.includes('saline, chalky')).map(r => r.family)).toEqual(Array(6).fill('Lora-SemiBold'))
    expect(runs.find(r => r.text.includes('zest'))?.family).toBe('Lora') // the italic face is named Lora too
    expect(runs.find(r => r.text.includes('shore'))?.family).toBe('Lora-SemiBold')
  }, 30_000)

  it.each(['a5', 'half-letter'] as const)('%s: no text below 8.5 pt, the pours\' text at 9 pt, the notes at 8.5 pt in full ink', async (paper) => {
    const runs = pdfRuns(await renderCardsPdf([card(USUAL_NOTE)], { paper, fonts }))
    expect(runs.length).toBeGreaterThan(50)
    // pdftohtml reads sizes to a third of a point (tests/support/pdf.ts): 8.5 pt reads 8.67, 8.4 pt reads 8.33.
    const small = runs.filter(r => r.size < 8.5)
    expect(small, small.map(r => `${r.size} pt: ${r.text}`).join('\n')).toEqual([])
    expect(runs.find(r => r.text.includes('Unit Cider'))!.size).toBeCloseTo(9, 1)
    const note = runs.find(r => r.text.includes('Green apple'))!
    expect(note.size).toBeGreaterThanOrEqual(8.5)
    expect(note.size).toBeLessThan(9)
    expect(note.color).toBe('#1e2326') // the card's ink, not a grey
  }, 30_000)

  it.each(['a5', 'half-letter'] as const)('%s: no figure is parted from its unit at a line\'s end', async (paper) => {
    // Long product names push the figures to the ends of lines, where a break would fall.
    const cards = [0, 1, 2, 3, 4, 5].map((shift) => {
      const c = card(USUAL_NOTE)
      c.pours.forEach((p, i) => { p.name = `${p.name} ${'Old '.repeat((i + shift) % 4)}${'Reserve '.repeat(shift % 2)}`.trim() })
      return c
    })
    const bytes = await renderCardsPdf(cards, { paper, fonts })
    expect(unitBreaks(bytes)).toEqual([])
    expect(inspectPdf(bytes).text).toMatch(/\d\u00a0?\s?mm\/s/) // the check has speeds to look at
  }, 30_000)

  it('carries a QR code that a phone reads as the pour pages\' address', async () => {
    const { execFileSync } = await import('node:child_process')
    const { mkdtempSync, writeFileSync, readFileSync } = await import('node:fs')
    const { PNG } = await import('pngjs')
    const jsQR = (await import('jsqr')).default
    const dir = mkdtempSync(resolve((await import('node:os')).tmpdir(), 'larmoir-qr-'))
    writeFileSync(resolve(dir, 'card.pdf'), await renderCardsPdf([card('**Pear**.')], { paper: 'a5', fonts }))
    execFileSync('pdftoppm', ['-png', '-r', '200', '-singlefile', resolve(dir, 'card.pdf'), resolve(dir, 'page')])
    const png = PNG.sync.read(readFileSync(resolve(dir, 'page.png')))
    expect(jsQR(new Uint8ClampedArray(png.data), png.width, png.height)?.data).toBe('http://localhost:3000/pour/1')
  }, 30_000)

  it('a session\'s card carries its session in the QR code\'s address and in every pour\'s', async () => {
    const { execFileSync } = await import('node:child_process')
    const { mkdtempSync, writeFileSync, readFileSync } = await import('node:fs')
    const { PNG } = await import('pngjs')
    const jsQR = (await import('jsqr')).default
    const withSession = card('**Pear**.', undefined, undefined, 42)
    expect(withSession.qrUrl).toBe('http://localhost:3000/pour/1?s=42')
    expect(withSession.pours.map(p => p.pourUrl)).toEqual(withSession.pours.map(p => `http://localhost:3000/pour/1/${p.position}?s=42`))
    const dir = mkdtempSync(resolve((await import('node:os')).tmpdir(), 'larmoir-qr-'))
    writeFileSync(resolve(dir, 'card.pdf'), await renderCardsPdf([withSession], { paper: 'a5', fonts }))
    execFileSync('pdftoppm', ['-png', '-r', '200', '-singlefile', resolve(dir, 'card.pdf'), resolve(dir, 'page')])
    const png = PNG.sync.read(readFileSync(resolve(dir, 'page.png')))
    expect(jsQR(new Uint8ClampedArray(png.data), png.width, png.height)?.data).toBe('http://localhost:3000/pour/1?s=42')
  }, 30_000)

  it('prints a millimetre scale whose marks are 10 mm apart on paper', async () => {
    const bytes = await renderCardsPdf([card('**Pear**.')], { paper: 'a5', fonts })
    const dir = (await import('node:fs')).mkdtempSync(resolve((await import('node:os')).tmpdir(), 'larmoir-ruler-'))
    const file = resolve(dir, 'card.pdf')
    ;(await import('node:fs')).writeFileSync(file, bytes)
    const html = (await import('node:child_process')).execFileSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' })
    const marks = [...html.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">(\d+)<\/word>/g)]
      .map(m => ({ n: Number(m[5]), y: (Number(m[2]) + Number(m[4])) / 2, x: Number(m[1]) }))
      .filter(m => m.x > 380 && m.n % 10 === 0)
    // The scale's own numbers: from its 0 (the lowest on the page) up, one every 10 mm.
    const zero = marks.filter(m => m.n === 0).sort((a, b) => b.y - a.y)[0]!
    const scale = marks.filter(m => m.y <= zero.y + 0.1 && Math.abs(m.x - zero.x) < 12 && (m.n === 0 ? m === zero : true))
    const y = (n: number) => scale.find(m => m.n === n)!.y
    expect(scale.map(m => m.n).sort((a, b) => a - b)).toEqual([0, 10, 20, 30, 40, 50, 60, 70, 80])
    // 10 mm = 72 / 25.4 × 10 = 28.35 pt (the PostScript point, 1/72 in; 1 in = 25.4 mm exactly)
    expect(y(0) - y(10)).toBeCloseTo(28.35, 1)
    expect(y(0) - y(80)).toBeCloseTo(226.77, 1)
  }, 30_000)

  it('a note too long for any fit step flows onto a second page and loses no words', async () => {
    const long = Array.from({ length: 12 }, (_, i) => `- point ${i + 1} with **bold ${i + 1}** words`).join('\n')
    const pdf = inspectPdf(await renderCardsPdf([card(long)], { paper: 'a5', fonts }))
    expect(pdf.pages).toBeGreaterThan(1)
    const flat = pdf.raw.replace(/\s+/g, ' ')
    expect(flat.match(/point 12 with bold 12 words/g)).toHaveLength(6)
  }, 30_000)

  it('prints the room reading the card assumed, on the print page\'s data and in the PDF', async () => {
    const reading = card('**Pear**.', undefined, { air: { relativeHumidityPct: 57, airTempC: 23.4 }, source: 'session', readAt: '2026-10-03T13:40:00Z' })
    expect(reading.room).toEqual({ relativeHumidityPct: 57, airTempC: 23.4, source: 'session', readAt: '2026-10-03T13:40:00.000Z', text: 'Room: 23\u00a0°C, 57 % RH — read for this session' })
    const usual = card('**Pear**.')
    expect(usual.room.text).toBe(`Room: ${DEFAULT_ROOM_AIR.airTempC}\u00a0°C, ${DEFAULT_ROOM_AIR.relativeHumidityPct} % RH — the room's usual air`)
    const text = inspectPdf(await renderCardsPdf([reading, usual], { paper: 'a5', fonts })).raw.replace(/\s+/g, ' ')
    expect(text).toContain('Room: 23 °C, 57 % RH — read for this session')
    expect(text).toContain(`Room: ${DEFAULT_ROOM_AIR.airTempC} °C, ${DEFAULT_ROOM_AIR.relativeHumidityPct} % RH`)
  }, 30_000)

  it('runs a list on when asked: markers kept, items on shared lines', () => {
    const blocks = renderNote('Nose:\n\n- pear\n- **quince**\n  - ripe\n\n1. swirl\n2. wait\n\nEnd.').blocks
    expect(compactLists(blocks).map(b => ({ kind: b.kind, text: b.runs.map(r => r.text).join('') }))).toEqual([
      { kind: 'paragraph', text: 'Nose:' },
      { kind: 'paragraph', text: '•\u00a0pear\u2003•\u00a0quince\u2003•\u00a0ripe' },
      { kind: 'paragraph', text: '1.\u00a0swirl\u20032.\u00a0wait' },
      { kind: 'paragraph', text: 'End.' },
    ])
  })
})
