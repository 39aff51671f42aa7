import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import Papa from 'papaparse'
import { Client } from '../support/http'
import { signedIn } from '../support/people'
import { withDb } from '../support/db'
import { runTag } from '../support/labSheets'
import { demoFlightId } from '../support/booking'
import { TEAR_SPEED_BINS_MM_S, type TearSpeed } from '../../shared/observations'
import { computeFilm } from '../../shared/science'
import { DEMO_FLIGHTS } from '../../server/demo/data'

/**
 * The manager's predicted-against-observed: rows written straight into the table with values chosen
 * against the model's range for their pour (read from the public pour page), then the summary's
 * counts, the CSV and the calibration switch through HTTP.
 */
let manager: Client
const tag = runTag()
let glassId = 0
let flightId = 0
let productId = 0
let band = { low: 0, high: 0 }
let speedInside: TearSpeed
let speedOutside: TearSpeed | null = null

interface Seed { band: number | null, noClear?: boolean, speed?: TearSpeed | null, device: string | null, source?: 'guest' | 'host', flags?: string[] }

async function insert(rows: Seed[], room: { relativeHumidityPct: number, airTempC: number }) {
  await withDb(async (c) => {
    const [[pour]] = await c.query('SELECT fp.id, fp.product_id AS productId, pm.id AS measurementId, pm.abv_pct_vol AS abv, pm.residual_sugar_g_l AS sugar, fp.serving_temp_c AS temp FROM flight_pours fp JOIN product_measurements pm ON pm.product_id = fp.product_id WHERE fp.flight_id = ? AND fp.position = 1 ORDER BY pm.id DESC LIMIT 1', [flightId]) as any
    const [[venue]] = await c.query('SELECT id FROM venues ORDER BY id LIMIT 1') as any
    for (const r of rows) {
      await c.query(
        `INSERT INTO observations (venue_id, flight_id, flight_pour_id, product_id, measurement_id, glass_id, session_id, source, device_key, abv_pct_vol, residual_sugar_g_l, serving_temp_c,
          band_height_mm, no_clear_band, tears_formed, tear_count, tear_speed, minutes_since, since, room_humidity_pct, room_air_temp_c, room_source, flags, demo, recorded_at)
         VALUES (?, ?, ?, ?, ?, ?, NULL, ?, ?, ?, ?, ?, ?, ?, 'yes', NULL, ?, 3, 'swirl', ?, ?, 'venue', ?, 0, UTC_TIMESTAMP(3))`,
        [venue.id, flightId, pour.id, pour.productId, pour.measurementId, glassId, r.source ?? 'guest', r.device, pour.abv, pour.sugar, pour.temp,
          r.band, r.noClear ? 1 : 0, r.speed ?? null, room.relativeHumidityPct, room.airTempC, JSON.stringify(r.flags ?? [])],
      )
    }
  })
}

const overlaps = (bin: TearSpeed, r: { low: number, high: number }) => TEAR_SPEED_BINS_MM_S[bin].max >= r.low && TEAR_SPEED_BINS_MM_S[bin].min <= r.high

beforeAll(async () => {
  manager = await signedIn('manager')
  const g = await manager.post('/api/glasses', { name: `Analysis tulip ${tag}`, bowlDiameterMm: 72, wallAngleDeg: 72, fillHeightMm: 30 })
  expect(g.status).toBe(201)
  glassId = g.body.id
  const p = await manager.post('/api/products', {
    code: `AN-${tag}`, kind: 'still_wine', name: `Analysis White ${tag}`, producer: 'Analysis Cellar', servingTempC: 10, allergens: [], bottleSizeMl: 750, costPerBottleMinor: 1200,
    measurement: { abvPctVol: 12.5, residualSugarGL: 2, lab: 'Test lab', method: 'Ebulliometry', measuredOn: '2026-10-01' },
  })
  expect(p.status).toBe(201)
  productId = p.body.id
  const f = await manager.post('/api/flights', { name: `Analysis flight ${tag}`, summary: 'Predicted against observed', pours: [{ productId, volumeMl: 60, glassId, servingTempC: 10 }, { productId, volumeMl: 45, glassId, servingTempC: 12 }] })
  expect(f.status, JSON.stringify(f.body)).toBe(201)
  flightId = f.body.id
  expect((await manager.post(`/api/flights/${flightId}/publish`)).status).toBe(200)
  const page = await new Client().get(`/api/flights/${flightId}/pours/1`)
  expect(page.status).toBe(200)
  const pred = page.body.pour.prediction
  band = pred.ranges.clearBandHeight_mm
  const speed = pred.ranges.tearFallSpeed_mm_s
  expect(pred.bandVisible).toBe(true) // a 12.5 % still wine shows a band (common practice, no source)
  speedInside = (['slow', 'steady', 'fast'] as TearSpeed[]).find(b => overlaps(b, speed))!
  speedOutside = (['slow', 'steady', 'fast'] as TearSpeed[]).find(b => !overlaps(b, speed)) ?? null
  const mid = Math.round((band.low + band.high) / 2)
  const farAbove = Math.ceil(band.high + Math.max(5, band.high - band.low) + 4)
  // 6 rows: 3 inside (two from one device at the same pour), 1 far above, 1 "no clear band", 1 flagged.
  await insert([
    { band: mid, speed: speedInside, device: 'a'.repeat(64) },
    { band: mid, speed: speedInside, device: 'a'.repeat(64) },
    { band: mid, speed: speedOutside, device: 'b'.repeat(64) },
    { band: farAbove, device: 'c'.repeat(64) },
    { band: null, noClear: true, device: null, source: 'host' },
    { band: mid, device: 'd'.repeat(64), flags: ['band_without_tears'] },
  ], page.body.room)
})

