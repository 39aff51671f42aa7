import { beforeAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { Client } from '../support/http'
import { signedIn } from '../support/people'
import { withDb } from '../support/db'
import { bookAndPay, bookingBody, newGuest, newSession, startTodayIn } from '../support/booking'
import { DEMO_VENUE } from '../../server/demo/data'

/**
 * One session seen from every side that shows its seats — the public list and the session's own
 * page, the booking transaction, the host's day and the manager's report — must give the same
 * seats taken and seats left (shared/seats.ts), whatever happened at the door.
 */

const SEATS = 10
let manager: Client
let host: Client
let sessionId: number
let flightId: number
let day: string

/**
 * Moves the session's start; `today` keeps it on the venue's today (the door's steps need that).
 * A start that must stay bookable may fall after midnight: late in the venue's evening, "today in
 * 90 minutes" clamped to the day's end would sit inside the booking cut-off.
 */
async function moveStart(minutesFromNow: number, where: 'today' | 'anyDay' = 'today') {
  const start = where === 'today'
    ? startTodayIn(minutesFromNow)
    : DateTime.now().plus({ minutes: minutesFromNow, seconds: 20 + Math.floor(Math.random() * 120) }).toJSDate()
  await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [start, sessionId]))
  const [rows] = await withDb(c => c.query('SELECT starts_at AS s FROM tasting_sessions WHERE id = ?', [sessionId]))
  day = DateTime.fromJSDate((rows as { s: Date }[])[0]!.s, { zone: DEMO_VENUE.timeZone }).toISODate()!
}

interface Seen { seatsTaken: number, seatsLeft: number, breakdown?: Record<string, number> }

/** What each screen says about the session's seats right now. */
async function everySide(opts: { listed: boolean }): Promise<Record<string, Seen>> {
  const anyone = new Client()
  const availability = await anyone.get(`/api/sessions/${sessionId}/availability`)
  expect(availability.status).toBe(200)
  const page = availability.body.session as { seats: number, seatsLeft: number }
  const sides: Record<string, Seen> = {
    'the session\'s page': { seatsTaken: page.seats - page.seatsLeft, seatsLeft: page.seatsLeft },
  }
  const list = await anyone.get(`/api/flights/${flightId}/sessions`)
  expect(list.status).toBe(200)
  const listed = (list.body as { id: number, seats: number, seatsLeft: number }[]).find(s => s.id === sessionId)
  if (opts.listed) {
    expect(listed, 'the session is on the public list').toBeTruthy()
    sides['the public list'] = { seatsTaken: listed!.seats - listed!.seatsLeft, seatsLeft: listed!.seatsLeft }
  }
  else expect(listed, 'a started session is off the public list').toBeUndefined()

  const hostDay = await host.get(`/api/days/${day}`)
  expect(hostDay.status).toBe(200)
  const counts = (hostDay.body.sessions as { id: number, counts: { taken: number, seatsLeft: number, bookedOnline: number, walkIns: number, tiles: Record<string, number>, breakdown: Record<string, number> } }[]).find(s => s.id === sessionId)!.counts
  sides['the host\'s day'] = { seatsTaken: counts.taken, seatsLeft: counts.seatsLeft, breakdown: counts.breakdown }
  // The host's tiles are the same breakdown cut for the door: they add up to the guests booked plus the walk-ins.
  expect(Object.values(counts.tiles).reduce((a, b) => a + b, 0), 'the host\'s tiles add up').toBe(counts.bookedOnline + counts.walkIns)

  const report = await manager.get(`/api/reports/bookings?from=${day}&to=${day}`)
  expect(report.status).toBe(200)
  const row = (report.body.sessions as { session: { id: number }, seatsTaken: number, seatsLeft: number, seatBreakdown: Record<string, number> }[]).find(s => s.session.id === sessionId)!
  sides['the manager\'s report'] = { seatsTaken: row.seatsTaken, seatsLeft: row.seatsLeft, breakdown: row.seatBreakdown }
  return sides
}

/** Every side shows `taken` and `left`; the two that break it down show `breakdown`. */
async function expectAgreed(taken: number, breakdown: Record<string, number>, opts: { listed: boolean }) {
  const sides = await everySide(opts)
  for (const [side, seen] of Object.entries(sides)) {
    expect({ seatsTaken: seen.seatsTaken, seatsLeft: seen.seatsLeft }, side).toEqual({ seatsTaken: taken, seatsLeft: SEATS - taken })
    if (seen.breakdown) expect(seen.breakdown, side).toEqual(breakdown)
  }
}

const parties = {} as Record<'partly' | 'noShow' | 'turnedAway' | 'coming', number>

