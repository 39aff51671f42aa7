import { mkdirSync } from 'node:fs'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { Client } from '../support/http'
import { signedIn } from '../support/people'
import { inspectPdf, pdfRuns, unitBreaks } from '../support/pdf'
import { SHOTS_DIR } from '../support/browser'
import { bookAndPay, demoFlightId, newGuest, newSession } from '../support/booking'

/** Invented products for this test's flight (no real brand). */
const INVENTED = [
  { code: 'CARD-PET', kind: 'sparkling', name: 'Gullwing Pétillant', abv: 10.5, sugar: 12, temp: 7, ml: 60 },
  { code: 'CARD-RIE', kind: 'still_wine', name: 'Slate Terrace Riesling', abv: 11, sugar: 18, temp: 9, ml: 60 },
  { code: 'CARD-ROS', kind: 'still_wine', name: 'Kelp Line Rosé', abv: 12.5, sugar: 3, temp: 10, ml: 60 },
  { code: 'CARD-SYR', kind: 'still_wine', name: 'Breakwater Syrah', abv: 14.5, sugar: 2, temp: 17, ml: 60 },
  { code: 'CARD-TAW', kind: 'fortified', name: 'Lantern Tawny', abv: 20, sugar: 110, temp: 15, ml: 45 },
  { code: 'CARD-RYE', kind: 'spirit', name: 'Tidemill Rye', abv: 46, sugar: 0, temp: 19, ml: 15 },
] as const

let manager: Client
let flightId: number
const ETHANOL_G_PER_ML = 0.78924 // OIML R 22: density of ethanol at 20 °C, 789.24 kg/m³

beforeAll(async () => {
  manager = await signedIn('manager')
  const glass = ((await manager.get('/api/glasses')).body as { id: number }[])[0]!.id
  const ids: number[] = []
  for (const p of INVENTED) {
    const res = await manager.post('/api/products', {
      code: `${p.code}-${Date.now() % 100000}`, kind: p.kind, name: p.name, producer: 'Test Cellars', vintageOrBatch: '2025', servingTempC: p.temp,
      allergens: p.kind === 'spirit' ? [] : ['sulfites'], bottleSizeMl: 750, costPerBottleMinor: 1000,
      measurement: { abvPctVol: p.abv, residualSugarGL: p.sugar, lab: 'Test lab', method: 'Test method', measuredOn: '2026-10-01' },
    })
    expect(res.status).toBe(201)
    ids.push(res.body.id)
  }
  const flight = await manager.post('/api/flights', { name: 'Card test flight', summary: 'Six invented pours', pours: INVENTED.map((p, i) => ({ productId: ids[i], volumeMl: p.ml, glassId: glass, servingTempC: p.temp })) })
  flightId = flight.body.id
  expect((await manager.post(`/api/flights/${flightId}/publish`)).status).toBe(200)
})

