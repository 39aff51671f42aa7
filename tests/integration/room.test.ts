import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { Client, uniqueEmail } from '../support/http'
import { signedIn } from '../support/people'
import { withDb } from '../support/db'
import { bookAndPay, demoFlightId, newGuest, newSession, startTodayIn } from '../support/booking'
import { linkToken, waitForMail } from '../support/mail'
import { inspectPdf } from '../support/pdf'
import { DEMO_VENUE } from '../../server/demo/data'

/**
 * The room's air: the venue's usual reading (venue settings) and the host's reading for a session
 * (PUT /api/sessions/[id]/room-reading), what the glass model is given, and what the cards say they
 * assumed. The demo venue reads °F, so every message and card line here speaks °F.
 */
let manager: Client
let host: Client
let otherHost: Client
let hostId: number
let original: Record<string, unknown>
/** Today, hosted by the demo host, with a paid party of two. */
let mine: number
/** Today, hosted by another host. */
let theirs: number
/** In four days, hosted by the demo host. */
let later: number

const F = (c: number) => Math.round(c * 9 / 5 + 32) // °C → whole °F (the Fahrenheit scale's definition)
const venueNow = async () => (await manager.get('/api/venue')).body as Record<string, unknown> & { roomHumidityPct: number, roomAirTempC: number }
const sessionRow = async (id: number) => withDb(async (c) => {
  const [rows] = await c.query('SELECT room_humidity_pct AS rh, room_air_temp_c AS air, room_read_at AS at, room_read_by AS reader FROM tasting_sessions WHERE id = ?', [id])
  const r = (rows as { rh: number | null, air: string | null, at: Date | null, reader: number | null }[])[0]!
  return { rh: r.rh, air: r.air === null ? null : Number(r.air), at: r.at, by: r.reader }
})
const today = (id: number) => withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [startTodayIn(40 + Math.floor(Math.random() * 60)), id]))
const dayOf = async (id: number) => withDb(async (c) => {
  const [rows] = await c.query('SELECT starts_at AS s FROM tasting_sessions WHERE id = ?', [id])
  return DateTime.fromJSDate((rows as { s: Date }[])[0]!.s, { zone: DEMO_VENUE.timeZone }).toISODate()!
})
const read = (c: Client, id: number, body: unknown) => c.request('PUT', `/api/sessions/${id}/room-reading`, body)

beforeAll(async () => {
  manager = await signedIn('manager')
  host = await signedIn('host')
  hostId = (await host.get('/api/account')).body.id
  const email = uniqueEmail('room-host')
  expect((await manager.post('/api/staff', { name: 'Room Host', email, role: 'host' })).status).toBe(201)
  otherHost = new Client()
  expect((await otherHost.post('/api/auth/invitation', { token: linkToken(await waitForMail(email, /invited/), '/welcome'), password: 'room-host-pass-1' })).status).toBe(200)
  const otherId = ((await manager.get('/api/staff')).body as { id: number, email: string }[]).find(s => s.email === email)!.id

  const { id: _id, ...settings } = await venueNow()
  original = settings
  mine = (await newSession(manager, { hoursAhead: 24 * 4, seats: 6 })).id
  theirs = (await newSession(manager, { hoursAhead: 24 * 4, seats: 6 })).id
  later = (await newSession(manager, { hoursAhead: 24 * 4, seats: 6 })).id
  expect((await manager.patch(`/api/sessions/${mine}`, { hostId })).status).toBe(200)
  expect((await manager.patch(`/api/sessions/${later}`, { hostId })).status).toBe(200)
  expect((await manager.patch(`/api/sessions/${theirs}`, { hostId: otherId })).status).toBe(200)
  await bookAndPay(await newGuest('room-party'), mine, 2)
  await today(mine)
  await today(theirs)
})

afterAll(async () => {
  expect((await manager.patch('/api/venue', original)).status).toBe(200)
})

