import { beforeAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { Client, uniqueEmail } from '../support/http'
import { signedIn } from '../support/people'
import { withDb } from '../support/db'
import { bookAndPay, newGuest, newSession, startTodayIn } from '../support/booking'
import { linkToken, waitForMail } from '../support/mail'
import { inspectPdf } from '../support/pdf'
import { DEMO_VENUE } from '../../server/demo/data'

let manager: Client
let host: Client
let otherHost: Client
let sessionId: number
let day: string
const parties: Record<'a' | 'b' | 'c' | 'd' | 'e', { id: number, name: string, reference: string }> = {} as never
let hostName: string
let hostId: number

async function moveStart(minutesFromNow: number, { today = true } = {}) {
  // Held inside the venue's today unless the test needs the exact instant (its day is then read back).
  const at = today ? startTodayIn(minutesFromNow) : new Date(Date.now() + minutesFromNow * 60_000)
  await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [at, sessionId]))
  const [rows] = await withDb(c => c.query('SELECT starts_at AS s FROM tasting_sessions WHERE id = ?', [sessionId]))
  day = DateTime.fromJSDate((rows as { s: Date }[])[0]!.s, { zone: DEMO_VENUE.timeZone }).toISODate()!
}

interface DayParty { id: number, state: string, partySize: number, source: string, notes: string | null, canUndo: boolean, checkIn: { outcome: string, seated: number } | null, history: { event: string, fromState: string, toState: string, actorName: string | null, reason: string | null }[] }
interface DaySession { id: number, counts: { seats: number, taken: number, seatsLeft: number, bookedOnline: number, walkIns: number, tiles: Record<string, number> }, parties: DayParty[] }
const hostDay = async (c: Client) => (await c.get(`/api/days/${day}`)).body as { sessions: DaySession[] }
const mySession = async () => (await hostDay(host)).sessions.find(x => x.id === sessionId)!
const partyOf = (s: DaySession, key: keyof typeof parties) => s.parties.find(p => p.id === parties[key].id)!
const noTiles = { paying: 0, toCome: 0, seated: 0, notSeated: 0, didNotCome: 0, turnedAway: 0 }

beforeAll(async () => {
  manager = await signedIn('manager')
  host = await signedIn('host')
  const account = (await host.get('/api/account')).body
  hostId = account.id
  hostName = account.name
  // A second host who does not run this session.
  const email = uniqueEmail('otherhost')
  await manager.post('/api/staff', { name: 'Other Host', email, role: 'host' })
  otherHost = new Client()
  await otherHost.post('/api/auth/invitation', { token: linkToken(await waitForMail(email, /invited/), '/welcome'), password: 'other-host-pass-1' })

  sessionId = (await newSession(manager, { hoursAhead: 24 * 3, seats: 9, priceMinor: 3000 })).id
  expect((await manager.patch(`/api/sessions/${sessionId}`, { hostId })).status).toBe(200)
  const sizes = { a: 2, b: 3, c: 1, d: 1, e: 1 } as const
  for (const key of ['a', 'b', 'c', 'd', 'e'] as const) {
    const g = await newGuest(`party-${key}`)
    const booked = await bookAndPay(g, sessionId, sizes[key])
    parties[key] = { id: booked.id, name: g.name, reference: booked.reference }
  }
  await withDb(c => c.query('UPDATE bookings SET notes = ? WHERE id = ?', ['Nut allergy', parties.b.id]))
  await moveStart(20) // the session starts in 20 minutes: today, not started yet
})