describe('card data', () => {
  it('has every pour, in order, with ABV, volume, grams and standard drinks (US definition)', async () => {
    const { body: card } = await (await signedIn('host')).get(`/api/flights/${flightId}/card`)
    expect(card.pours.map((p: { name: string }) => p.name)).toEqual(INVENTED.map(p => p.name))
    INVENTED.forEach((p, i) => {
      const c = card.pours[i]
      const grams = p.ml * p.abv / 100 * ETHANOL_G_PER_ML
      expect(c.position).toBe(i + 1)
      expect(c.abvText).toBe(`${p.abv}\u00a0% ABV`)
      expect(c.volumeText).toBe(`${(p.ml / 29.5735295625).toFixed(1)}\u00a0fl\u00a0oz`) // 1 US fl oz = 29.5735295625 mL (exact, US customary units)
      expect(c.ethanolGrams).toBeCloseTo(grams, 1)
      expect(c.standardDrinks).toBeCloseTo(grams / 14, 2) // NIAAA: one US standard drink = 14 g of ethanol
      expect(c.figures.band).toMatch(/^\d/) // every one of these six climbs in the default room
      expect(c.contrast).toBeTruthy()
      expect(c.allergens).toEqual(p.kind === 'spirit' ? [] : ['sulfites'])
    })
    expect(card.totals.standardDrinks).toBeCloseTo(INVENTED.reduce((s, p) => s + p.ml * p.abv / 100 * ETHANOL_G_PER_ML, 0) / 14, 1)
    expect(card.quality).toMatch(/nothing about quality/)
    expect(card.cautions.join(' ')).toMatch(/Driving\? Please do not drink/) // the fixed block (shared/cautions.ts, in its short form) is on every card
    expect(card.qrUrl).toBe(`${inject('appUrl')}/pour/${flightId}`)
    // The sweet tawny is the pour whose sugar slows everything, and the card says so with its range.
    expect(card.pours[4].contrast).toMatch(/^Its 110\sg\/L of sugar slows everything: .* \(\d[\d.]*–\d[\d.]*\smm\/s\)/)
    // A US venue prints on half letter by default (shared/paper.ts).
    expect(card.paper).toBe('half-letter')
  })

  it('a session\'s cards open the pour pages with the session in the address; the flight\'s own card keeps none', async () => {
    const demo = await demoFlightId()
    const { id } = await newSession(manager, { seats: 4 })
    await bookAndPay(await newGuest('card-session'), id, 1)
    const { status, body } = await manager.get(`/api/sessions/${id}/cards`)
    expect(status).toBe(200)
    expect(body.cards[0].qrUrl).toBe(`${inject('appUrl')}/pour/${demo}?s=${id}`)
    expect(body.cards[0].pours.map((p: { pourUrl: string }) => p.pourUrl)).toEqual(body.cards[0].pours.map((p: { position: number }) => `${inject('appUrl')}/pour/${demo}/${p.position}?s=${id}`))
    expect((await manager.get(`/api/flights/${demo}/card`)).body.qrUrl).toBe(`${inject('appUrl')}/pour/${demo}`)
  })

  it('counts standard drinks under the venue\'s definition: UK units of 8 g', async () => {
    const venue = (await manager.get('/api/venue')).body
    const { id, ...settings } = venue
    await manager.patch('/api/venue', { ...settings, standardDrinkKind: 'uk' })
    try {
      const { body: card } = await manager.get(`/api/flights/${flightId}/card`)
      INVENTED.forEach((p, i) => {
        expect(card.pours[i].standardDrinks).toBeCloseTo(p.ml * p.abv / 100 * ETHANOL_G_PER_ML / 8, 2) // NHS: one UK unit = 8 g of ethanol
        // The NHS rule of thumb, ABV × mL / 1000, agrees to within the rounding of 7.89 g to 8 g.
        expect(card.pours[i].standardDrinks).toBeCloseTo(p.abv * p.ml / 1000, 1)
      })
      expect(card.totals.definition).toMatch(/8 g/)
    }
    finally {
      await manager.patch('/api/venue', settings)
    }
  })
})

