import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import Stripe from 'stripe'
import { API_VERSION, parseForm, signPayload, startStripeFake, TEST_CARD_DECLINE, TEST_CARD_SUCCESS, type StripeFake } from '../../scripts/fakes/stripe'

const WEBHOOK_SECRET = 'whsec_larmoir_unit_test'
const verifier = new Stripe('sk_test_x')

interface Delivery { raw: string, header: string, event: Stripe.Event | null, error: string | null }

/** A webhook endpoint that verifies each delivery as the app will, and can be told to fail. */
async function startReceiver() {
  const deliveries: Delivery[] = []
  const state = { failNext: 0, failAlways: false }
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = []
    req.on('data', (c: Buffer) => chunks.push(c))
    req.on('end', () => {
      const raw = Buffer.concat(chunks).toString('utf8')
      const header = String(req.headers['stripe-signature'] ?? '')
      if (state.failAlways || state.failNext > 0) {
        state.failNext = Math.max(0, state.failNext - 1)
        deliveries.push({ raw, header, event: null, error: 'told to fail' })
        return void res.writeHead(503).end()
      }
      try {
        const event = verifier.webhooks.constructEvent(raw, header, WEBHOOK_SECRET)
        deliveries.push({ raw, header, event, error: null })
        res.writeHead(200, { 'content-type': 'application/json' }).end('{"received":true}')
      }
      catch (e) {
        deliveries.push({ raw, header, event: null, error: (e as Error).message })
        res.writeHead(400).end()
      }
    })
  })
  await new Promise<void>(ok => server.listen(0, '127.0.0.1', () => ok()))
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/webhooks/stripe`
  return { url, deliveries, state, close: () => new Promise<void>(ok => server.close(() => ok())) }
}

let offsetMs = 0
const clock = () => Date.now() + offsetMs
const nowS = () => Math.floor(clock() / 1000)

let fake: StripeFake
let receiver: Awaited<ReturnType<typeof startReceiver>>
let stripe: Stripe

const received = (type: string) => receiver.deliveries.filter(d => d.event?.type === type).map(d => d.event!)

async function api(method: string, path: string, body?: string, headers: Record<string, string> = {}) {
  const res = await fetch(`${fake.url}${path}`, {
    method,
    headers: { 'content-type': 'application/x-www-form-urlencoded', ...headers },
    ...(body !== undefined ? { body } : {}),
  })
  return { status: res.status, json: await res.json() as { error?: { type: string, code?: string, param?: string, message: string } } }
}

function sessionParams(over: Partial<Stripe.Checkout.SessionCreateParams> = {}): Stripe.Checkout.SessionCreateParams {
  return {
    mode: 'payment',
    line_items: [
      { price_data: { currency: 'eur', unit_amount: 2500, product_data: { name: 'Riesling flight <b>&</b> cheese' } }, quantity: 2 },
      { price_data: { currency: 'eur', unit_amount: 1800, product_data: { name: 'Cider flight' } }, quantity: 1 },
    ],
    success_url: 'https://larmoir.test/bookings/12/paid?session={CHECKOUT_SESSION_ID}',
    cancel_url: 'https://larmoir.test/bookings/12',
    customer_email: 'guest@example.test',
    client_reference_id: 'booking-12',
    metadata: { bookingId: '12' },
    payment_intent_data: { metadata: { bookingId: '12', venue: 'north' } },
    expires_at: nowS() + 3600,
    ...over,
  }
}

async function payByForm(id: string, card: string, extra: Record<string, string> = {}) {
  return fetch(`${fake.url}/pay/${id}`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ name: 'Ann Guest', card, expiry: '12/40', cvc: '123', ...extra }).toString(),
  })
}

beforeAll(async () => {
  receiver = await startReceiver()
  fake = await startStripeFake({ port: 0, webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET, now: clock, retryDelayMs: 20 })
  stripe = new Stripe('sk_test_larmoir', { host: '127.0.0.1', port: Number(new URL(fake.url).port), protocol: 'http', maxNetworkRetries: 0 })
})

afterAll(async () => {
  await fake.close()
  await receiver.close()
})

describe('form bodies in bracket notation', () => {
  it('expands nested objects, indexed lists and [] lists', () => {
    const p = parseForm('line_items[0][price_data][unit_amount]=2500&line_items[0][quantity]=2&metadata[bookingId]=12'
      + '&payment_intent_data[metadata][x]=y%20z&expand[]=payment_intent&expand[]=line_items&success_url=https%3A%2F%2Fa.test%2F%3Fs%3D%7BCHECKOUT_SESSION_ID%7D')
    expect(JSON.parse(JSON.stringify(p))).toEqual({
      line_items: { 0: { price_data: { unit_amount: '2500' }, quantity: '2' } },
      metadata: { bookingId: '12' },
      payment_intent_data: { metadata: { x: 'y z' } },
      expand: ['payment_intent', 'line_items'],
      success_url: 'https://a.test/?s={CHECKOUT_SESSION_ID}',
    })
    expect(JSON.parse(JSON.stringify(parseForm('metadata%5Bk%5D=v')))).toEqual({ metadata: { k: 'v' } })
  })

  it.each(['a=1&a[b]=2', 'a[b]=2&a=1', 'a[]=1&a[b]=2', 'a]=1'])('refuses the conflicting body %s', (body) => {
    expect(() => parseForm(body)).toThrow()
  })
})

describe('the API', () => {
  it('listens on the port it was given, or a free one for port 0', () => {
    expect(fake.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/)
    expect(new URL(fake.url).port).not.toBe('0')
  })

  it('answers 401 without a test-mode secret key', async () => {
    const none = await api('GET', '/v1/checkout/sessions/cs_test_x')
    expect(none.status).toBe(401)
    expect(none.json.error).toMatchObject({ type: 'invalid_request_error' })
    expect((await api('GET', '/v1/checkout/sessions/cs_test_x', undefined, { authorization: 'Bearer sk_live_abc' })).status).toBe(401)
    const live = new Stripe('pk_test_abc', { host: '127.0.0.1', port: Number(new URL(fake.url).port), protocol: 'http', maxNetworkRetries: 0 })
    await expect(live.checkout.sessions.retrieve('cs_test_x')).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError)
  })

  it('answers 404 resource_missing for an unknown session, and 404 for an unknown route', async () => {
    await expect(stripe.checkout.sessions.retrieve('cs_test_nope')).rejects.toMatchObject({
      type: 'StripeInvalidRequestError', statusCode: 404, code: 'resource_missing', param: 'session',
    })
    const route = await api('GET', '/v1/customers', undefined, { authorization: 'Bearer sk_test_x' })
    expect(route.status).toBe(404)
    expect(route.json.error?.type).toBe('invalid_request_error')
  })

  const base = 'mode=payment&success_url=https%3A%2F%2Fa.test%2Fok&line_items[0][quantity]=1&line_items[0][price_data][currency]=usd'
    + '&line_items[0][price_data][unit_amount]=100&line_items[0][price_data][product_data][name]=Flight'
  it.each([
    ['no mode', base.replace('mode=payment&', ''), 'mode'],
    ['subscription mode', base.replace('mode=payment', 'mode=subscription'), 'mode'],
    ['no line items', 'mode=payment&success_url=https%3A%2F%2Fa.test%2Fok', 'line_items'],
    ['no quantity', base.replace('line_items[0][quantity]=1&', ''), 'line_items[0][quantity]'],
    ['zero quantity', base.replace('[quantity]=1', '[quantity]=0'), 'line_items[0][quantity]'],
    ['no currency', base.replace('&line_items[0][price_data][currency]=usd', ''), 'line_items[0][price_data][currency]'],
    ['bad currency', base.replace('=usd', '=zzzz'), 'line_items[0][price_data][currency]'],
    ['fractional amount', base.replace('=100', '=1.5'), 'line_items[0][price_data][unit_amount]'],
    ['no product name', base.replace('&line_items[0][price_data][product_data][name]=Flight', ''), 'line_items[0][price_data][product_data]'],
    ['a stored price', `${base}&line_items[0][price]=price_123`, 'line_items[0][price]'],
    ['bad success_url', base.replace('https%3A%2F%2Fa.test%2Fok', 'not-a-url'), 'success_url'],
    ['bad e-mail', `${base}&customer_email=nope`, 'customer_email'],
    ['expiry in the past', `${base}&expires_at=1000`, 'expires_at'],
    ['expiry 30 s ahead', `${base}&expires_at=${nowS() + 30}`, 'expires_at'],
    ['expiry past 24 h', `${base}&expires_at=${nowS() + 90_000}`, 'expires_at'],
    ['an unknown parameter', `${base}&colour=red`, 'colour'],
  ])('refuses a session with %s (param %s)', async (_label, body, param) => {
    const r = await api('POST', '/v1/checkout/sessions', body, { authorization: 'Bearer sk_test_x' })
    expect(r.status).toBe(400)
    expect(r.json.error).toMatchObject({ type: 'invalid_request_error', param })
  })

  it('turns every /v1 call into a 500 api_error in fault mode "error", and hangs them in "timeout"', async () => {
    fake.setFault('error')
    await expect(stripe.checkout.sessions.retrieve('cs_test_x')).rejects.toBeInstanceOf(Stripe.errors.StripeAPIError)
    fake.setFault(null)
    await expect(stripe.checkout.sessions.retrieve('cs_test_x')).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)

    const set = (mode: string | null) => fetch(`${fake.url}/__fake/fault`, { method: 'POST', body: JSON.stringify({ mode }) })
    expect((await set('timeout')).status).toBe(200)
    const impatient = new Stripe('sk_test_x', { host: '127.0.0.1', port: Number(new URL(fake.url).port), protocol: 'http', maxNetworkRetries: 0, timeout: 300 })
    await expect(impatient.checkout.sessions.retrieve('cs_test_x')).rejects.toBeInstanceOf(Stripe.errors.StripeConnectionError)
    expect((await set('sideways')).status).toBe(400)
    expect((await set(null)).status).toBe(200)
  })
})

describe('a booking paid through Checkout', () => {
  let session: Stripe.Checkout.Session
  const key = 'booking-12-attempt-1'

  it('creates a session once per idempotency key', async () => {
    session = await stripe.checkout.sessions.create(sessionParams(), { idempotencyKey: key })
    expect(session).toMatchObject({
      object: 'checkout.session', livemode: false, mode: 'payment', status: 'open', payment_status: 'unpaid',
      amount_subtotal: 6800, amount_total: 6800, currency: 'eur', payment_intent: null,
      metadata: { bookingId: '12' }, client_reference_id: 'booking-12', customer_email: 'guest@example.test',
      success_url: 'https://larmoir.test/bookings/12/paid?session={CHECKOUT_SESSION_ID}', cancel_url: 'https://larmoir.test/bookings/12',
    })
    expect(session.id).toMatch(/^cs_test_\w+$/)
    expect(session.url).toBe(`${fake.url}/pay/${session.id}`)
    expect(Math.abs(session.created - nowS())).toBeLessThanOrEqual(1)

    const again = await stripe.checkout.sessions.create(sessionParams({ expires_at: session.expires_at }), { idempotencyKey: key })
    expect(again.id).toBe(session.id)
    await expect(stripe.checkout.sessions.create(sessionParams({ client_reference_id: 'booking-13' }), { idempotencyKey: key }))
      .rejects.toBeInstanceOf(Stripe.errors.StripeIdempotencyError)
  })

  it('retrieves it, with line items on request', async () => {
    const got = await stripe.checkout.sessions.retrieve(session.id, { expand: ['line_items'] })
    expect(got.id).toBe(session.id)
    expect(got.line_items?.data.map(l => [l.description, l.quantity, l.amount_total])).toEqual([['Riesling flight <b>&</b> cheese', 2, 5000], ['Cider flight', 1, 1800]])
    const items = await stripe.checkout.sessions.listLineItems(session.id)
    expect(items.data[0]?.price?.unit_amount).toBe(2500)
  })

  it('shows a hosted page with the items, the total and the test cards', async () => {
    const res = await fetch(session.url!)
    const html = await res.text()
    expect(res.status).toBe(200)
    expect(html).toContain('Local test payment page')
    expect(html).toContain('€68.00')
    expect(html).toContain('Riesling flight &#60;b&#62;&#38;&#60;/b&#62; cheese')
    expect(html).not.toContain('<b>&</b>')
    expect(html).toContain('4242 4242 4242 4242') // Stripe docs: test card numbers
    expect(html).toContain('4000 0000 0000 0002') // Stripe docs: test card numbers
    expect(html).toContain('href="https://larmoir.test/bookings/12"')
  })

  it('asks for a test card when another number is typed, escaping what was typed', async () => {
    const res = await payByForm(session.id, '1234 5678 9012 3456', { name: '<script>alert(1)</script>' })
    const html = await res.text()
    expect(res.status).toBe(400)
    expect(html).toContain('use a test card')
    expect(html).toContain('&#60;script&#62;alert(1)&#60;/script&#62;')
    expect(html).not.toContain('<script>alert(1)')
  })

  it('takes the success card, redirects to the success URL and sends checkout.session.completed', async () => {
    const res = await payByForm(session.id, '4242 4242 4242 4242') // Stripe docs: test card numbers
    expect(res.status).toBe(303)
    expect(res.headers.get('location')).toBe(`https://larmoir.test/bookings/12/paid?session=${session.id}`)
    await fake.drain()
    const [completed] = received('checkout.session.completed')
    expect(completed?.data.object).toMatchObject({ id: session.id, status: 'complete', payment_status: 'paid', metadata: { bookingId: '12' } })
    expect(completed).toMatchObject({ object: 'event', api_version: API_VERSION, livemode: false, pending_webhooks: 1, request: { id: null, idempotency_key: null } })
    expect(completed?.id).toMatch(/^evt_/)

    const paid = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] })
    expect(paid).toMatchObject({ status: 'complete', payment_status: 'paid' })
    const pi = paid.payment_intent as Stripe.PaymentIntent
    expect(pi).toMatchObject({ object: 'payment_intent', status: 'succeeded', amount: 6800, amount_received: 6800, currency: 'eur', metadata: { bookingId: '12', venue: 'north' } })
    expect(pi.id).toMatch(/^pi_/)
    expect(pi.latest_charge).toMatch(/^ch_/)
    expect((await stripe.paymentIntents.retrieve(pi.id)).id).toBe(pi.id)

    const page = await (await fetch(`${fake.url}/pay/${session.id}`)).text()
    expect(page).toContain('Payment received')
    expect(page).not.toContain('<form')
    expect((await payByForm(session.id, TEST_CARD_SUCCESS)).status).toBe(409)
  })

  it('refunds part, then the rest, then refuses more', async () => {
    const paid = await stripe.checkout.sessions.retrieve(session.id)
    const pi = paid.payment_intent as string
    const part = await stripe.refunds.create({ payment_intent: pi, amount: 1000, reason: 'requested_by_customer', metadata: { bookingId: '12' } })
    expect(part).toMatchObject({ object: 'refund', status: 'succeeded', amount: 1000, currency: 'eur', payment_intent: pi, metadata: { bookingId: '12' } })
    expect(part.id).toMatch(/^re_/)
    expect((await stripe.refunds.retrieve(part.id)).amount).toBe(1000)

    await expect(stripe.refunds.create({ payment_intent: pi, amount: 9999 })).rejects.toMatchObject({ type: 'StripeInvalidRequestError', code: 'amount_too_large', param: 'amount' })
    const rest = await stripe.refunds.create({ charge: part.charge as string })
    expect(rest.amount).toBe(5800)
    await expect(stripe.refunds.create({ payment_intent: pi })).rejects.toMatchObject({ type: 'StripeInvalidRequestError', code: 'charge_already_refunded' })

    await fake.drain()
    expect(received('refund.created').map(e => (e.data.object as Stripe.Refund).amount)).toEqual([1000, 5800])
    expect(received('charge.refunded').map(e => [(e.data.object as Stripe.Charge).amount_refunded, (e.data.object as Stripe.Charge).refunded])).toEqual([[1000, false], [6800, true]])
  })
})

