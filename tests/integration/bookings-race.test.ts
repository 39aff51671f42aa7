import { describe, expect, it } from 'vitest'
import { withDb } from '../support/db'
import { bookingBody, newGuest, newSession, signedIn } from '../support/booking'

describe('no overbooking', () => {
  it('50 guests racing for the last 2 seats: exactly 2 holds, the rest 409', { timeout: 120_000 }, async () => {
    const manager = await signedIn('manager@saltmarsh.test')
    const session = await newSession(manager, { seats: 5 })
    const first = await newGuest('race-first')
    expect((await first.client.post('/api/bookings', bookingBody(session.id, first, 3))).status).toBe(201)

    // Accounts are made one after another (sign-up is not what this test races); the bookings race.
    const racers = []
    for (let i = 0; i < 50; i++) racers.push(await newGuest(`racer-${i}`))
    const answers = await Promise.all(racers.map(g => g.client.post('/api/bookings', bookingBody(session.id, g, 1))))

    const statuses = answers.map(a => a.status)
    expect(statuses.filter(s => s === 201)).toHaveLength(2)
    expect(statuses.filter(s => s === 409)).toHaveLength(48)
    for (const a of answers.filter(x => x.status === 409)) expect(a.body.message).toMatch(/full/)

    const rows = await withDb(async c => (await c.query('SELECT state, party_size FROM bookings WHERE session_id = ?', [session.id]))[0] as { state: string, party_size: number }[])
    expect(rows.filter(r => r.state === 'held')).toHaveLength(3)
    expect(rows.reduce((n, r) => n + (['held', 'confirmed', 'checked_in'].includes(r.state) ? r.party_size : 0), 0)).toBe(5)
    expect(rows).toHaveLength(3)
  })
})