describe('the host\'s day', () => {
  it('lists the session with its parties, notes and counts; other hosts, guests and visitors are refused', async () => {
    const mine = await hostDay(host)
    const s = mine.sessions.find(x => x.id === sessionId)!
    expect(s.parties).toHaveLength(5)
    expect(s.counts).toMatchObject({ seats: 9, taken: 8, seatsLeft: 1, bookedOnline: 8, walkIns: 0, tiles: { ...noTiles, toCome: 8 } })
    expect(s.parties.find(p => p.id === parties.b.id)!.notes).toBe('Nut allergy')
    expect((await hostDay(otherHost)).sessions.some(x => x.id === sessionId)).toBe(false)
    expect((await hostDay(manager)).sessions.some(x => x.id === sessionId)).toBe(true)
    expect((await otherHost.post(`/api/bookings/${parties.a.id}/check-in`, { seated: 2, idsSeen: 2 })).status).toBe(403)
    expect((await (await signedIn('guest')).get(`/api/days/${day}`)).status).toBe(403)
    expect((await new Client().post(`/api/bookings/${parties.a.id}/check-in`, { seated: 2, idsSeen: 2 })).status).toBe(401)
    expect((await host.get('/api/days/2026-13-01')).status).toBe(400)
  })

  it('checks a party in with every ID seen, once', async () => {
    const ok = await host.post(`/api/bookings/${parties.a.id}/check-in`, { seated: 2, idsSeen: 2 })
    expect(ok.status).toBe(200)
    const again = await host.post(`/api/bookings/${parties.a.id}/check-in`, { seated: 2, idsSeen: 2 })
    expect(again.status).toBe(409)
    const [rows] = await withDb(c => c.query('SELECT b.state, c.outcome, c.seated, c.ids_seen AS idsSeen FROM bookings b JOIN check_ins c ON c.booking_id = b.id WHERE b.id = ?', [parties.a.id]))
    expect((rows as object[])[0]).toMatchObject({ state: 'checked_in', outcome: 'arrived', seated: 2, idsSeen: 2 })
  })

  it('seats part of a party only with a reason, and only with each seated guest\'s ID seen', async () => {
    const noReason = await host.post(`/api/bookings/${parties.b.id}/check-in`, { seated: 2, idsSeen: 2 })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.fields.reason).toMatch(/why/i)
    const missingId = await host.post(`/api/bookings/${parties.b.id}/check-in`, { seated: 2, idsSeen: 1, reason: 'One guest had no ID' })
    expect(missingId.status).toBe(400)
    expect(missingId.body.data.fields.idsSeen).toMatch(/ID of every guest/)
    const tooMany = await host.post(`/api/bookings/${parties.b.id}/check-in`, { seated: 4, idsSeen: 4 })
    expect(tooMany.status).toBe(400)
    expect((await host.post(`/api/bookings/${parties.b.id}/check-in`, { seated: 2, idsSeen: 2, reason: 'One guest had no ID' })).status).toBe(200)
    const s = (await hostDay(host)).sessions.find(x => x.id === sessionId)!
    expect(s.parties.find(p => p.id === parties.b.id)!.checkIn).toMatchObject({ outcome: 'arrived', seated: 2 })
  })

  it('marks no-shows only after the start; turning away needs a reason', async () => {
    const early = await host.post(`/api/bookings/${parties.c.id}/no-show`)
    expect(early.status).toBe(409)
    expect(early.body.message).toMatch(/after the session has started/)
    expect((await host.post(`/api/bookings/${parties.d.id}/turn-away`, { reason: '' })).status).toBe(400)
    expect((await host.post(`/api/bookings/${parties.d.id}/turn-away`, { reason: 'No photo ID' })).status).toBe(200)
    await moveStart(-10)
    expect((await host.post(`/api/bookings/${parties.c.id}/no-show`)).status).toBe(200)
    const s = (await hostDay(host)).sessions.find(x => x.id === sessionId)!
    expect(s.parties.find(p => p.id === parties.c.id)!.state).toBe('no_show')
    expect(s.parties.find(p => p.id === parties.d.id)!.checkIn!.outcome).toBe('turned_away')
    expect(s.counts.tiles).toEqual({ ...noTiles, toCome: 1, seated: 4, notSeated: 1, didNotCome: 1, turnedAway: 1 })
  })

  it('seats walk-ins in seats left only, each ID checked', async () => {
    // Seats taken: a (2) + b (3 booked) + e (1 to come) = 6 of 9; c and d no longer hold seats.
    expect((await host.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'Walk-in group', partySize: 4, idsSeen: 4 })).status).toBe(409)
    const unchecked = await host.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'Walk-in pair', partySize: 2, idsSeen: 1 })
    expect(unchecked.status).toBe(400)
    expect((await host.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'Walk-in pair', partySize: 2, idsSeen: 2 })).status).toBe(201)
    expect((await otherHost.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'x', partySize: 1, idsSeen: 1 })).status).toBe(403)
    const s = (await hostDay(host)).sessions.find(x => x.id === sessionId)!
    expect(s.counts).toMatchObject({ taken: 8, seatsLeft: 1, walkIns: 2 })
  })

  it('has tiles that add up to the guests booked plus the walk-ins, with the seats left beside them', async () => {
    // a seated in full (2), b partly seated (2 of 3), c did not come (1), d turned away (1), e still to come (1), a walk-in pair.
    const s = await mySession()
    expect(s.counts.tiles).toEqual({ paying: 0, toCome: 1, seated: 2 + 2 + 2, notSeated: 1, didNotCome: 1, turnedAway: 1 })
    const booked = s.parties.filter(p => p.source === 'online').reduce((n, p) => n + p.partySize, 0)
    const walkIns = s.parties.filter(p => p.source === 'walk_in').reduce((n, p) => n + p.partySize, 0)
    expect({ booked, walkIns }).toEqual({ booked: 8, walkIns: 2 })
    expect(s.counts).toMatchObject({ bookedOnline: booked, walkIns })
    expect(Object.values(s.counts.tiles).reduce((a, b) => a + b, 0)).toBe(booked + walkIns)
    expect(s.counts.seatsLeft).toBe(s.counts.seats - s.counts.taken)
  })

  it('prints the session\'s cards: one per seated guest, with names, as one PDF made with progress', async () => {
    const data = (await host.get(`/api/sessions/${sessionId}/cards`)).body
    expect(data.cards).toHaveLength(7) // a: 2 seated, b: 2 seated, walk-ins: 2, e: 1 still to come
    expect(data.cards.map((c: { guestName: string }) => c.guestName)).toContain(parties.a.name)
    const started = await host.post(`/api/sessions/${sessionId}/card-jobs`, { paper: 'a5', names: true })
    expect(started.status).toBe(202)
    expect(started.body.total).toBe(7)
    let job = { status: 'running', done: 0, total: 7 }
    for (let i = 0; i < 100 && job.status === 'running'; i++) {
      job = (await host.get(`/api/card-jobs/${started.body.jobId}`)).body
      await new Promise(r => setTimeout(r, 100))
    }
    expect(job).toMatchObject({ status: 'done', done: 7, total: 7 })
    const res = await host.raw(`/cards/jobs/${started.body.jobId}/cards.pdf`)
    expect(res.headers.get('content-type')).toBe('application/pdf')
    expect(res.headers.get('content-disposition')).toBe(`attachment; filename="session-${sessionId}-cards-a5.pdf"`)
    expect(res.headers.get('content-security-policy')).toBe('frame-ancestors \'self\'')
    const pdf = inspectPdf(Buffer.from(await res.arrayBuffer()))
    expect(pdf.pages).toBe(7)
    expect(pdf.pageText(1).replace(/\s+/g, ' ')).toMatch(/Poured for/)
    expect(pdf.text).toContain(parties.a.name)
    expect((await otherHost.get(`/api/card-jobs/${started.body.jobId}`)).status).toBe(404)
    expect((await otherHost.post(`/api/sessions/${sessionId}/card-jobs`, {})).status).toBe(403)
  })
})

