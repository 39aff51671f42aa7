import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { Client, type Reply } from '../support/http'
import { withDb } from '../support/db'
import { signedIn } from '../support/people'
import { bookingBody, checkoutIdOf, newGuest, newSession, payCheckout, seatsLeft, setStripeFault, waitFor, waitForState } from '../support/booking'
import { setMailFault, waitForMail } from '../support/mail'
import { bigProductsSheet, runTag } from '../support/labSheets'
import { startDb, stopDb } from '../../scripts/lib/mariadb'
import { TEST_PROFILE } from '../../scripts/lib/stack'

/**
 * The database stopping mid-request, the payment provider failing or hanging, the mail server
 * refusing or hanging: the person gets a clear 503, nothing is half-written, and the app recovers
 * on its own when the service comes back. Every test puts the service back in `finally`.
 */

const DB = TEST_PROFILE.db

/** A request that must answer within `ms` (no hang), whatever it answers. */
async function within<T>(ms: number, what: string, p: Promise<T>): Promise<T> {
  let timer: NodeJS.Timeout | undefined
  const timeout = new Promise<never>((_, fail) => { timer = setTimeout(() => fail(new Error(`${what} did not answer within ${ms} ms`)), ms) })
  try { return await Promise.race([p, timeout]) }
  finally { clearTimeout(timer) }
}

function expectUnavailable(res: Reply, what: string) {
  expect(res.status, `${what}: ${JSON.stringify(res.body).slice(0, 200)}`).toBe(503)
  expect(res.headers.get('content-type'), what).toMatch(/json/)
  expect(res.body.message, what).toMatch(/try again/i)
  expect(JSON.stringify(res.body), `${what}: no stack`).not.toMatch(/\bat .+\.m?js:\d+/)
}

async function waitForHealthy(timeoutMs = 20_000) {
  await waitFor(async () => (await new Client().get('/api/health')).status === 200, 'the app to answer again', timeoutMs)
}

async function sessionRows(sessionId: number) {
  return withDb(async (c) => {
    const [rows] = await c.query('SELECT id, state, party_size AS partySize, checkout_session_id AS checkout FROM bookings WHERE session_id = ?', [sessionId])
    return rows as { id: number, state: string, partySize: number, checkout: string | null }[]
  })
}

let manager: Client
beforeAll(async () => { manager = await signedIn('manager') })
afterAll(async () => {
  await startDb(DB)
  await setStripeFault(null)
  await setMailFault(null)
})

describe('the database stops', () => {
  it('in the middle of bookings: each guest gets 201 or a 503 message, no seat is lost, and the app recovers by itself', { timeout: 30_000 }, async () => {
    const seats = 30
    const session = await newSession(manager, { seats })
    const guests = await Promise.all(Array.from({ length: 12 }, (_, i) => newGuest(`fault-db-${i}`)))
    let answers: Reply[] = []
    try {
      // Bookings start every 8 ms while the database shuts down, so they meet it at every stage.
      const requests = guests.map((g, i) => new Promise(r => setTimeout(r, i * 8)).then(() => g.client.post('/api/bookings', bookingBody(session.id, g, 2))))
      await new Promise(r => setTimeout(r, 60))
      await stopDb(DB)
      answers = await within(20_000, 'the bookings', Promise.all(requests))
      console.log(`[faults] bookings while the database stopped: ${answers.map(a => a.status).join(' ')}`)
      for (const [i, res] of answers.entries()) {
        if (res.status !== 201) expectUnavailable(res, `guest ${i}`)
      }
      // (the public flight list may still answer from its 5 s cache; the venue is read live)
      expectUnavailable(await within(10_000, 'a read while down', new Client().get('/api/venue')), 'venue while down')
      expectUnavailable(await within(10_000, 'a sign-in while down', new Client().signIn('guest@saltmarsh.test', 'whatever-password')), 'sign-in while down')
      expectUnavailable(await within(10_000, 'a booking while down', guests[0]!.client.post('/api/bookings', bookingBody(session.id, guests[0]!, 1))), 'booking while down')
    }
    finally {
      await startDb(DB)
    }
    await waitForHealthy()
    expect((await new Client().get('/api/flights/published')).status).toBe(200)

    // Held seats of guests who were told 503 go back: make them old enough for the sweep's check.
    await withDb(c => c.query('UPDATE bookings SET created_at = created_at - INTERVAL 10 MINUTE WHERE session_id = ? AND checkout_session_id IS NULL', [session.id]))
    await waitFor(async () => (await sessionRows(session.id)).every(r => r.state !== 'held' || r.checkout), 'orphaned holds to be released', 10_000)
    const rows = await sessionRows(session.id)
    const live = rows.filter(r => r.state === 'held' || r.state === 'confirmed')
    for (const res of answers.filter(a => a.status === 201)) {
      expect(live.find(r => r.id === res.body.booking.id)?.checkout, 'a 201 booking has its payment page').toBeTruthy()
    }
    // A guest told 503 after the payment page was made keeps that hold (it shows in My bookings,
    // can be paid or given back, and runs out with its time); nothing else is left behind.
    for (const r of live) {
      expect(answers.some(a => a.status === 201 && a.body.booking.id === r.id) || (r.state === 'held' && r.checkout), `booking ${r.id}`).toBeTruthy()
    }
    expect(await seatsLeft(session.id)).toBe(seats - live.reduce((n, r) => n + r.partySize, 0))

    // After recovery a guest can book (201), or is given back the hold they already have (200).
    const retry = await guests[5]!.client.post('/api/bookings', bookingBody(session.id, guests[5]!, 2))
    expect([200, 201], JSON.stringify(retry.body)).toContain(retry.status)
    expect(retry.body.checkoutUrl).toBeTruthy()
    const fresh = await newGuest('fault-db-after')
    expect((await fresh.client.post('/api/bookings', bookingBody(session.id, fresh, 1))).status).toBe(201)
  })

  it('during a lab-sheet import: a 503 message, no product of the sheet is half-imported, and the next import works', { timeout: 30_000 }, async () => {
    const tag = `FLT${runTag()}`
    const rows = 4000
    const csv = bigProductsSheet(rows, tag)
    const lines = Array.from({ length: rows }, (_, i) => i + 2)
    const count = () => withDb(async (c) => {
      const [rows] = await c.query('SELECT COUNT(*) AS n FROM products WHERE code LIKE ?', [`${tag}-%`])
      return Number((rows as { n: number }[])[0]!.n)
    })
    let res: Reply | undefined
    try {
      const pending = manager.post('/api/lab-sheets', { sheet: 'products', csv, lines })
      await new Promise(r => setTimeout(r, 250))
      await stopDb(DB)
      res = await within(20_000, 'the import', pending)
      console.log(`[faults] import while the database stopped: ${res.status}`)
    }
    finally {
      await startDb(DB)
    }
    await waitForHealthy()
    const n = await count()
    if (res.status === 201) expect(n).toBe(rows) // it finished before the stop
    else {
      expectUnavailable(res, 'import')
      expect(n, 'all or nothing').toBe(0)
    }
    const again = await manager.post('/api/lab-sheets', { sheet: 'products', csv: bigProductsSheet(3, `${tag}B`), lines: [2, 3, 4] })
    expect(again.status, JSON.stringify(again.body)).toBe(201)
  })
})

