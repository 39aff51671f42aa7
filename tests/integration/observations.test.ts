import { createHash, createHmac, hkdfSync, randomBytes } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import { signedIn } from '../support/people'
import { countRows, withDb } from '../support/db'
import { demoFlightId, newGuest, newSession } from '../support/booking'
import { localSecrets } from '../../scripts/lib/secrets'
import { CHALLENGE_BITS, CHALLENGE_MIN_MS, CHALLENGE_TTL_MS, leadingZeroBits } from '../../shared/observationChallenge'

/**
 * Guests' and hosts' observations through the built server and the real database: the form's fields
 * refused one by one with nothing written, the bot check, the flood limit, the session tie and the
 * room reading, the flags, no identity stored, the comparison's aggregates, and the host's route.
 */
interface Answer { token: string, counter: number }

/** The browser's work, done with Node's hash (the same SHA-256 the page runs with WebCrypto). */
function solve(token: string, bits = CHALLENGE_BITS): number {
  for (let c = 0; ; c++) if (leadingZeroBits(createHash('sha256').update(`${token}:${c}`).digest()) >= bits) return c
}

async function challenge(client: Client): Promise<Answer> {
  const res = await client.get('/api/observations/challenge')
  expect(res.status).toBe(200)
  return { token: res.body.token, counter: solve(res.body.token, res.body.bits) }
}

/** Waits out the bot check's shortest time between challenge and answer. */
const pause = () => new Promise(r => setTimeout(r, CHALLENGE_MIN_MS + 200))

/** A challenge signed with the test server's own key (derived as server/utils/observationGuard.ts does), issued `ageMs` ago. */
function signedChallenge(ageMs: number, secret = localSecrets('test').sessionPassword): Answer {
  const key = Buffer.from(hkdfSync('sha256', secret, 'larmoir', 'observation challenge v1', 32))
  const payload = Buffer.from(JSON.stringify({ v: 1, id: randomBytes(16).toString('base64url'), iat: Date.now() - ageMs, bits: CHALLENGE_BITS })).toString('base64url')
  const token = `${payload}.${createHmac('sha256', key).update(payload).digest('base64url')}`
  return { token, counter: solve(token) }
}

let flightId: number
let otherFlightId: number
let manager: Client
let sessionId: number

const fields = { bandHeightMm: 8, noClearBand: false, tearsFormed: 'yes', tearCount: '6_to_15', tearSpeed: 'steady', minutesSince: 4, since: 'swirl' }
const body = (answer: Answer, over: Record<string, unknown> = {}) => ({ flightId, position: 1, sessionId, ...fields, challenge: answer, website: '', ...over })

async function rowsOf(where: string, params: unknown[]): Promise<Record<string, any>[]> {
  return withDb(async c => (await c.query(`SELECT * FROM observations WHERE ${where} ORDER BY id`, params))[0] as Record<string, any>[])
}

beforeAll(async () => {
  manager = await signedIn('manager')
  flightId = await demoFlightId()
  // A second published flight of two pours, for a card of another flight.
  const demoPour = (await manager.get(`/api/flights/${flightId}`)).body.pours[0]
  const made = await manager.post('/api/flights', { name: `Observation flight ${Date.now().toString(36)}`, summary: 'Another flight', pours: [30, 40].map(volumeMl => ({ productId: demoPour.productId, volumeMl, glassId: demoPour.glass.id, servingTempC: 12 })) })
  expect(made.status, JSON.stringify(made.body)).toBe(201)
  otherFlightId = made.body.id
  expect((await manager.post(`/api/flights/${otherFlightId}/publish`)).status).toBe(200)
  sessionId = (await newSession(manager, { hoursAhead: 1, seats: 6 })).id
  // The host's reading of this session's room, as PUT /api/sessions/[id]/room-reading stores it.
  await withDb(c => c.query('UPDATE tasting_sessions SET room_humidity_pct = 71, room_air_temp_c = 24.5, room_read_at = UTC_TIMESTAMP(3) WHERE id = ?', [sessionId]))
})