describe('a declined card', () => {
  it('re-renders the page with 402, stays open and sends payment_intent.payment_failed', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams({ metadata: { bookingId: '14' }, payment_intent_data: { metadata: { bookingId: '14' } } }))
    const res = await payByForm(s.id, '4000 0000 0000 0002') // Stripe docs: test card numbers
    expect(res.status).toBe(402)
    expect(await res.text()).toContain('Your card was declined')
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe('open')
    await fake.drain()
    const failed = received('payment_intent.payment_failed').at(-1)?.data.object as Stripe.PaymentIntent
    expect(failed).toMatchObject({
      object: 'payment_intent', status: 'requires_payment_method', metadata: { bookingId: '14' },
      last_payment_error: { code: 'card_declined', decline_code: 'generic_decline', message: 'Your card was declined.' },
    })

    // A later good card pays through the same payment intent, and the webhooks arrive in the order things happened.
    const pay = await fetch(`${fake.url}/__fake/sessions/${s.id}/pay`, { method: 'POST', body: JSON.stringify({ card: TEST_CARD_SUCCESS }) })
    expect(await pay.json()).toEqual({ redirect: `https://larmoir.test/bookings/12/paid?session=${s.id}` })
    await fake.drain()
    const forSession = receiver.deliveries.map(d => d.event).filter(e => e && ((e.data.object as { id: string }).id === failed.id || (e.data.object as { id: string }).id === s.id))
    expect(forSession.map(e => e!.type)).toEqual(['payment_intent.payment_failed', 'checkout.session.completed'])
    expect((forSession[1]!.data.object as Stripe.Checkout.Session).payment_intent).toBe(failed.id)
  })

  it('declines through the JSON control endpoint too', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams())
    const res = await fetch(`${fake.url}/__fake/sessions/${s.id}/pay`, { method: 'POST', body: JSON.stringify({ card: TEST_CARD_DECLINE }) })
    expect(res.status).toBe(402)
  })
})

