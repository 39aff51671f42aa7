import { beforeAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { Client, uniqueEmail } from '../support/http'
import { signedIn } from '../support/people'
import { withDb } from '../support/db'
import { bookAndPay, newGuest, newSession } from '../support/booking'
import { linkToken, waitForMail } from '../support/mail'
import { inspectPdf } from '../support/pdf'
import { DEMO_VENUE } from '../../server/demo/data'

let manager: Client
let host: Client
let otherHost: Client
let sessionId: number
let day: string
const parties: Record<'a' | 'b' | 'c' | 'd', { id: number, name: string }> = {} as never

async function moveStart(minutesFromNow: number) {
  await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = UTC_TIMESTAMP(3) + INTERVAL ? MINUTE WHERE id = ?', [minutesFromNow, sessionId]))
  const [rows] = await withDb(c => c.query('SELECT starts_at AS s FROM tasting_sessions WHERE id = ?', [sessionId]))
  day = DateTime.fromJSDate((rows as { s: Date }[])[0]!.s, { zone: DEMO_VENUE.timeZone }).toISODate()!
}

const hostDay = async (c: Client) => (await c.get(`/api/days/${day}`)).body as { sessions: { id: number, counts: Record<string, number>, parties: { id: number, state: string, notes: string | null, checkIn: { outcome: string, seated: number } | null }[] }[] }

beforeAll(async () => {
  manager = await signedIn('manager')
  host = await signedIn('host')
  const hostId = (await host.get('/api/account')).body.id
  // A second host who does not run this session.
  const email = uniqueEmail('otherhost')
  await manager.post('/api/staff', { name: 'Other Host', email, role: 'host' })
  otherHost = new Client()
  await otherHost.post('/api/auth/invitation', { token: linkToken(await waitForMail(email, /invited/), '/welcome'), password: 'other-host-pass-1' })

  sessionId = (await newSession(manager, { hoursAhead: 24 * 3, seats: 8, priceMinor: 3000 })).id
  expect((await manager.patch(`/api/sessions/${sessionId}`, { hostId })).status).toBe(200)
  const sizes = { a: 2, b: 3, c: 1, d: 1 } as const
  for (const key of ['a', 'b', 'c', 'd'] as const) {
    const g = await newGuest(`party-${key}`)
    const booked = await bookAndPay(g, sessionId, sizes[key])
    parties[key] = { id: booked.id, name: g.name }
  }
  await withDb(c => c.query('UPDATE bookings SET notes = ? WHERE id = ?', ['Nut allergy', parties.b.id]))
  await moveStart(20) // the session starts in 20 minutes: today, not started yet
})

describe('the host\'s day', () => {
  it('lists the session with its parties, notes and counts; other hosts, guests and visitors are refused', async () => {
    const mine = await hostDay(host)
    const s = mine.sessions.find(x => x.id === sessionId)!
    expect(s.parties).toHaveLength(4)
    expect(s.counts).toMatchObject({ seats: 8, taken: 7, expected: 7, arrived: 0, noShows: 0, seatsLeft: 1 })
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
    expect(s.counts).toMatchObject({ arrived: 4, noShows: 2, expected: 0 })
  })

  it('seats walk-ins in seats left only, each ID checked', async () => {
    // Seats taken: a (2) + b (3 booked) = 5 of 8; c and d no longer hold seats.
    expect((await host.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'Walk-in group', partySize: 4, idsSeen: 4 })).status).toBe(409)
    const unchecked = await host.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'Walk-in pair', partySize: 2, idsSeen: 1 })
    expect(unchecked.status).toBe(400)
    expect((await host.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'Walk-in pair', partySize: 2, idsSeen: 2 })).status).toBe(201)
    expect((await otherHost.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'x', partySize: 1, idsSeen: 1 })).status).toBe(403)
    const s = (await hostDay(host)).sessions.find(x => x.id === sessionId)!
    expect(s.counts).toMatchObject({ taken: 7, seatsLeft: 1, arrived: 6 })
  })

  it('prints the session\'s cards: one per seated guest, with names, as one PDF made with progress', async () => {
    const data = (await host.get(`/api/sessions/${sessionId}/cards`)).body
    expect(data.cards).toHaveLength(6) // a: 2 seated, b: 2 seated, walk-ins: 2
    expect(data.cards.map((c: { guestName: string }) => c.guestName)).toContain(parties.a.name)
    const started = await host.post(`/api/sessions/${sessionId}/card-jobs`, { paper: 'a5', names: true })
    expect(started.status).toBe(202)
    expect(started.body.total).toBe(6)
    let job = { status: 'running', done: 0, total: 6 }
    for (let i = 0; i < 100 && job.status === 'running'; i++) {
      job = (await host.get(`/api/card-jobs/${started.body.jobId}`)).body
      await new Promise(r => setTimeout(r, 100))
    }
    expect(job).toMatchObject({ status: 'done', done: 6, total: 6 })
    const res = await host.raw(`/cards/jobs/${started.body.jobId}/cards.pdf`)
    expect(res.headers.get('content-type')).toBe('application/pdf')
    expect(res.headers.get('content-disposition')).toBe(`attachment; filename="session-${sessionId}-cards-a5.pdf"`)
    expect(res.headers.get('content-security-policy')).toBe('frame-ancestors \'self\'')
    const pdf = inspectPdf(Buffer.from(await res.arrayBuffer()))
    expect(pdf.pages).toBe(6)
    expect(pdf.pageText(1).replace(/\s+/g, ' ')).toMatch(/Poured for/)
    expect(pdf.text).toContain(parties.a.name)
    expect((await otherHost.get(`/api/card-jobs/${started.body.jobId}`)).status).toBe(404)
    expect((await otherHost.post(`/api/sessions/${sessionId}/card-jobs`, {})).status).toBe(403)
  })
})
