import { beforeAll, describe, expect, it } from 'vitest'
import Papa from 'papaparse'
import { DateTime } from 'luxon'
import type { Client } from '../support/http'
import { withDb } from '../support/db'
import { bookAndPay, bookingBody, checkoutIdOf, demoFlightId, newGuest, newSession, payCheckout, signedIn, waitForState } from '../support/booking'
import { DEMO_VENUE } from '../../server/demo/data'
import type { ManagerOverview } from '../../shared/types/reports'

let manager: Client
beforeAll(async () => { manager = await signedIn('manager@saltmarsh.test') })

const zone = DEMO_VENUE.timeZone
const overview = async () => {
  const res = await manager.get<ManagerOverview>('/api/reports/overview')
  expect(res.status).toBe(200)
  return res.body
}
const sqlTime = (d: Date) => d.toISOString().replace('T', ' ').replace('Z', '')

/** Seats offered (cancelled sessions left out) and taken (live holds, confirmed, checked in) in [from, to), straight from the tables. */
async function seatsInDb(from: Date, to: Date) {
  return withDb(async (c) => {
    const [rows] = await c.query(`
      SELECT COALESCE(SUM(s.seats), 0) AS seats,
             COALESCE(SUM((SELECT COALESCE(SUM(b.party_size), 0) FROM bookings b WHERE b.session_id = s.id
               AND (b.state IN ('confirmed', 'checked_in') OR (b.state = 'held' AND b.hold_expires_at > UTC_TIMESTAMP(3))))), 0) AS taken
      FROM tasting_sessions s WHERE s.status <> 'cancelled' AND s.starts_at >= ? AND s.starts_at < ?`, [sqlTime(from), sqlTime(to)])
    const r = (rows as { seats: number, taken: number }[])[0]!
    return { seats: Number(r.seats), seatsTaken: Number(r.taken) }
  })
}