describe('finding a party by its reference', () => {
  const find = (c: Client, typed: string) => c.get(`/api/bookings/by-reference/${encodeURIComponent(typed)}`)

  it('finds the party as stored, in lower case with spaces, with dashes, and with O, I and L for 0 and 1', async () => {
    const { id, reference } = parties.e
    const exact = await find(host, reference)
    expect(exact.status).toBe(200)
    expect(exact.body).toMatchObject({ party: { id, reference, contactName: parties.e.name, partySize: 1 }, session: { id: sessionId, date: day }, onList: true })
    const spaced = `${reference.slice(0, 3)} ${reference.slice(3, 7)} ${reference.slice(7)}`.toLowerCase()
    expect((await find(host, spaced)).body.party?.id).toBe(id)
    expect((await find(host, `${reference.slice(0, 5)}-${reference.slice(5)}`)).body.party?.id).toBe(id)
    // Crockford, "Base32", crockford.com/base32.html: O reads as 0, I and L as 1.
    const misread = reference.replace(/0/g, 'o').replace(/1/g, 'L')
    expect((await find(host, misread)).body.party?.id).toBe(id)
    expect((await find(manager, reference)).status).toBe(200)
  })

  it('says so when no booking has the reference, or when it cannot be one', async () => {
    const unknown = await find(host, '0000000000')
    expect(unknown.status).toBe(404)
    expect(unknown.body.message).toMatch(/No booking has the reference 0000000000/)
    const short = await find(host, 'ABC-12')
    expect(short.status).toBe(400)
    expect(short.body.data.fields.reference).toMatch(/10 letters and digits/)
    expect((await find(host, 'ABCDEFGHJU')).status).toBe(400) // U is not in Crockford's alphabet (crockford.com/base32.html)
  })

  it('answers a booking of another day with its session, so the door can say which', async () => {
    const later = await newSession(manager, { hoursAhead: 24 * 6, seats: 4 })
    expect((await manager.patch(`/api/sessions/${later.id}`, { hostId })).status).toBe(200)
    const g = await newGuest('later-day')
    const booked = await bookAndPay(g, later.id, 2)
    const res = await find(host, booked.reference.toLowerCase())
    expect(res.status).toBe(200)
    const laterDay = DateTime.fromISO(later.startsAt).setZone(DEMO_VENUE.timeZone).toISODate()
    expect(laterDay).not.toBe(day)
    expect(res.body).toMatchObject({ party: { id: booked.id, state: 'confirmed' }, session: { id: later.id, date: laterDay, flightName: expect.any(String), startsAt: later.startsAt }, onList: true })
  })

  it('refuses guests, visitors and a host of another session, saying whose session it is', async () => {
    expect((await new Client().get(`/api/bookings/by-reference/${parties.a.reference}`)).status).toBe(401)
    expect((await (await signedIn('guest')).get(`/api/bookings/by-reference/${parties.a.reference}`)).status).toBe(403)
    const theirs = await find(otherHost, parties.a.reference)
    expect(theirs.status).toBe(403)
    expect(theirs.body.message).toContain(hostName)
  })
})