describe('the payment provider fails', () => {
  for (const mode of ['error', 'timeout'] as const) {
    it(`with ${mode === 'error' ? 'errors' : 'a timeout'}: the guest gets 503, no seat is taken, and a retry books`, { timeout: 30_000 }, async () => {
      const session = await newSession(manager, { seats: 4 })
      const guest = await newGuest(`fault-stripe-${mode}`)
      try {
        await setStripeFault(mode)
        const res = await within(25_000, 'the booking', guest.client.post('/api/bookings', bookingBody(session.id, guest, 4)))
        expectUnavailable(res, `stripe ${mode}`)
        expect(await seatsLeft(session.id)).toBe(4)
        expect((await sessionRows(session.id)).every(r => r.state !== 'held' && r.state !== 'confirmed')).toBe(true)
      }
      finally {
        await setStripeFault(null)
      }
      const retry = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 4))
      expect(retry.status, JSON.stringify(retry.body)).toBe(201)
      expect((await payCheckout(checkoutIdOf(retry.body.checkoutUrl))).status).toBe(200)
      await waitForState(retry.body.booking.id, 'confirmed')
      expect(await seatsLeft(session.id)).toBe(0)
      const late = await (await newGuest(`fault-stripe-${mode}-late`)).client.post('/api/bookings', bookingBody(session.id, guest, 1))
      expect(late.status).not.toBe(201)
    })
  }
})

describe('the mail server fails', () => {
  for (const mode of ['reject', 'timeout'] as const) {
    it(`by ${mode === 'reject' ? 'refusing' : 'hanging'}: the message stays in the outbox and is delivered once it is back`, { timeout: 30_000 }, async () => {
      const to = `fault-mail-${mode}-${runTag().toLowerCase()}@example.test`
      const outbox = () => withDb(async (c) => {
        const [rows] = await c.query('SELECT id, status, attempts FROM outbox WHERE to_address = ?', [to])
        return rows as { id: number, status: string, attempts: number }[]
      })
      try {
        await setMailFault(mode)
        expect((await new Client().post('/api/auth/password-reset', { email: to })).status).toBe(200)
        // Not a known account: use an invitation instead, which always mails.
        const invited = await manager.post('/api/staff', { name: 'Fault Mail', email: to, role: 'host' })
        expect(invited.status).toBe(201)
        await waitFor(async () => (await outbox()).some(r => r.attempts >= 1), 'a failed attempt', 15_000)
        const [row] = await outbox()
        expect(row!.status).toBe('pending')
      }
      finally {
        await setMailFault(null)
      }
      // The back-off would wait 30 s: bring the next attempt forward instead of waiting.
      await withDb(c => c.query('UPDATE outbox SET next_attempt_at = NOW(3) WHERE to_address = ?', [to]))
      await waitForMail(to, /invited/i, { timeoutMs: 10_000 })
      await waitFor(async () => (await outbox()).every(r => r.status === 'sent'), 'the outbox row to be marked sent', 5_000)
    })
  }
})