afterAll(async () => {
  await manager.patch('/api/venue/calibration', { enabled: true })
})

describe('the summary', () => {
  it('counts the glass\'s readings, devices, inside-range rates and flags', async () => {
    const res = await manager.get(`/api/observations/summary?glassId=${glassId}`)
    expect(res.status).toBe(200)
    const s = res.body
    expect(s.total).toBe(6)
    expect(s.flagged).toBe(1)
    expect(s.demo).toBe(0)
    const [g] = s.byGlass
    expect(g.observations).toBe(6)
    expect(g.devices).toBe(5) // a, b, c, d and the host's entry: the repeated device counts once
    expect(g.band).toEqual({ compared: 5, inside: 3 }) // flagged left out; far above and "no clear band" outside
    expect(g.speed.compared).toBe(3)
    expect(g.speed.inside).toBe(speedOutside ? 2 : 3)
    expect(s.byProduct.map((p: { id: number }) => p.id)).toEqual([productId])
    expect(s.byFlight.map((p: { id: number }) => p.id)).toEqual([flightId])
    const outliers = s.outliers.map((o: { row: { outlier: string } }) => o.row.outlier)
    expect(outliers.some((t: string) => t.startsWith('Flagged: a band reported with “no tears”'))).toBe(true)
    expect(outliers.some((t: string) => /far outside/.test(t))).toBe(true)
    expect(s.chart).toHaveLength(1)
    expect(s.chart[0].band).toEqual(band)
    expect(s.chartText.band[0]).toContain('60 % of 5 readings inside')
  })

  it('says how many demo observations the venue\'s figures include, and leaves them out on request', async () => {
    const all = (await manager.get('/api/observations/summary')).body
    const real = (await manager.get('/api/observations/summary?demo=exclude')).body
    expect(all.demo).toBeGreaterThan(200) // the demo season (server/demo/season.ts)
    expect(real.demo).toBe(0)
    expect(all.total - real.total).toBe(all.demo)
    // The season's flooding device (server/demo/season.ts) is one outlier with its 3 entries (the route's cap per device, pour and session), not 3.
    const flood = all.outliers.filter((o: { entries: number, row: { demo: boolean } }) => o.row.demo && o.entries > 1)
    expect(flood).toHaveLength(1)
    expect(flood[0].entries).toBe(3)
    expect(flood[0].row.product.name).toBe('Marsh Samphire Gin')
  })

  it('pages the list', async () => {
    const first = await manager.get(`/api/observations?glassId=${glassId}`)
    expect(first.status).toBe(200)
    expect(first.body.total).toBe(6)
    expect(first.body.rows).toHaveLength(6)
    const second = await manager.get(`/api/observations?glassId=${glassId}&page=2`)
    expect(second.body.rows).toHaveLength(0)
  })

  it.each([
    ['productId=abc', 'productId'],
    ['glassId=-1', 'glassId'],
    ['from=2026-02-30', 'from'],
    ['from=2026-05-02&to=2026-05-01', 'to'],
    ['source=robot', 'source'],
    ['demo=maybe', 'demo'],
  ])('answers 400 on %s, naming the field', async (query, field) => {
    for (const path of ['/api/observations/summary', '/api/observations/export.csv', '/api/observations']) {
      const res = await manager.get(`${path}?${query}`)
      expect(res.status, path).toBe(400)
      expect(Object.keys(res.body.data.fields), path).toContain(field)
    }
  })

  it('answers 400 on page 0 of the list', async () => {
    const res = await manager.get('/api/observations?page=0')
    expect(res.status).toBe(400)
    expect(res.body.data.fields.page).toBeTruthy()
  })
})