describe('the guest form refuses bad input field by field', () => {
  const fake: Answer = { token: 'x.y', counter: 0 }
  const cases: { what: string, over: Record<string, unknown>, field: string, message: RegExp }[] = [
    { what: 'a negative band', over: { bandHeightMm: -2 }, field: 'bandHeightMm', message: /cannot be below 0 mm/ },
    { what: 'a band past the card’s 80 mm scale', over: { bandHeightMm: 81 }, field: 'bandHeightMm', message: /scale ends at 80 mm/ },
    { what: 'a band as text', over: { bandHeightMm: 'tall' }, field: 'bandHeightMm', message: /as a number from 0 to 80/ },
    { what: 'a band and “no clear band” together', over: { bandHeightMm: 5, noClearBand: true }, field: 'bandHeightMm', message: /chose “no clear band”/ },
    { what: 'no answer on tears', over: { tearsFormed: undefined }, field: 'tearsFormed', message: /whether tears formed/ },
    { what: 'an unknown count bin', over: { tearCount: 'lots' }, field: 'tearCount', message: /roughly how many tears/ },
    { what: 'an unknown speed bin', over: { tearSpeed: 'glacial' }, field: 'tearSpeed', message: /how fast the tears slid/ },
    { what: 'a count with “no tears”', over: { tearsFormed: 'no', tearCount: 'up_to_5', tearSpeed: null }, field: 'tearCount', message: /no tears formed/ },
    { what: 'minutes over the most', over: { minutesSince: 241 }, field: 'minutesSince', message: /At most 240 minutes/ },
    { what: 'minutes in fractions', over: { minutesSince: 2.5 }, field: 'minutesSince', message: /whole minutes/ },
    { what: 'no counting point', over: { since: 'lunch' }, field: 'since', message: /from the pour or from the last swirl/ },
    { what: 'no bot check at all', over: { challenge: undefined }, field: 'challenge', message: /bot check is missing/ },
    { what: 'the hidden box filled in', over: { website: 'http://spam.example' }, field: 'website', message: /Leave this box empty/ },
  ]
  it.each(cases)('$what → 400 on $field, nothing written', async ({ over, field, message }) => {
    const before = await countRows('observations')
    const res = await new Client().post('/api/observations', body(fake, over))
    expect(res.status).toBe(400)
    expect(res.body.data.fields[field]).toMatch(message)
    expect(Object.keys(res.body.data.fields)).toEqual([field])
    expect(await countRows('observations')).toBe(before)
  })
})