describe('the venue\'s usual room reading', () => {
  it('the demo venue starts with its own reading, which pours and flight cards assume', async () => {
    const v = await venueNow()
    expect({ rh: v.roomHumidityPct, air: v.roomAirTempC }).toEqual({ rh: DEMO_VENUE.roomHumidityPct, air: DEMO_VENUE.roomAirTempC })
    const card = (await manager.get(`/api/flights/${await demoFlightId()}/card`)).body
    expect(card.room).toEqual({
      relativeHumidityPct: DEMO_VENUE.roomHumidityPct, airTempC: DEMO_VENUE.roomAirTempC, source: 'venue', readAt: null,
      text: `Room: ${F(DEMO_VENUE.roomAirTempC)}\u00a0°F, ${DEMO_VENUE.roomHumidityPct} % RH — the room's usual air`,
    })
  })

  it('round-trips through PATCH /api/venue, to a tenth of a degree, and every pour is computed in it', async () => {
    const res = await manager.patch('/api/venue', { ...original, roomHumidityPct: 41, roomAirTempC: 23.8888 }) // 75 °F
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect({ rh: res.body.roomHumidityPct, air: res.body.roomAirTempC }).toEqual({ rh: 41, air: 23.9 })
    expect({ rh: (await venueNow()).roomHumidityPct, air: (await venueNow()).roomAirTempC }).toEqual({ rh: 41, air: 23.9 })
    const flightId = await demoFlightId()
    const view = (await new Client().get(`/api/flights/${flightId}`)).body as { pours: { film: { inputs: { room: unknown } } }[] }
    for (const p of view.pours) expect(p.film.inputs.room).toEqual({ relativeHumidityPct: 41, airTempC: 23.9 })
    expect((await manager.get(`/api/flights/${flightId}/card`)).body.room.text).toBe('Room: 75\u00a0°F, 41 % RH — the room\'s usual air')
    // Another reading: the memoised film must not answer with the one computed for the last room.
    expect((await manager.patch('/api/venue', { ...original, roomHumidityPct: 70, roomAirTempC: 17 })).status).toBe(200)
    const again = (await new Client().get(`/api/flights/${flightId}`)).body as typeof view
    for (const p of again.pours) expect(p.film.inputs.room).toEqual({ relativeHumidityPct: 70, airTempC: 17 })
    const pour = (await new Client().get(`/api/flights/${flightId}/pours/1`)).body
    expect(pour.pour.name).toBeTruthy()
  })

  it('a body without the room fields leaves them as they are', async () => {
    expect((await manager.patch('/api/venue', { ...original, roomHumidityPct: 44, roomAirTempC: 20 })).status).toBe(200)
    const { roomHumidityPct: _rh, roomAirTempC: _air, ...without } = original
    expect((await manager.patch('/api/venue', without)).status).toBe(200)
    const v = await venueNow()
    expect({ rh: v.roomHumidityPct, air: v.roomAirTempC }).toEqual({ rh: 44, air: 20 })
  })

  it.each([
    ['humidity over 100', { roomHumidityPct: 101 }, 'roomHumidityPct', /whole number from 0 to 100 %/],
    ['humidity below 0', { roomHumidityPct: -1 }, 'roomHumidityPct', /whole number from 0 to 100 %/],
    ['humidity with a fraction', { roomHumidityPct: 55.5 }, 'roomHumidityPct', /whole number from 0 to 100 %/],
    ['humidity in words', { roomHumidityPct: 'damp' }, 'roomHumidityPct', /Enter the relative humidity/],
    ['humidity null', { roomHumidityPct: null }, 'roomHumidityPct', /Enter the relative humidity/],
    ['air too warm for the model, told in °F', { roomAirTempC: 41 }, 'roomAirTempC', /between 32 and 104 °F/],
    ['air below freezing, told in °F', { roomAirTempC: -0.5 }, 'roomAirTempC', /between 32 and 104 °F/],
    ['air too warm, told in °C when the body sets °C', { roomAirTempC: 41, temperatureUnit: 'c' }, 'roomAirTempC', /between 0 and 40 °C/],
    ['air in words', { roomAirTempC: 'warm' }, 'roomAirTempC', /Enter the room's usual air temperature/],
  ])('%s: 400 naming the field, nothing written', async (_what, patch, key, message) => {
    const before = await venueNow()
    const res = await manager.patch('/api/venue', { ...original, ...patch })
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(Object.keys(res.body.data.fields)).toEqual([key])
    expect(res.body.data.fields[key]).toMatch(message)
    expect(await venueNow()).toEqual(before)
  })

  it('both room fields bad, and another field: each is named at once', async () => {
    const res = await manager.patch('/api/venue', { ...original, name: '', roomHumidityPct: 120, roomAirTempC: 50 })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['name', 'roomAirTempC', 'roomHumidityPct'])
  })

  it('only a manager may change it', async () => {
    expect((await host.patch('/api/venue', { ...original, roomHumidityPct: 10 })).status).toBe(403)
    expect((await new Client().patch('/api/venue', { ...original, roomHumidityPct: 10 })).status).toBe(401)
  })
})