describe('card PDF', () => {
  it.each([
    ['a5', 419.53, 595.28], // ISO 216 A5: 148 × 210 mm
    ['half-letter', 396, 612], // US half letter: 5.5 × 8.5 in
  ])('%s: one page for six pours, the right size, Lora embedded, every pour in the text', async (paper, w, h) => {
    const res = await manager.raw(`/cards/flights/${flightId}/card.pdf?paper=${paper}`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('application/pdf')
    expect(res.headers.get('content-disposition')).toBe(`inline; filename="flight-${flightId}-${paper}.pdf"`)
    expect(res.headers.get('cache-control')).toBe('no-store')
    // The browser's own PDF viewer must be allowed to show it (nuxt.config.ts route rule).
    expect(res.headers.get('content-security-policy')).toBe('frame-ancestors \'self\'')
    mkdirSync(SHOTS_DIR, { recursive: true })
    const pdf = inspectPdf(Buffer.from(await res.arrayBuffer()), `card-${paper}`)
    expect(pdf.pages).toBe(1)
    expect(pdf.width).toBeCloseTo(w, 1)
    expect(pdf.height).toBeCloseTo(h, 1)
    expect(pdf.fonts.map(f => f.name.split('+')[1])).toEqual(expect.arrayContaining(['Lora-Regular', 'Lora-SemiBold']))
    expect(pdf.fonts.every(f => f.embedded)).toBe(true)
    const flat = pdf.raw.replace(/\s+/g, ' ')
    for (const p of INVENTED) expect(flat).toContain(p.name)
    expect(flat).toContain('Pétillant') // an accented character survives the embedded font
    expect(flat).toMatch(/standard drinks/)
    expect(flat).toMatch(/say nothing about quality/)
  })

  // Other test files rewrite the demo's notes and introduction (scripts, long words), so the page count of
  // the demo's own card is checked from the demo's data in tests/unit/cardPdf.test.ts; here the rules that
  // hold whatever the text: type sizes, line breaks, the scale's hint, the venue's paper.
  it('the demo flight through the server: no text under 8.5 pt, no unit parted from its figure; half letter by default for a US venue', async () => {
    const flights = (await manager.get('/api/flights')).body as { id: number, name: string }[]
    const demo = flights.find(f => f.name === 'Shoreline Flight')!
    for (const paper of ['a5', 'half-letter']) {
      const bytes = Buffer.from(await (await manager.raw(`/cards/flights/${demo.id}/card.pdf?paper=${paper}`)).arrayBuffer())
      const pdf = inspectPdf(bytes, `card-demo-${paper}`)
      expect(pdf.pages, paper).toBeLessThanOrEqual(2)
      const runs = pdfRuns(bytes)
      // pdftohtml reads sizes to a third of a point: 8.5 pt reads 8.67, anything under reads 8.33 or less.
      expect(runs.filter(r => r.size < 8.5).map(r => `${r.size}: ${r.text}`), paper).toEqual([])
      expect(unitBreaks(bytes), paper).toEqual([])
      expect(pdf.raw.replace(/\s+/g, ' ')).toContain('Millimetres: hold this edge against the glass, 0 at the liquid\'s surface')
    }
    const byDefault = await manager.raw(`/cards/flights/${demo.id}/card.pdf`)
    expect(byDefault.headers.get('content-disposition')).toBe(`inline; filename="flight-${demo.id}-half-letter.pdf"`)
    expect(inspectPdf(Buffer.from(await byDefault.arrayBuffer())).width).toBeCloseTo(396, 1) // 5.5 in × 72 pt/in
  })

  it('prints several copies, one card per page, and refuses bad options', async () => {
    const res = await manager.raw(`/cards/flights/${flightId}/card.pdf?copies=3`)
    expect(inspectPdf(Buffer.from(await res.arrayBuffer())).pages).toBe(3)
    const bad = await manager.get(`/cards/flights/${flightId}/card.pdf?paper=a4&copies=0`)
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['copies', 'paper'])
  })

  it('staff only: anonymous 401, guest 403', async () => {
    expect((await new Client().get(`/api/flights/${flightId}/card`)).status).toBe(401)
    expect((await (await signedIn('guest')).get(`/cards/flights/${flightId}/card.pdf`)).status).toBe(403)
  })
})

describe('public pour page', () => {
  it('answers for a published flight\'s pour, without sign-in; 404 for drafts and missing pours', async () => {
    const anon = new Client()
    const res = await anon.get(`/api/flights/${flightId}/pours/5`)
    expect(res.status).toBe(200)
    expect(res.body.pour.name).toBe('Lantern Tawny')
    expect(res.body.description.at(-1)).toMatch(/quality/)
    expect((await anon.get(`/api/flights/${flightId}/pours/7`)).status).toBe(404)
    expect((await anon.get(`/api/flights/${flightId}/pours/0`)).status).toBe(400)
    const draft = await manager.post('/api/flights', { name: 'Draft for pour page', pours: [(await manager.get(`/api/flights/${flightId}`)).body.pours[0], (await manager.get(`/api/flights/${flightId}`)).body.pours[1]].map((p: { productId: number, volumeMl: number, glass: { id: number }, servingTempC: number }) => ({ productId: p.productId, volumeMl: p.volumeMl, glassId: p.glass.id, servingTempC: p.servingTempC })) })
    expect((await anon.get(`/api/flights/${draft.body.id}/pours/1`)).status).toBe(404)
  })
})