describe('the manager\'s overview', () => {
  it('shows today\'s and the coming week\'s sessions with seats, and the week\'s takings and refunds, as the database has them', async () => {
    const before = await overview()

    // A session three days ahead: two parties pay, the second cancels and is refunded.
    const ahead = await newSession(manager, { hoursAhead: 24 * 3, seats: 8, priceMinor: 4000 })
    await bookAndPay(await newGuest('overview-a'), ahead.id, 2)
    const b = await newGuest('overview-b')
    const cancelled = await bookAndPay(b, ahead.id, 1)
    expect((await b.client.post(`/api/bookings/${cancelled.id}/cancel`)).status).toBe(200)
    await waitForState(cancelled.id, 'refunded')

    // A session booked ahead, then moved to the first minutes of the venue's today.
    const later = await newSession(manager, { hoursAhead: 24 * 5, seats: 6, priceMinor: 2500 })
    await bookAndPay(await newGuest('overview-c'), later.id, 3)
    const today = DateTime.now().setZone(zone).startOf('day')
    const todayStart = today.plus({ minutes: 1, seconds: Math.floor(Math.random() * 59), milliseconds: Math.floor(Math.random() * 999) }).toUTC().toJSDate()
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [sqlTime(todayStart), later.id]))

    const after = await overview()
    expect(after.today.date).toBe(today.toISODate())
    expect(after.today.sessions.find(s => s.id === later.id)).toMatchObject({ seats: 6, seatsTaken: 3, seatsLeft: 3, checkedIn: 0, status: 'open' })
    expect({ seats: after.today.seats, seatsTaken: after.today.seatsTaken })
      .toEqual(await seatsInDb(today.toUTC().toJSDate(), today.plus({ days: 1 }).toUTC().toJSDate()))

    const aheadDay = DateTime.fromISO(ahead.startsAt, { zone }).toISODate()
    const day = after.week.days.find(d => d.date === aheadDay)!
    expect(day.sessions.find(s => s.id === ahead.id)).toMatchObject({ seats: 8, seatsTaken: 2, seatsLeft: 6 })
    expect(after.week.days.map(d => d.date)).toEqual(Array.from({ length: 7 }, (_, i) => today.plus({ days: i + 1 }).toISODate()))
    expect({ seats: after.week.seats, seatsTaken: after.week.seatsTaken })
      .toEqual(await seatsInDb(today.plus({ days: 1 }).toUTC().toJSDate(), today.plus({ days: 8 }).toUTC().toJSDate()))
    expect({ seats: day.seats, seatsTaken: day.seatsTaken })
      .toEqual(await seatsInDb(DateTime.fromISO(aheadDay!, { zone }).toUTC().toJSDate(), DateTime.fromISO(aheadDay!, { zone }).plus({ days: 1 }).toUTC().toJSDate()))

    // Takings over the last seven venue days: three payments (2 × 40.00, 1 × 40.00, 3 × 25.00), one refund of 40.00.
    expect(after.takings.from).toBe(today.minus({ days: 6 }).toISODate())
    expect(after.takings.paidMinor - before.takings.paidMinor).toBe(2 * 4000 + 4000 + 3 * 2500)
    expect(after.takings.payments - before.takings.payments).toBe(3)
    expect(after.takings.refundedMinor - before.takings.refundedMinor).toBe(4000)
    expect(after.takings.refunds - before.takings.refunds).toBe(1)
    expect(after.takings.netMinor).toBe(after.takings.paidMinor - after.takings.refundedMinor)
    const inDb = await withDb(async (c) => {
      const from = sqlTime(today.minus({ days: 6 }).toUTC().toJSDate())
      const to = sqlTime(today.plus({ days: 1 }).toUTC().toJSDate())
      const [[paid], [refunded]] = await Promise.all([
        c.query('SELECT COALESCE(SUM(amount_paid_minor), 0) AS m FROM bookings WHERE amount_paid_minor > 0 AND COALESCE(confirmed_at, created_at) >= ? AND COALESCE(confirmed_at, created_at) < ?', [from, to]),
        c.query('SELECT COALESCE(SUM(amount_refunded_minor), 0) AS m FROM bookings WHERE amount_refunded_minor > 0 AND refunded_at >= ? AND refunded_at < ?', [from, to]),
      ]) as unknown as [[{ m: number }[]], [{ m: number }[]]]
      return { paidMinor: Number(paid[0]!.m), refundedMinor: Number(refunded[0]!.m) }
    })
    expect({ paidMinor: after.takings.paidMinor, refundedMinor: after.takings.refundedMinor }).toEqual(inDb)

    // The counts it always had are still there.
    expect(after.guests - before.guests).toBe(3)
    expect(after.activeProducts).toBeGreaterThan(0)
  })

  it('counts e-mail stuck in the outbox (given up, or waiting after several tries or minutes) and shows the newest error', async () => {
    const to = `stuck-${Date.now()}@example.test`
    const before = await overview()
    const now = Date.now()
    const later = sqlTime(new Date(now + 86_400_000)) // a retry far off, so the sender leaves these rows alone
    const row = (status: string, attempts: number, lastError: string | null, createdAgoMin: number, updatedAgoMin: number) =>
      [to, 'Test message', 'body', status, attempts, lastError, later, sqlTime(new Date(now - createdAgoMin * 60_000)), sqlTime(new Date(now - updatedAgoMin * 60_000))]
    await withDb(c => c.query(
      'INSERT INTO outbox (to_address, subject, text_body, status, attempts, last_error, next_attempt_at, created_at, updated_at) VALUES ?',
      [[
        row('failed', 10, 'Greeting never received', 90, 30),
        row('pending', 4, '421 4.7.0 Try again later', 5, 0),
        row('pending', 1, null, 30, 20),
        row('pending', 0, null, 0, 0),
      ]],
    ))
    try {
      const after = await overview()
      expect(after.outbox.stuck - before.outbox.stuck).toBe(3)
      expect(after.outbox.failed - before.outbox.failed).toBe(1)
      expect(after.outbox.newestError).toMatchObject({ message: '421 4.7.0 Try again later', subject: 'Test message' })
    }
    finally {
      await withDb(c => c.query('DELETE FROM outbox WHERE to_address = ?', [to]))
    }
  })
})