describe('expiry', () => {
  it('expires an open session on request, once', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams())
    const expired = await stripe.checkout.sessions.expire(s.id)
    expect(expired).toMatchObject({ id: s.id, status: 'expired', url: null })
    await expect(stripe.checkout.sessions.expire(s.id)).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    await fake.drain()
    expect(received('checkout.session.expired').filter(e => (e.data.object as { id: string }).id === s.id)).toHaveLength(1)
    expect(await (await fetch(`${fake.url}/pay/${s.id}`)).text()).toContain('expired')
  })

  it('expires a session by itself once expires_at passes', async () => {
    const s = await stripe.checkout.sessions.create(sessionParams({ expires_at: nowS() + 61 }))
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe('open')
    offsetMs += 62_000
    expect((await stripe.checkout.sessions.retrieve(s.id)).status).toBe('expired')
    await fake.drain()
    expect(received('checkout.session.expired').filter(e => (e.data.object as { id: string }).id === s.id)).toHaveLength(1)
    const res = await payByForm(s.id, TEST_CARD_SUCCESS)
    expect(res.status).toBe(409)
  })
})

describe('webhook delivery', () => {
  it('signs exactly as Stripe does', async () => {
    const payload = '{"id":"evt_1"}'
    const t = 1_700_000_000
    expect(signPayload(payload, WEBHOOK_SECRET, t)).toBe(verifier.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET, timestamp: t }))
    const d = receiver.deliveries.find(x => x.event)!
    expect(d.header).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/) // Stripe docs: webhook signatures
    expect(() => verifier.webhooks.constructEvent(d.raw, d.header, 'whsec_wrong')).toThrow(Stripe.errors.StripeSignatureVerificationError)
    expect(() => verifier.webhooks.constructEvent(d.raw.replace('"event"', '"evil"'), d.header, WEBHOOK_SECRET)).toThrow(Stripe.errors.StripeSignatureVerificationError)
    expect(receiver.deliveries.every(x => x.error === null || x.error === 'told to fail')).toBe(true)
  })

  it('redelivers an event with the same id', async () => {
    const first = fake.events.find(e => e.type === 'checkout.session.completed')!
    const before = receiver.deliveries.filter(d => d.event?.id === first.id).length
    const res = await fetch(`${fake.url}/__fake/events/${first.id}/redeliver`, { method: 'POST' })
    expect(res.status).toBe(202)
    await fake.drain()
    expect(receiver.deliveries.filter(d => d.event?.id === first.id)).toHaveLength(before + 1)
    const listed = await (await fetch(`${fake.url}/__fake/events`)).json() as { id: string, delivery: { status: string, attempts: number } }[]
    expect(listed.find(e => e.id === first.id)?.delivery).toMatchObject({ status: 'delivered', attempts: 2 })
    expect((await fetch(`${fake.url}/__fake/events/evt_nope/redeliver`, { method: 'POST' })).status).toBe(404)
  })

  it('retries a failing endpoint, then gives up after five retries', async () => {
    receiver.state.failNext = 2
    const s = await stripe.checkout.sessions.create(sessionParams())
    await stripe.checkout.sessions.expire(s.id)
    await fake.drain()
    const retried = fake.events.at(-1)!
    expect(retried.delivery).toMatchObject({ status: 'delivered', attempts: 3 })

    receiver.state.failAlways = true
    const s2 = await stripe.checkout.sessions.create(sessionParams())
    await stripe.checkout.sessions.expire(s2.id)
    await fake.drain()
    receiver.state.failAlways = false
    expect(fake.events.at(-1)!.delivery).toMatchObject({ status: 'failed', attempts: 6, lastStatus: 503 })
  })

  it('records network errors and links the page to publicUrl', async () => {
    const lonely = await startStripeFake({ port: 0, webhookUrl: 'http://127.0.0.1:9/nowhere', webhookSecret: WEBHOOK_SECRET, publicUrl: 'http://pay.larmoir.localhost:4010', retryDelayMs: 1 })
    try {
      const client = new Stripe('sk_test_x', { host: '127.0.0.1', port: Number(new URL(lonely.url).port), protocol: 'http', maxNetworkRetries: 0 })
      const s = await client.checkout.sessions.create(sessionParams())
      expect(s.url).toBe(`http://pay.larmoir.localhost:4010/pay/${s.id}`)
      await client.checkout.sessions.expire(s.id)
      await lonely.drain()
      expect(lonely.events[0]?.delivery).toMatchObject({ status: 'failed', attempts: 6, lastStatus: null })
      expect(lonely.events[0]?.delivery.lastError).toBeTruthy()
    }
    finally { await lonely.close() }
  })
})