describe('taking back a door decision', () => {
  const events = async (bookingId: number) => {
    const [rows] = await withDb(c => c.query('SELECT event, from_state AS fromState, to_state AS toState, actor_id AS actorId, reason FROM booking_events WHERE booking_id = ? ORDER BY at, id', [bookingId]))
    return rows as { event: string, fromState: string, toState: string, actorId: number | null, reason: string | null }[]
  }

  it('undoes a "did not come"; the late party is then seated, the seats follow the rule and the history keeps every step', async () => {
    const before = await mySession()
    expect(partyOf(before, 'c')).toMatchObject({ state: 'no_show', canUndo: true })
    expect(before.counts).toMatchObject({ taken: 8, seatsLeft: 1 })

    const undone = await host.post(`/api/bookings/${parties.c.id}/undo-door`, { reason: 'Arrived late' })
    expect(undone.status, JSON.stringify(undone.body)).toBe(200)
    let s = await mySession()
    expect(partyOf(s, 'c')).toMatchObject({ state: 'confirmed', checkIn: null, canUndo: false })
    expect(s.counts).toMatchObject({ taken: 9, seatsLeft: 0 })
    expect(s.counts.tiles).toMatchObject({ toCome: 2, didNotCome: 0 })
    expect((await host.post(`/api/bookings/${parties.c.id}/undo-door`)).status).toBe(409) // nothing left to undo

    expect((await host.post(`/api/bookings/${parties.c.id}/check-in`, { seated: 1, idsSeen: 1 })).status).toBe(200)
    s = await mySession()
    expect(partyOf(s, 'c')).toMatchObject({ state: 'checked_in', checkIn: { outcome: 'arrived', seated: 1 } })
    expect(s.counts.tiles).toEqual({ paying: 0, toCome: 1, seated: 7, notSeated: 1, didNotCome: 0, turnedAway: 1 })
    expect(s.counts).toMatchObject({ taken: 9, seatsLeft: 0 })
    const pub = await new Client().get(`/api/sessions/${sessionId}/availability`)
    expect(pub.body.session.seatsLeft).toBe(0) // the session's public page counts by the same rule

    expect(await events(parties.c.id)).toEqual([
      { event: 'no_show', fromState: 'confirmed', toState: 'no_show', actorId: hostId, reason: null },
      { event: 'undo_door', fromState: 'no_show', toState: 'confirmed', actorId: hostId, reason: 'Arrived late' },
      { event: 'arrive', fromState: 'confirmed', toState: 'checked_in', actorId: hostId, reason: null },
    ])
    expect(partyOf(s, 'c').history.map(h => [h.event, h.actorName, h.reason])).toEqual([
      ['no_show', hostName, null], ['undo_door', hostName, 'Arrived late'], ['arrive', hostName, null],
    ])
    const [rows] = await withDb(c => c.query('SELECT COUNT(*) AS n FROM check_ins WHERE booking_id = ?', [parties.c.id]))
    expect((rows as { n: number }[])[0]!.n).toBe(1)
  })

  it('keeps the turning away and its reason in the history, and refuses the undo while walk-ins hold the seats', async () => {
    expect(await events(parties.d.id)).toEqual([{ event: 'turn_away', fromState: 'confirmed', toState: 'no_show', actorId: hostId, reason: 'No photo ID' }])
    const full = await host.post(`/api/bookings/${parties.d.id}/undo-door`, {})
    expect(full.status).toBe(409)
    expect(full.body.message).toMatch(/needs 1 seat; none are left/)
    expect(partyOf(await mySession(), 'd').state).toBe('no_show')
  })

  it('refuses to undo what the door did not decide, and refuses other hosts', async () => {
    expect((await otherHost.post(`/api/bookings/${parties.d.id}/undo-door`, {})).status).toBe(403)
    const seated = await host.post(`/api/bookings/${parties.a.id}/undo-door`, {})
    expect(seated.status).toBe(409)
    expect(seated.body.message).toMatch(/checked in/)
    // A no-show without a door decision (no check-in row), as data from elsewhere could hold.
    await withDb(c => c.query('UPDATE bookings SET state = \'no_show\' WHERE id = ?', [parties.e.id]))
    const notDoor = await host.post(`/api/bookings/${parties.e.id}/undo-door`, {})
    expect(notDoor.status).toBe(409)
    expect(notDoor.body.message).toMatch(/not marked at the door/)
    expect(partyOf(await mySession(), 'e')).toMatchObject({ state: 'no_show', canUndo: false })
  })

  it('refuses an undo once the session has ended', async () => {
    await moveStart(-80, { today: false }) // 75 minutes long: ended 5 minutes ago, perhaps yesterday in the venue's zone
    expect(partyOf(await mySession(), 'd').canUndo).toBe(false)
    const late = await host.post(`/api/bookings/${parties.d.id}/undo-door`, {})
    expect(late.status).toBe(409)
    expect(late.body.message).toMatch(/The session ended at .*; a decision at the door can no longer be undone/)
    expect(await events(parties.d.id)).toHaveLength(1)
  })
})
