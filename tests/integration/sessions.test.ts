import { beforeAll, describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import { countRows } from '../support/db'
import { signedIn } from '../support/people'

let manager: Client
let flightId: number
let hostId: number

beforeAll(async () => {
  manager = await signedIn('manager')
  const flights = (await manager.get('/api/flights')).body as { id: number, name: string, status: string }[]
  flightId = flights.find(f => f.name === 'Shoreline Flight')!.id
  const staff = (await manager.get('/api/staff')).body as { id: number, email: string }[]
  hostId = staff.find(s => s.email === 'host@saltmarsh.test')!.id
})

const base = () => ({ flightId, startTime: '14:00', durationMinutes: 75, seats: 12, priceMinor: 3500, hostId, bookingCutoffMinutes: 120 })

describe('sessions', () => {
  it('a weekly series keeps 14:00 local across the spring daylight-saving change', async () => {
    // America/New_York: clocks go forward on the second Sunday of March, 14 March 2027
    // (US Energy Policy Act of 2005); EST is UTC−5, EDT is UTC−4.
    const res = await manager.post('/api/sessions', { ...base(), startDate: '2027-02-27', repeatWeeks: 4 })
    expect(res.status).toBe(201)
    const utc = (res.body as { startsAt: string }[]).map(s => s.startsAt)
    expect(utc).toEqual(['2027-02-27T19:00:00.000Z', '2027-03-06T19:00:00.000Z', '2027-03-13T19:00:00.000Z', '2027-03-20T18:00:00.000Z'])
    expect((res.body as { startsLocal: string }[]).every(s => s.startsLocal.slice(11, 16) === '14:00')).toBe(true)
    const series = new Set((res.body as { seriesId: string }[]).map(s => s.seriesId))
    expect(series.size).toBe(1)
  })

  it('and across the autumn change', async () => {
    // First Sunday of November: 7 November 2027 (US Energy Policy Act of 2005).
    const res = await manager.post('/api/sessions', { ...base(), startDate: '2027-11-06', startTime: '18:30', repeatWeeks: 2 })
    expect((res.body as { startsAt: string }[]).map(s => s.startsAt)).toEqual(['2027-11-06T22:30:00.000Z', '2027-11-13T23:30:00.000Z'])
  })

  it('refuses a local time the clocks skip, a start in the past, a draft flight and a non-host, writing nothing', async () => {
    const before = await countRows('tasting_sessions')
    const skipped = await manager.post('/api/sessions', { ...base(), startDate: '2027-03-14', startTime: '02:30' })
    expect(skipped.status).toBe(400)
    expect(skipped.body.data.fields.startTime).toMatch(/does not exist/)
    const past = await manager.post('/api/sessions', { ...base(), startDate: '2020-01-04' })
    expect(past.status).toBe(400)
    expect(past.body.data.fields.startDate).toMatch(/future/)
    const guestId = (await (await signedIn('guest')).get('/api/account')).body.id
    const notHost = await manager.post('/api/sessions', { ...base(), startDate: '2027-05-01', hostId: guestId })
    expect(notHost.status).toBe(400)
    expect(notHost.body.data.fields.hostId).toMatch(/host or manager/)
    const bad = await manager.post('/api/sessions', { ...base(), startDate: '2027-02-30', startTime: '25:00', seats: 0, priceMinor: -1, repeatWeeks: 60 })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['priceMinor', 'repeatWeeks', 'seats', 'startDate', 'startTime'])
    expect(await countRows('tasting_sessions')).toBe(before)
  })

  it('lists by venue-local dates, closes and reopens booking; hosts read only', async () => {
    const created = (await manager.post('/api/sessions', { ...base(), startDate: '2027-06-05', startTime: '23:30' })).body[0]
    // 23:30 EDT on 5 June is 03:30 UTC on 6 June: it belongs to the venue's 5 June.
    expect(created.startsAt).toBe('2027-06-06T03:30:00.000Z')
    const day = (await manager.get('/api/sessions?from=2027-06-05&to=2027-06-05')).body as { id: number }[]
    expect(day.map(s => s.id)).toContain(created.id)
    expect(((await manager.get('/api/sessions?from=2027-06-06&to=2027-06-06')).body as { id: number }[]).map(s => s.id)).not.toContain(created.id)
    expect((await manager.patch(`/api/sessions/${created.id}`, { status: 'closed' })).body.status).toBe('closed')
    expect((await manager.patch(`/api/sessions/${created.id}`, { status: 'cancelled' })).status).toBe(400)
    const host = await signedIn('host')
    expect((await host.get(`/api/sessions/${created.id}`)).status).toBe(200)
    expect((await host.patch(`/api/sessions/${created.id}`, { seats: 2 })).status).toBe(403)
    expect((await new Client().get('/api/sessions')).status).toBe(401)
    expect((await manager.get('/api/sessions?from=June')).status).toBe(400)
  })
})

describe('one session per flight and start', () => {
  // A minute of its own for each run of a test, so reruns against one database do not meet.
  const minute = () => String(10 + Math.floor(Math.random() * 50)).padStart(2, '0')

  it('a second POST of the same session, at once or later, writes no second row and answers 409 with a message', async () => {
    const body = { ...base(), startDate: '2028-03-04', startTime: `15:${minute()}` }
    const same = 'flight_id = ? AND starts_at = ?'
    const [a, b] = await Promise.all([manager.post('/api/sessions', body), manager.post('/api/sessions', body)])
    expect([a.status, b.status].sort()).toEqual([201, 409])
    const created = (a.status === 201 ? a : b).body[0] as { startsAt: string }
    const refused = a.status === 409 ? a : b
    // 4 March 2028 is a Saturday; New York is on EST (UTC−5) then (US Energy Policy Act of 2005).
    expect(refused.body.message).toMatch(/already a session of Shoreline Flight on Sat, Mar 4, 2028, 3:\d\d PM/)
    expect(refused.body.data.fields.startTime).toMatch(/already a session/)
    const at = created.startsAt.replace('T', ' ').replace('Z', '')
    expect(await countRows('tasting_sessions', same, [flightId, at])).toBe(1)

    const later = await manager.post('/api/sessions', body)
    expect(later.status).toBe(409)
    expect(await countRows('tasting_sessions', same, [flightId, at])).toBe(1)
  })

  it('a weekly series that meets one existing session writes none of its sessions', async () => {
    const startTime = `16:${minute()}`
    // 1 April 2028 is a Saturday; its third week is 15 April.
    const single = await manager.post('/api/sessions', { ...base(), startDate: '2028-04-15', startTime })
    expect(single.status).toBe(201)
    const before = await countRows('tasting_sessions', 'flight_id = ?', [flightId])
    const series = await manager.post('/api/sessions', { ...base(), startDate: '2028-04-01', startTime, repeatWeeks: 4 })
    expect(series.status).toBe(409)
    expect(series.body.data.fields.startTime).toMatch(/Sat, Apr 15, 2028/)
    expect(series.body.message).toMatch(/None of the 4 sessions were scheduled/)
    expect(await countRows('tasting_sessions', 'flight_id = ?', [flightId])).toBe(before)

    // The same series an hour later has no clash and is written whole.
    const hourLater = `17:${startTime.slice(3)}`
    const ok = await manager.post('/api/sessions', { ...base(), startDate: '2028-04-01', startTime: hourLater, repeatWeeks: 4 })
    expect(ok.status).toBe(201)
    expect(await countRows('tasting_sessions', 'flight_id = ?', [flightId])).toBe(before + 4)
  })
})