describe('the CSV', () => {
  it('has one row per observation with the prediction then and the agreement, under the page\'s filters', async () => {
    const res = await manager.raw(`/api/observations/export.csv?glassId=${glassId}`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/)
    const parsed = Papa.parse<Record<string, string>>(await res.text(), { header: true, skipEmptyLines: true })
    expect(parsed.meta.fields?.slice(0, 4)).toEqual(['Observation', 'Recorded at', 'Source', 'Demo'])
    expect(parsed.meta.fields).toEqual(expect.arrayContaining(['Glass', 'Session', 'Room RH %', 'Band mm', 'Predicted band low mm', 'Predicted band high mm', 'Band against range', 'Flags']))
    expect(parsed.data).toHaveLength(6)
    const row = parsed.data.find(r => r['Band against range'] === 'above')!
    expect(Number(row['Predicted band low mm'])).toBeCloseTo(band.low, 2)
    expect(Number(row['Predicted band high mm'])).toBeCloseTo(band.high, 2)
    expect(parsed.data.filter(r => r.Flags === 'a band reported with “no tears”')).toHaveLength(1)
    expect(parsed.data.filter(r => r['Band against range'] === 'inside')).toHaveLength(4) // the flagged one is inside too; the CSV keeps it
    const hosts = Papa.parse(await (await manager.raw(`/api/observations/export.csv?glassId=${glassId}&source=host`)).text(), { header: true, skipEmptyLines: true })
    expect(hosts.data).toHaveLength(1)
    const before = Papa.parse(await (await manager.raw(`/api/observations/export.csv?glassId=${glassId}&to=2020-01-01`)).text(), { header: true, skipEmptyLines: true })
    expect(before.data).toHaveLength(0)
  })
})

describe('the calibration switch', () => {
  const filmOf = (b: any) => ({ band: b.pour.prediction.clearBandHeight_mm, bandRange: b.pour.prediction.ranges.clearBandHeight_mm, speed: b.pour.prediction.tearFallSpeed_mm_s, speedRange: b.pour.prediction.ranges.tearFallSpeed_mm_s })

  it('uses a glass\'s calibration exactly when the panel says it is in use, and the defaults once switched off', async () => {
    const anon = new Client()
    const demo = await demoFlightId()
    const tulipPour = 3 // Tidewater Albariño in the tulip, the demo season's most-read glass (server/demo/data.ts)
    expect((await manager.patch('/api/venue/calibration', { enabled: true })).status).toBe(200)
    const panel = (await manager.get('/api/observations/summary')).body.calibration
    const tulip = panel.groups.find((g: { glassName: string, roomKey: string | null }) => g.glassName === 'Tulip wine glass' && g.roomKey === null)
    expect(tulip.observations).toBeGreaterThan(100)
    const on = (await anon.get(`/api/flights/${demo}/pours/${tulipPour}`)).body
    const inUse = panel.groups.some((g: { glassName: string, inUse: boolean }) => g.glassName === 'Tulip wine glass' && g.inUse)
    expect(on.calibration !== null).toBe(inUse)
    if (inUse) expect(on.calibration).toMatch(/tuned to this glass by \d+ readings/)

    const off = await manager.patch('/api/venue/calibration', { enabled: false })
    expect(off.status).toBe(200)
    expect(off.body).toEqual({ enabled: false })
    const offPanel = (await manager.get('/api/observations/summary')).body.calibration
    expect(offPanel.enabled).toBe(false)
    expect(offPanel.groups.every((g: { inUse: boolean }) => !g.inUse)).toBe(true)
    const page = (await anon.get(`/api/flights/${demo}/pours/${tulipPour}`)).body
    expect(page.calibration).toBeNull()
    // The published defaults: the model run here, with no calibration, on the same pour, glass and room.
    const r = page.room
    const demoPour = DEMO_FLIGHTS[0]!.pours[tulipPour - 1]!
    const defaults = computeFilm({ abvPctVol: page.abvPctVol, tempC: page.servingTempC, sugarGL: page.residualSugarGL, wallAngleDeg: page.pour.glass.wallAngleDeg, bowlDiameterMm: page.pour.glass.bowlDiameterMm, pourVolumeMl: demoPour.volumeMl, kind: 'still', room: { relativeHumidityPct: r.relativeHumidityPct, airTempC: r.airTempC } })
    expect(defaults.calibration).toBeNull()
    const p = defaults.predictions
    expect(filmOf(page)).toEqual({ band: p.clearBandHeight_mm, bandRange: p.ranges.clearBandHeight_mm, speed: p.tearFallSpeed_mm_s, speedRange: p.ranges.tearFallSpeed_mm_s })
    const card = (await manager.get(`/api/flights/${demo}/card`)).body
    expect(card.calibration).toBeNull()
  })

  it('refuses a switch that is not true or false', async () => {
    const res = await manager.patch('/api/venue/calibration', { enabled: 'yes' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.enabled).toBeTruthy()
  })
})
