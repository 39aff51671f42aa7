import { expect, inject } from 'vitest'
import { DateTime } from 'luxon'
import Stripe from 'stripe'
import { Client, uniqueEmail, type Reply } from './http'
import { withDb } from './db'
import { linkToken, waitForMail } from './mail'
import { DEMO_PASSWORD, DEMO_VENUE } from '../../server/demo/data'
import { localSecrets } from '../../scripts/lib/secrets'
import { TEST_CARD_SUCCESS } from '../../scripts/fakes/stripe'

const LOCAL_STRIPE_SECRET_KEY = localSecrets('test').stripeSecretKey

/** The official SDK pointed at the test profile's Stripe fake, as the app uses it. */
export function fakeStripe(): Stripe {
  const url = new URL(inject('stripeUrl'))
  return new Stripe(LOCAL_STRIPE_SECRET_KEY, { host: url.hostname, port: url.port, protocol: 'http', maxNetworkRetries: 0 })
}

export const checkoutIdOf = (checkoutUrl: string) => checkoutUrl.split('/pay/')[1]!

/** Pays a Checkout Session through the fake's control endpoint, as the hosted page would. */
export async function payCheckout(checkoutId: string, card = TEST_CARD_SUCCESS): Promise<{ status: number, body: any }> {
  const res = await fetch(`${inject('stripeUrl')}/__fake/sessions/${checkoutId}/pay`, {
    method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ card }),
  })
  return { status: res.status, body: await res.json() }
}

export async function setStripeFault(mode: null | 'error' | 'timeout'): Promise<void> {
  const res = await fetch(`${inject('stripeUrl')}/__fake/fault`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ mode }) })
  expect(res.status).toBe(200)
}

export interface FakeEventRecord { id: string, type: string, event: { data: { object: { id: string } } }, delivery: { status: string, attempts: number } }

export async function fakeEvents(): Promise<FakeEventRecord[]> {
  return (await fetch(`${inject('stripeUrl')}/__fake/events`)).json() as Promise<FakeEventRecord[]>
}

/** Waits until the fake has an event of `type` about `objectId` and has delivered it. */
export async function waitForEvent(type: string, objectId: string, timeoutMs = 10_000): Promise<FakeEventRecord> {
  return waitFor(async () => {
    const hit = (await fakeEvents()).find(e => e.type === type && e.event.data.object.id === objectId)
    return hit && hit.delivery.status === 'delivered' ? hit : null
  }, `${type} for ${objectId} delivered`, timeoutMs)
}

/** Polls until `probe` returns something truthy. */
export async function waitFor<T>(probe: () => Promise<T | null | undefined | false>, what: string, timeoutMs = 10_000): Promise<T> {
  const until = Date.now() + timeoutMs
  for (;;) {
    const value = await probe()
    if (value) return value
    if (Date.now() > until) throw new Error(`timed out waiting for ${what}`)
    await new Promise(r => setTimeout(r, 100))
  }
}

export async function signedIn(email: string, password = DEMO_PASSWORD): Promise<Client> {
  const c = new Client()
  expect((await c.signIn(email, password)).status).toBe(200)
  return c
}

/**
 * A new guest account, born on `dateOfBirth`: signed up, its address confirmed through the link in
 * the e-mail as a guest would, and so signed in.
 */
export async function newGuest(tag = 'guest', dateOfBirth = '1990-05-14'): Promise<{ client: Client, email: string, name: string, dateOfBirth: string }> {
  const { client, email, name } = await signedUpGuest(tag, dateOfBirth)
  await confirmAddress(client, email)
  return { client, email, name, dateOfBirth }
}

/** A guest who has signed up but not yet opened the e-mailed link (not signed in). */
export async function signedUpGuest(tag = 'guest', dateOfBirth = '1990-05-14', password = 'guest-password-1'): Promise<{ client: Client, email: string, name: string, password: string }> {
  const client = new Client()
  const email = uniqueEmail(tag)
  const name = `Guest ${tag}`
  const res = await client.post('/api/auth/signup', { name, email, password, dateOfBirth })
  expect(res.status, JSON.stringify(res.body)).toBe(202)
  return { client, email, name, password }
}

/** Opens the address-check link of the `count`-th such e-mail to `email` with `client`, which is then signed in. */
export async function confirmAddress(client: Client, email: string, count = 1): Promise<void> {
  const token = linkToken(await waitForMail(email, /Confirm your e-mail address/, { count }), '/verify-email')
  const res = await client.post('/api/auth/verify-email', { token })
  expect(res.status, JSON.stringify(res.body)).toBe(200)
}