describe('a guest\'s observation', () => {
  it('is stored with the pour\'s numbers, the session, the session\'s room reading — and nothing that names the guest, even signed in', async () => {
    const guest = await newGuest('obs-identity')
    const answer = await challenge(guest.client)
    await pause()
    const res = await guest.client.post('/api/observations', body(answer))
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ sessionId, roomSource: 'session', flags: [] })

    const [row] = await rowsOf('id = ?', [res.body.id])
    const flight = (await manager.get(`/api/flights/${flightId}`)).body
    const pour = flight.pours[0]
    const product = (await manager.get(`/api/products/${pour.productId}`)).body
    expect(row).toMatchObject({ session_id: sessionId, source: 'guest', room_humidity_pct: 71, room_source: 'session', glass_id: pour.glass.id, product_id: pour.productId, band_height_mm: 8, tears_formed: 'yes', tear_count: '6_to_15', tear_speed: 'steady', minutes_since: 4 })
    expect(Number(row!.room_air_temp_c)).toBe(24.5)
    expect(row!.abv_pct_vol).toBe(product.current.abvPctVol)
    expect(row!.residual_sugar_g_l).toBe(product.current.residualSugarGL)
    expect(row!.serving_temp_c).toBe(pour.servingTempC)
    expect(row!.measurement_id).toBe(product.current.id)
    // The device key is a keyed hash: 64 hex characters, not the cookie, nothing of the account or the address.
    expect(row!.device_key).toMatch(/^[0-9a-f]{64}$/)
    const stored = JSON.stringify(row)
    for (const secret of [guest.email, guest.name, guest.client.ip]) expect(stored).not.toContain(secret)
    const columns = await withDb(async c => ((await c.query('SHOW COLUMNS FROM observations'))[0] as { Field: string }[]).map(r => r.Field))
    expect(columns.filter(c => /user|email|ip|address|cookie|name/.test(c))).toEqual([])
  })

  it('a session of another flight, or one not on now, is stored as none and flagged', async () => {
    const guest = new Client()
    const other = (await newSession(manager, { hoursAhead: 1, seats: 4, flightId: otherFlightId })).id
    const later = (await newSession(manager, { hoursAhead: 24 * 3, seats: 4 })).id
    const [a, b] = [await challenge(guest), await challenge(guest)]
    await pause()
    const wrongFlight = await guest.post('/api/observations', body(a, { sessionId: other }))
    const notNow = await guest.post('/api/observations', body(b, { sessionId: later }))
    expect(wrongFlight.status).toBe(201)
    expect(notNow.status).toBe(201)
    expect(wrongFlight.body).toMatchObject({ sessionId: null, roomSource: 'venue', flags: ['session_not_this_flight'] })
    expect(notNow.body).toMatchObject({ sessionId: null, flags: ['session_not_now'] })
    const rows = await rowsOf('id IN (?, ?)', [wrongFlight.body.id, notNow.body.id])
    expect(rows.map(r => [r.session_id, r.room_source, r.flags])).toEqual([[null, 'venue', ['session_not_this_flight']], [null, 'venue', ['session_not_now']]])
  })

  it('keeps an implausible reading and flags it', async () => {
    const guest = new Client()
    const answer = await challenge(guest)
    await pause()
    const res = await guest.post('/api/observations', body(answer, { bandHeightMm: 70, tearsFormed: 'no', tearCount: null, tearSpeed: null, minutesSince: 150 }))
    expect(res.status).toBe(201)
    // Over 4× the predicted high end only if the model's range for this pour ends below 17.5 mm (GET /api/flights/[id]/pours/1).
    const high = (await new Client().get(`/api/flights/${flightId}/pours/1`)).body.pour.prediction.ranges.clearBandHeight_mm?.high ?? 0
    expect(res.body.flags).toEqual([...(high > 0 && 70 > 4 * high ? ['band_far_above_prediction'] : []), 'band_over_50_mm', 'band_without_tears', 'read_after_two_hours'])
    const [row] = await rowsOf('id = ?', [res.body.id])
    expect(row!.band_height_mm).toBe(70)
    expect(row!.flags).toEqual(res.body.flags)
  })

  it('a flood from one device: 6 at once, at most 3 kept for that pour and session, the rest 429', async () => {
    const guest = new Client()
    const floodSession = (await newSession(manager, { hoursAhead: 1, seats: 4 })).id
    const answers = await Promise.all(Array.from({ length: 6 }, () => challenge(guest)))
    await pause()
    const replies = await Promise.all(answers.map(a => guest.post('/api/observations', body(a, { sessionId: floodSession }))))
    expect(replies.map(r => r.status).sort()).toEqual([201, 201, 201, 429, 429, 429])
    expect(replies.find(r => r.status === 429)!.body.message).toMatch(/recorded 3 glasses of this pour at this session/)
    const kept = await rowsOf('session_id = ?', [floodSession])
    expect(kept).toHaveLength(3)
    expect(new Set(kept.map(r => r.device_key)).size).toBe(1)
    // Another pour of the same session is still open to that phone.
    const next = await challenge(guest)
    await pause()
    expect((await guest.post('/api/observations', body(next, { sessionId: floodSession, position: 2 }))).status).toBe(201)
  })
})