describe('the bookings report', () => {
  it('carries the guest\'s notes and writes the session status as people read it, in the report and its CSV', async () => {
    const session = await newSession(manager, { seats: 6, priceMinor: 3000 })
    const guest = await newGuest('report-notes')
    // A note that starts like a formula must reach the spreadsheet as text (OWASP, CSV injection).
    const notes = '=1+1 one of us has a nut allergy; it is our anniversary'
    const res = await guest.client.post('/api/bookings', { ...bookingBody(session.id, guest, 2), notes })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect((await payCheckout(checkoutIdOf(res.body.checkoutUrl))).status).toBe(200)
    await waitForState(res.body.booking.id, 'confirmed')
    expect((await manager.patch(`/api/sessions/${session.id}`, { status: 'closed' })).status).toBe(200)
    const day = DateTime.fromISO(session.startsAt, { zone }).toISODate()

    const report = await manager.get(`/api/reports/bookings?from=${day}&to=${day}`)
    expect(report.status).toBe(200)
    const row = report.body.sessions.find((s: { session: { id: number } }) => s.session.id === session.id)
    expect(row.bookings.map((x: { notes: string | null }) => x.notes)).toEqual([notes])

    const csv = await manager.get<string>(`/reports/bookings.csv?from=${day}&to=${day}`)
    expect(csv.status).toBe(200)
    const parsed = Papa.parse<Record<string, string>>(csv.body, { header: true, skipEmptyLines: true })
    expect(parsed.errors).toEqual([])
    const mine = parsed.data.filter(r => r['Session id'] === String(session.id))
    expect(mine).toHaveLength(1)
    expect(mine[0]!['Guest notes']).toBe(`'${notes}`)
    expect(mine[0]!['Session status']).toBe('Closed to booking')
    // A booking without notes has an empty cell, and an open session reads "Open".
    const plain = await newSession(manager, { seats: 4 })
    await bookAndPay(await newGuest('report-plain'), plain.id, 1)
    const plainDay = DateTime.fromISO(plain.startsAt, { zone }).toISODate()
    const csv2 = Papa.parse<Record<string, string>>((await manager.get<string>(`/reports/bookings.csv?from=${plainDay}&to=${plainDay}`)).body, { header: true, skipEmptyLines: true })
    expect(csv2.data.find(r => r['Session id'] === String(plain.id))).toMatchObject({ 'Guest notes': '', 'Session status': 'Open' })
  })
})

describe('the bookings view of a long range', () => {
  it('sends a page of sessions at a time; the totals cover the whole range, the pages together are the range, the CSV has every row', async () => {
    // 23 weekly sessions three years ahead, where no other test schedules: more than one page of 20.
    const first = DateTime.now().setZone(zone).plus({ years: 3 }).startOf('week').plus({ days: 2 })
    const made = await manager.post('/api/sessions', { flightId: await demoFlightId(), startDate: first.toISODate(), startTime: '10:15', durationMinutes: 60, seats: 6, priceMinor: 2750, bookingCutoffMinutes: 60, repeatWeeks: 23 })
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    const ids = (made.body as { id: number }[]).map(x => x.id)
    const from = first.toISODate()
    const to = first.plus({ weeks: 22 }).toISODate()
    // A paid party of 3 in the 22nd session, on the second page.
    const party = await bookAndPay(await newGuest('report-pages'), ids[21]!, 3)

    const page = async (n?: number) => {
      const res = await manager.get(`/api/reports/bookings?from=${from}&to=${to}${n ? `&page=${n}` : ''}`)
      expect(res.status, JSON.stringify(res.body)).toBe(200)
      return res.body as { page: number, pageSize: number, sessions: { session: { id: number }, bookings: { id: number }[], seatsTaken: number, revenueMinor: number }[], totals: { sessions: number, seats: number, seatsTaken: number, bookings: number, paidMinor: number, revenueMinor: number } }
    }
    const one = await page()
    const two = await page(2)
    expect(one).toMatchObject({ page: 1, pageSize: 20 })
    expect(one.sessions.map(x => x.session.id)).toEqual(ids.slice(0, 20))
    expect(two.sessions.map(x => x.session.id)).toEqual(ids.slice(20))
    expect((await page(3)).sessions).toEqual([])
    // Each page carries the whole range's totals, the seats and money of sessions it does not list included.
    for (const p of [one, two]) {
      expect(p.totals).toMatchObject({ sessions: 23, seats: 23 * 6, seatsTaken: 3, bookings: 1, paidMinor: 3 * 2750, revenueMinor: 3 * 2750 })
    }
    expect(two.sessions[1]).toMatchObject({ seatsTaken: 3, revenueMinor: 3 * 2750 })
    expect(two.sessions[1]!.bookings.map(b => b.id)).toEqual([party.id])
    expect(one.sessions.every(x => x.bookings.length === 0)).toBe(true)

    const csv = Papa.parse<Record<string, string>>((await manager.get<string>(`/reports/bookings.csv?from=${from}&to=${to}`)).body, { header: true, skipEmptyLines: true })
    expect(csv.data.map(r => r.Reference)).toEqual([party.reference])
    expect(csv.data[0]!['Session start']).toBe(DateTime.fromISO(first.plus({ weeks: 21 }).toISODate()!, { zone }).set({ hour: 10, minute: 15 }).toFormat('yyyy-MM-dd HH:mm'))

    const bad = await manager.get(`/api/reports/bookings?from=${from}&to=${to}&page=0`)
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.page).toMatch(/from 1/)
  })
})