describe('the host\'s reading for a session', () => {
  it('the host records it; the day, the session\'s cards and its PDF assume it; the flight\'s own card does not', async () => {
    await manager.patch('/api/venue', original)
    expect((await sessionRow(mine)).rh).toBeNull()
    const before = (await host.get(`/api/sessions/${mine}/cards`)).body
    expect(before.cards[0].room.source).toBe('venue')

    const t0 = Date.now()
    const res = await read(host, mine, { relativeHumidityPct: 64, airTempC: 22.7777 }) // 73 °F as the form sends it
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ sessionId: mine, relativeHumidityPct: 64, airTempC: 22.8, readByName: 'Teodor Vasko' })
    const row = await sessionRow(mine)
    expect(row).toMatchObject({ rh: 64, air: 22.8, by: hostId })
    expect(Math.abs(row.at!.getTime() - t0)).toBeLessThan(60_000)
    expect(res.body.readAt).toBe(row.at!.toISOString())

    const day = (await host.get(`/api/days/${await dayOf(mine)}`)).body as { sessions: { id: number, room: unknown, canReadRoom: boolean }[] }
    const onDay = day.sessions.find(s => s.id === mine)!
    expect(onDay.canReadRoom).toBe(true)
    expect(onDay.room).toEqual({ sessionId: mine, relativeHumidityPct: 64, airTempC: 22.8, readAt: row.at!.toISOString(), readByName: 'Teodor Vasko' })

    const cards = (await host.get(`/api/sessions/${mine}/cards`)).body
    expect(cards.cards).toHaveLength(2)
    for (const c of cards.cards) {
      expect(c.room).toEqual({ relativeHumidityPct: 64, airTempC: 22.8, source: 'session', readAt: row.at!.toISOString(), text: 'Room: 73\u00a0°F, 64 % RH — read for this session' })
    }
    // The flight's own card (not the session's) keeps the venue's usual air.
    const flightCard = (await host.get(`/api/flights/${await demoFlightId()}/card`)).body
    expect(flightCard.room.source).toBe('venue')
    expect(flightCard.room.text).toBe(`Room: ${F(DEMO_VENUE.roomAirTempC)}\u00a0°F, ${DEMO_VENUE.roomHumidityPct} % RH — the room's usual air`)

    const started = await host.post(`/api/sessions/${mine}/card-jobs`, { paper: 'a5', names: true })
    expect(started.status).toBe(202)
    let job = { status: 'running' }
    for (let i = 0; i < 150 && job.status === 'running'; i++) {
      await new Promise(r => setTimeout(r, 100))
      job = (await host.get(`/api/card-jobs/${started.body.jobId}`)).body
    }
    expect(job.status).toBe('done')
    const pdf = inspectPdf(Buffer.from(await (await host.raw(`/cards/jobs/${started.body.jobId}/cards.pdf`)).arrayBuffer()))
    const text = pdf.raw.replace(/\s+/g, ' ')
    expect(text.match(/Room: 73 °F, 64 % RH — read for this session/g)).toHaveLength(2)
  })

  it('a newer reading replaces the last; a manager may read any session\'s room', async () => {
    expect((await read(manager, mine, { relativeHumidityPct: 58, airTempC: 21 })).status).toBe(200)
    expect(await sessionRow(mine)).toMatchObject({ rh: 58, air: 21 })
    expect((await host.get(`/api/sessions/${mine}/cards`)).body.cards[0].room.text).toBe('Room: 70\u00a0°F, 58 % RH — read for this session')
    expect((await read(manager, theirs, { relativeHumidityPct: 50, airTempC: 20 })).status).toBe(200)
  })

  it.each([
    ['humidity over 100', { relativeHumidityPct: 101, airTempC: 21 }, ['relativeHumidityPct'], /whole number from 0 to 100 %/],
    ['humidity with a fraction', { relativeHumidityPct: 64.5, airTempC: 21 }, ['relativeHumidityPct'], /whole number from 0 to 100 %/],
    ['no humidity', { airTempC: 21 }, ['relativeHumidityPct'], /Enter the relative humidity/],
    ['air too warm, told in the venue\'s °F', { relativeHumidityPct: 60, airTempC: 40.1 }, ['airTempC'], /between 32 and 104 °F/],
    ['air below freezing', { relativeHumidityPct: 60, airTempC: -3 }, ['airTempC'], /between 32 and 104 °F/],
    ['air as text', { relativeHumidityPct: 60, airTempC: '72' }, ['airTempC'], /Enter the air temperature in °F/],
    ['no air', { relativeHumidityPct: 60 }, ['airTempC'], /Enter the air temperature in °F/],
    ['both bad', { relativeHumidityPct: -5, airTempC: 99 }, ['airTempC', 'relativeHumidityPct'], /./],
  ])('%s: 400 per field, nothing written', async (_what, body, keys, message) => {
    const before = await sessionRow(mine)
    const res = await read(host, mine, body)
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(keys)
    expect(res.body.data.fields[keys[0]!]).toMatch(message)
    expect(await sessionRow(mine)).toEqual(before)
  })

  it('only the session\'s host or a manager, on the session\'s day', async () => {
    const body = { relativeHumidityPct: 60, airTempC: 20 }
    const before = await sessionRow(theirs)
    const other = await read(host, theirs, body) // the host of another session
    expect(other.status).toBe(403)
    expect(other.body.message).toMatch(/Only the session's host or a manager can read the room for it/)
    expect((await read(otherHost, mine, body)).status).toBe(403)
    expect((await read(await signedIn('guest'), mine, body)).status).toBe(403)
    expect((await read(await signedIn('marketing'), mine, body)).status).toBe(403)
    expect((await read(new Client(), mine, body)).status).toBe(401)
    expect((await read(host, 999_999_999, body)).status).toBe(404)
    expect((await read(host, 0, body)).status).toBe(400)
    expect(await sessionRow(theirs)).toEqual(before)
    // Another day's session: its room is read on its own day.
    const notToday = await read(host, later, body)
    expect(notToday.status).toBe(409)
    expect(notToday.body.message).toMatch(/Read the room on the day of the session/)
    expect((await sessionRow(later)).rh).toBeNull()
    expect((await host.get(`/api/days/${await dayOf(later)}`)).body.sessions.find((s: { id: number }) => s.id === later).canReadRoom).toBe(false)
  })

  it('a cancelled session takes no reading', async () => {
    const { id } = await newSession(manager, { hoursAhead: 24 * 4, seats: 4 })
    await today(id)
    expect((await manager.post(`/api/sessions/${id}/cancel`)).status).toBe(200)
    expect((await read(manager, id, { relativeHumidityPct: 60, airTempC: 20 })).status).toBe(409)
  })
})