describe('the bot check', () => {
  it('refuses an answer too soon, then takes the same one after the wait', async () => {
    const guest = new Client()
    const answer = await challenge(guest)
    const early = await guest.post('/api/observations', body(answer))
    expect(early.status).toBe(403)
    expect(early.body.data.challenge).toBe('too_fast')
    await pause()
    expect((await guest.post('/api/observations', body(answer))).status).toBe(201)
  })

  it('refuses a reused, a wrong, a forged and an expired challenge', async () => {
    const guest = new Client()
    const answer = await challenge(guest)
    const wrong = await challenge(guest)
    await pause()
    const before = await countRows('observations')
    expect((await guest.post('/api/observations', body(answer))).status).toBe(201)
    const reused = await guest.post('/api/observations', body(answer))
    expect([reused.status, reused.body.data.challenge]).toEqual([403, 'reused'])
    // The next counter that does not answer: the hash of a wrong counter lacks the zero bits.
    let bad = wrong.counter + 1
    while (leadingZeroBits(createHash('sha256').update(`${wrong.token}:${bad}`).digest()) >= CHALLENGE_BITS) bad++
    const wrongAnswer = await guest.post('/api/observations', body({ token: wrong.token, counter: bad }))
    expect([wrongAnswer.status, wrongAnswer.body.data.challenge]).toEqual([403, 'wrong'])
    const forged = await guest.post('/api/observations', body(signedChallenge(10_000, 'a-key-that-is-not-the-servers-at-all-0123')))
    expect([forged.status, forged.body.data.challenge, forged.body.message]).toEqual([403, 'forged', expect.stringMatching(/not issued by this site/)])
    const expired = await guest.post('/api/observations', body(signedChallenge(CHALLENGE_TTL_MS + 60_000)))
    expect([expired.status, expired.body.data.challenge]).toEqual([403, 'expired'])
    // Signed with the right key and fresh enough, the same way is taken: the check reads the signature, not the sender.
    expect((await guest.post('/api/observations', body(signedChallenge(5_000)))).status).toBe(201)
    expect(await countRows('observations') - before).toBe(2)
  })

  it('sets a long-lived, httpOnly, SameSite=Lax device cookie', async () => {
    const res = await new Client().send('GET', '/api/observations/challenge')
    const cookie = res.headers.getSetCookie().find(c => c.startsWith('larmoir_device='))!
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
    expect(Number(/Max-Age=(\d+)/i.exec(cookie)![1])).toBeGreaterThan(300 * 24 * 3600)
  })
})

describe('the comparison', () => {
  it('is aggregated: the model\'s ranges, others in bins without this device, and where this device\'s newest entry fell', async () => {
    const compareSession = (await newSession(manager, { hoursAhead: 1, seats: 4 })).id
    const others = [new Client(), new Client(), new Client()]
    const me = new Client()
    const answers = await Promise.all([...others, me].map(c => challenge(c)))
    await pause()
    const bands = [4.5, 5, 9]
    for (const [i, c] of others.entries()) expect((await c.post('/api/observations', body(answers[i]!, { sessionId: compareSession, position: 3, bandHeightMm: bands[i] }))).status).toBe(201)
    expect((await me.post('/api/observations', body(answers[3]!, { sessionId: compareSession, position: 3, bandHeightMm: 6, tearSpeed: 'fast' }))).status).toBe(201)

    const seen = await me.get(`/api/flights/${flightId}/pours/3/observations?s=${compareSession}`)
    expect(seen.status).toBe(200)
    const before = (await new Client().get(`/api/flights/${flightId}/pours/3/observations`)).body
    expect(seen.body.sessionId).toBe(compareSession)
    expect(seen.body.mine).toMatchObject({ bandHeightMm: 6, tearSpeed: 'fast' })
    expect(seen.body.entriesLeft).toBe(2)
    // A visitor without entries sees one more reading among the others (this device's own) and no "mine".
    expect(before.mine).toBeNull()
    expect(before.others.count).toBe(seen.body.others.count + 1)
    const bins = new Map(seen.body.others.band.map((b: { fromMm: number, count: number }) => [b.fromMm, b.count]))
    expect(bins.get(4)).toBeGreaterThanOrEqual(2) // 4.5 and 5 fall in [4, 6)
    expect(bins.get(8)).toBeGreaterThanOrEqual(1)
    expect(seen.body.predicted.band.low).toBeLessThan(seen.body.predicted.band.high)
    expect(seen.body.predicted.room).toEqual({ relativeHumidityPct: expect.any(Number), airTempC: expect.any(Number), source: 'venue' })
    const text = JSON.stringify(seen.body)
    expect(text).not.toMatch(/device|deviceKey|recorded_at|"id"/)
  })
})