let publishedFlightId: number | undefined
export async function demoFlightId(): Promise<number> {
  if (publishedFlightId) return publishedFlightId
  const res = await new Client().get('/api/flights/published')
  expect(res.status).toBe(200)
  // The demo's flight by name: other tests publish flights of their own.
  publishedFlightId = (res.body as { id: number, name: string }[]).find(f => f.name === 'Shoreline Flight')!.id

  return publishedFlightId
}

/**
 * A session of the demo flight. A flight cannot start twice at the same instant (a unique index),
 * and every test file adds sessions to the same database, so the start is spread: by default over
 * a few days around nine days ahead; with `hoursAhead`, over the following hour, trying another
 * minute when that one is taken.
 */
export async function newSession(manager: Client, opts: { hoursAhead?: number, seats?: number, priceMinor?: number, bookingCutoffMinutes?: number, flightId?: number } = {}): Promise<{ id: number, startsAt: string }> {
  let res: Reply | undefined
  for (let attempt = 0; attempt < 12; attempt++) {
    const hours = opts.hoursAhead ?? 24 * 9 + Math.floor(Math.random() * 96)
    const start = DateTime.now().setZone(DEMO_VENUE.timeZone).plus({ hours, minutes: Math.floor(Math.random() * 50) })
    res = await manager.post('/api/sessions', {
      flightId: opts.flightId ?? await demoFlightId(),
      startDate: start.toISODate(),
      startTime: start.toFormat('HH:mm'),
      durationMinutes: 75,
      seats: opts.seats ?? 8,
      priceMinor: opts.priceMinor ?? 3500,
      bookingCutoffMinutes: opts.bookingCutoffMinutes ?? 60,
    })
    if (res.status !== 409 && res.status !== 500) break
  }
  expect(res!.status, JSON.stringify(res!.body)).toBe(201)
  return { id: res!.body[0].id, startsAt: res!.body[0].startsAt }
}

export function bookingBody(sessionId: number, guest: { email: string, name: string, dateOfBirth: string }, partySize = 2) {
  return {
    sessionId, partySize, contactName: guest.name, contactEmail: guest.email, contactPhone: '+1 207 555 0100',
    dateOfBirth: guest.dateOfBirth, ageConfirmed: true,
  }
}

export async function bookingRow(id: number): Promise<Record<string, any>> {
  return withDb(async (c) => {
    const [rows] = await c.query('SELECT * FROM bookings WHERE id = ?', [id])
    return (rows as Record<string, any>[])[0]!
  })
}

export async function waitForState(id: number, state: string, timeoutMs = 10_000): Promise<Record<string, any>> {
  return waitFor(async () => {
    const row = await bookingRow(id)
    return row.state === state ? row : null
  }, `booking ${id} to be ${state}`, timeoutMs)
}

/** Holds seats and pays for them on the fake; resolves once the webhook has confirmed the booking. */
export async function bookAndPay(guest: { client: Client, email: string, name: string, dateOfBirth: string }, sessionId: number, partySize = 2) {
  const res = await guest.client.post('/api/bookings', bookingBody(sessionId, guest, partySize))
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  const checkoutId = checkoutIdOf(res.body.checkoutUrl)
  expect((await payCheckout(checkoutId)).status).toBe(200)
  const row = await waitForState(res.body.booking.id, 'confirmed')
  return { id: res.body.booking.id as number, reference: res.body.booking.reference as string, checkoutId, row }
}

export async function seatsLeft(sessionId: number): Promise<number> {
  const res = await new Client().get(`/api/sessions/${sessionId}/availability`)
  expect(res.status).toBe(200)
  return res.body.session.seatsLeft
}

export async function outboxRows(to: string): Promise<{ subject: string, attachments: { filename: string, contentType: string, contentBase64: string }[] | null }[]> {
  return withDb(async (c) => {
    const [rows] = await c.query('SELECT subject, attachments FROM outbox WHERE to_address = ? ORDER BY id', [to])
    return (rows as { subject: string, attachments: unknown }[]).map(r => ({ subject: r.subject, attachments: typeof r.attachments === 'string' ? JSON.parse(r.attachments) : r.attachments as any }))
  })
}

/**
 * A start `minutesFromNow` away, kept on today's date in the venue's zone (check-in is for the
 * session's day): close to the venue's midnight it is held just inside today.
 */
export function startTodayIn(minutesFromNow: number): Date {
  const now = DateTime.now().setZone(DEMO_VENUE.timeZone)
  let start = now.plus({ minutes: minutesFromNow })
  // Another test's session may be held there too: a flight has one session per instant, so each gets its own.
  const spread = { seconds: 20 + Math.floor(Math.random() * 120), milliseconds: Math.floor(Math.random() * 1000) }
  if (!start.hasSame(now, 'day')) start = minutesFromNow > 0 ? now.endOf('day').minus(spread) : now.startOf('day').plus(spread)
  return start.toUTC().toJSDate()
}