beforeAll(async () => {
  manager = await signedIn('manager')
  host = await signedIn('host')
  const hostId = (await host.get('/api/account')).body.id
  const session = await newSession(manager, { hoursAhead: 24 * 4, seats: SEATS, priceMinor: 2800 })
  sessionId = session.id
  flightId = (await manager.get(`/api/sessions/${sessionId}`)).body.flightId
  expect((await manager.patch(`/api/sessions/${sessionId}`, { hostId })).status).toBe(200)
  parties.partly = (await bookAndPay(await newGuest('agree-partly'), sessionId, 3)).id
  parties.noShow = (await bookAndPay(await newGuest('agree-noshow'), sessionId, 2)).id
  parties.turnedAway = (await bookAndPay(await newGuest('agree-away'), sessionId, 1)).id
  parties.coming = (await bookAndPay(await newGuest('agree-coming'), sessionId, 2)).id

  await moveStart(20) // today, not started: the door opens
  expect((await host.post(`/api/bookings/${parties.partly}/check-in`, { seated: 2, idsSeen: 2, reason: 'One guest is parking the car' })).status).toBe(200)
  expect((await host.post(`/api/bookings/${parties.turnedAway}/turn-away`, { reason: 'No photo ID' })).status).toBe(200)
  expect((await host.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'Walk-in pair', partySize: 2, idsSeen: 2 })).status).toBe(201)
  await moveStart(-10) // started: a party that has not come can be marked
  expect((await host.post(`/api/bookings/${parties.noShow}/no-show`)).status).toBe(200)
})

describe('one session, every screen', () => {
  it('agrees on seats after a partly seated party, a no-show, a turn-away and a walk-in', async () => {
    // Taken: the partly seated party's 3 (2 seated, 1 to come), the 2 still to come, the walk-in pair.
    await expectAgreed(7, { held: 0, confirmed: 2, seated: 2, notSeated: 1, didNotCome: 2, turnedAway: 1, walkIns: 2 }, { listed: false })
  })

  it('the door refuses one walk-in more than the seats left, and says how many are left', async () => {
    const res = await host.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'Too many', partySize: 4, idsSeen: 4 })
    expect(res.status).toBe(409)
    expect(res.body.data.seatsLeft).toBe(3)
    expect(res.body.message).toBe('Only 3 seats left.')
  })

  it('a live hold takes seats everywhere; one whose time ran out takes none anywhere', async () => {
    await moveStart(90, 'anyDay') // bookable again (cut-off 60 minutes), so guests can hold seats
    const holder = await newGuest('agree-hold')
    const hold = await holder.client.post('/api/bookings', bookingBody(sessionId, holder, 1))
    expect(hold.status).toBe(201)
    await expectAgreed(8, { held: 1, confirmed: 2, seated: 2, notSeated: 1, didNotCome: 2, turnedAway: 1, walkIns: 2 }, { listed: true })
    await withDb(c => c.query('UPDATE bookings SET hold_expires_at = UTC_TIMESTAMP(3) - INTERVAL 1 MINUTE WHERE id = ?', [hold.body.booking.id]))
    await expectAgreed(7, { held: 0, confirmed: 2, seated: 2, notSeated: 1, didNotCome: 2, turnedAway: 1, walkIns: 2 }, { listed: true })
  })

  it('the booking transaction takes exactly the seats left, and refuses one more with 409', async () => {
    const greedy = await newGuest('agree-greedy')
    const tooMany = await greedy.client.post('/api/bookings', bookingBody(sessionId, greedy, 4))
    expect(tooMany.status).toBe(409)
    expect(tooMany.body.data.seatsLeft).toBe(3)
    expect(tooMany.body.message).toMatch(/Only 3 seats left/)

    const exact = await greedy.client.post('/api/bookings', bookingBody(sessionId, greedy, 3))
    expect(exact.status, JSON.stringify(exact.body)).toBe(201)
    await expectAgreed(SEATS, { held: 3, confirmed: 2, seated: 2, notSeated: 1, didNotCome: 2, turnedAway: 1, walkIns: 2 }, { listed: true })

    const late = await newGuest('agree-late')
    const full = await late.client.post('/api/bookings', bookingBody(sessionId, late, 1))
    expect(full.status).toBe(409)
    expect(full.body.data.seatsLeft).toBe(0)
    expect(full.body.message).toMatch(/now full/)
  })

  it('the report\'s fill rate counts seats sold: taken, plus the parties that did not come or were turned away', async () => {
    const report = await manager.get(`/api/reports/bookings?from=${day}&to=${day}`)
    const row = report.body.sessions.find((s: { session: { id: number } }) => s.session.id === sessionId)
    expect(row).toMatchObject({ seatsTaken: 10, seatsLeft: 0, seatsSold: 13, fillRate: 1.3 })
  })
})