describe('the host\'s observation', () => {
  let hostSession: number
  let host: Client
  beforeAll(async () => {
    host = await signedIn('host')
    hostSession = (await newSession(manager, { hoursAhead: 1, seats: 4 })).id
    expect((await manager.patch(`/api/sessions/${hostSession}`, { hostId: (await host.get('/api/account')).body.id })).status).toBe(200)
  })
  const hostBody = { position: 2, ...fields, relativeHumidityPct: 58, airTempC: 22.2 }

  it('only the session\'s host or a manager may record; guests and strangers are refused', async () => {
    expect((await new Client().post(`/api/sessions/${hostSession}/observations`, hostBody)).status).toBe(401)
    expect((await (await newGuest('obs-host')).client.post(`/api/sessions/${hostSession}/observations`, hostBody)).status).toBe(403)
    expect((await (await signedIn('marketing')).post(`/api/sessions/${hostSession}/observations`, hostBody)).status).toBe(403)
    const notHers = (await newSession(manager, { hoursAhead: 1, seats: 4 })).id
    expect((await host.post(`/api/sessions/${notHers}/observations`, hostBody)).status).toBe(403)
  })

  it('the host\'s reading of the room goes with it; no device key', async () => {
    const res = await host.post(`/api/sessions/${hostSession}/observations`, hostBody)
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ source: 'host', sessionId: hostSession, roomSource: 'host' })
    const [row] = await rowsOf('id = ?', [res.body.id])
    // The demo venue reads °F, so 22.2 on the wire is °C as the API always takes it.
    expect(row).toMatchObject({ source: 'host', device_key: null, session_id: hostSession, room_humidity_pct: 58, room_source: 'host' })
    expect(Number(row!.room_air_temp_c)).toBe(22.2)
    expect((await manager.post(`/api/sessions/${hostSession}/observations`, { ...hostBody, position: 1 })).status).toBe(201)
    const list = (await host.get(`/api/sessions/${hostSession}/observations`)).body
    expect(list.pours.find((p: { position: number }) => p.position === 2)).toMatchObject({ hostEntries: 1, guestEntries: 0 })
  })

  it('refuses a humidity no hygrometer shows, beside its field', async () => {
    const before = await countRows('observations', 'session_id = ?', [hostSession])
    const res = await host.post(`/api/sessions/${hostSession}/observations`, { ...hostBody, relativeHumidityPct: 130 })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.relativeHumidityPct).toMatch(/whole number from 0 to 100/)
    expect(await countRows('observations', 'session_id = ?', [hostSession])).toBe(before)
  })

  it('refuses a session long past (409)', async () => {
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = UTC_TIMESTAMP(3) - INTERVAL 10 HOUR WHERE id = ?', [hostSession]))
    try {
      const res = await host.post(`/api/sessions/${hostSession}/observations`, hostBody)
      expect(res.status).toBe(409)
      expect(res.body.message).toMatch(/6 hours after it ends/)
    }
    finally {
      await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = UTC_TIMESTAMP(3) + INTERVAL 1 HOUR WHERE id = ?', [hostSession]))
    }
  })
})