describe('kinds of drink', () => {
  it('a low- or no-alcohol product is a kind of its own, and each pour tells the model its kind', async () => {
    const glassId = ((await manager.get('/api/glasses')).body as { id: number }[])[0]!.id
    const product = (kind: string, code: string) => ({
      code: `${code}-${Date.now() % 100000}`, kind, name: `Room ${kind}`, producer: 'Room Cellar', servingTempC: 8, allergens: ['sulfites'], bottleSizeMl: 750, costPerBottleMinor: 1100,
      measurement: { abvPctVol: 0.4, residualSugarGL: 20, lab: 'Room Lab', method: 'Ebulliometry', measuredOn: '2026-10-01' },
    })
    const make = async (kind: string, code: string) => {
      const res = await manager.post('/api/products', product(kind, code))
      expect(res.status, JSON.stringify(res.body)).toBe(201)
      return res.body
    }
    const low = await make('low_alcohol', 'RM-LOW')
    expect(low.kind).toBe('low_alcohol')
    expect(low.derived.tastingPourMl).toBe(60)
    const still = await make('still_wine', 'RM-STL')
    // The same numbers in the same glass: only the kind differs, so a memo keyed without it would answer both alike.
    const preview = await manager.post('/api/flights/preview', { pours: [still.id, low.id].map(productId => ({ productId, volumeMl: 60, glassId, servingTempC: 8 })) })
    expect(preview.status, JSON.stringify(preview.body)).toBe(200)
    expect(preview.body.pours.map((p: { film: { inputs: { kind: string } } }) => p.film.inputs.kind)).toEqual(['still', 'low_alcohol'])
    const demo = (await new Client().get(`/api/flights/${await demoFlightId()}`)).body as { pours: { product: { kind: string }, film: { inputs: { kind: string } } }[] }
    const expected: Record<string, string> = { still_wine: 'still', sparkling: 'sparkling', fortified: 'fortified', spirit: 'spirit', cider: 'cider', beer: 'beer', other: 'other' }
    for (const p of demo.pours) expect(p.film.inputs.kind).toBe(expected[p.product.kind])
    const bad = await manager.post('/api/products', product('alcohol_free', 'RM-BAD'))
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.kind).toMatch(/low_alcohol/)
  })
})
