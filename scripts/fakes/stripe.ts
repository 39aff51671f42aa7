/**
 * The local Stripe fake: an in-memory stand-in for the slice of Stripe's v1 API the app uses
 * (Checkout Sessions in payment mode, PaymentIntents, Charges, Refunds, Events), a hosted payment
 * page that takes Stripe's published test cards, and signed webhook delivery. Plain node:http on
 * 127.0.0.1; development and tests only. The official SDK talks to it with
 * `new Stripe('sk_test_…', { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0 })`.
 *
 * Object shapes follow the SDK's type definitions (node_modules/stripe/esm/resources/*.d.ts);
 * the error shapes and the webhook signature follow https://docs.stripe.com/api/errors and
 * https://docs.stripe.com/webhooks#verify-manually.
 */
import { createServer, request as httpRequest, type ClientRequest, type IncomingMessage, type Server, type ServerResponse } from 'node:http'
import { request as httpsRequest } from 'node:https'
import { createHmac, randomBytes } from 'node:crypto'
import type { AddressInfo } from 'node:net'
import Stripe from 'stripe'
import { formatAmount, renderPayPage, renderStatusPage, type PageLine } from './stripe-page'

/** Stripe's published test card numbers (https://docs.stripe.com/testing#cards). */
export const TEST_CARD_SUCCESS = '4242424242424242'
export const TEST_CARD_DECLINE = '4000000000000002'
export const TEST_CARDS = { success: TEST_CARD_SUCCESS, decline: TEST_CARD_DECLINE } as const

/** The API version the installed SDK pins; events carry it as Stripe does for the account's version. */
export const API_VERSION: string = Stripe.API_VERSION

export type FaultMode = null | 'error' | 'timeout'

export interface FakeEventDelivery {
  status: 'pending' | 'delivered' | 'failed'
  /** Every POST made for this event so far, redeliveries included. */
  attempts: number
  lastStatus: number | null
  lastError: string | null
  deliveredAt: string | null
}

export interface FakeEvent {
  id: string
  type: string
  /** The event as delivered: the webhook body is exactly `JSON.stringify(event)`. */
  event: Stripe.EventBase
  delivery: FakeEventDelivery
}

export interface StripeFakeOptions {
  /** 0 picks any free port; the one chosen is in `url`. */
  port: number
  webhookUrl: string
  webhookSecret: string
  /** Base of the hosted page links (`session.url`) when the browser reaches the fake by another address. */
  publicUrl?: string
  /** Clock for object timestamps and expiry, in ms (tests move it forward instead of waiting). */
  now?: () => number
  /** First webhook retry delay in ms; it doubles per retry. */
  retryDelayMs?: number
}

export interface StripeFake {
  url: string
  close: () => Promise<void>
  events: FakeEvent[]
  setFault: (mode: FaultMode) => void
  /** Resolves once every queued webhook delivery has finished (delivered or given up). */
  drain: () => Promise<void>
}

// Stripe retries for days; here a handful of quick retries keeps tests short and still exercises the app's replay handling.
const WEBHOOK_RETRIES = 5
const WEBHOOK_TIMEOUT_MS = 10_000
const FAULT_HOLD_MS = 30_000
const SWEEP_MS = 1_000
const MAX_BODY_BYTES = 1_000_000
// Stripe keeps idempotency keys for 24 h; a local process keeps them for its lifetime, up to this many.
const MAX_IDEMPOTENCY_KEYS = 100_000
// Stripe's limits: https://docs.stripe.com/metadata, https://docs.stripe.com/api/checkout/sessions/create
const METADATA_MAX_KEYS = 50
const METADATA_KEY_MAX = 40
const METADATA_VALUE_MAX = 500
const MAX_LINE_ITEMS = 100
const MAX_AMOUNT = 99_999_999
const SESSION_MAX_LIFETIME_S = 24 * 60 * 60
// Real Stripe requires at least 30 minutes; the fake accepts 60 s so expiry can be exercised quickly.
const SESSION_MIN_LIFETIME_S = 60
const DOCS = 'https://docs.stripe.com/error-codes'

// ——— form bodies in Stripe's bracket notation ———

export type Param = string | Param[] | Params
export interface Params { [key: string]: Param }

class ApiError extends Error {
  constructor(readonly status: number, readonly body: { type: string, message: string, code?: string, param?: string, decline_code?: string }) {
    super(body.message)
  }
}

const invalid = (message: string, param?: string, code?: string) =>
  new ApiError(400, { type: 'invalid_request_error', message, ...(param ? { param } : {}), ...(code ? { code, doc_url: `${DOCS}#${code.replace(/_/g, '-')}` } : {}) })

/**
 * `a[b][0][c]=1&e[]=2` → `{ a: { b: { 0: { c: '1' } } }, e: ['2'] }`. Indexed segments stay object
 * keys (metadata may have numeric keys); `list()` turns them into arrays where the API expects one.
 */
export function parseForm(raw: string): Params {
  const root: Params = Object.create(null)
  for (const [key, value] of new URLSearchParams(raw)) {
    const m = /^([^[\]]+)((?:\[[^[\]]*\])*)$/.exec(key)
    if (!m) throw invalid(`Invalid parameter name: ${key}`, key)
    const path = [m[1]!, ...[...m[2]!.matchAll(/\[([^[\]]*)\]/g)].map(s => s[1]!)]
    if (path.length > 8) throw invalid(`Parameter nested too deeply: ${key}`, key)
    let node: Params | Param[] = root
    for (let i = 0; i < path.length; i++) {
      const seg = path[i]!
      const last = i === path.length - 1
      const make = (): Param => (last ? value : path[i + 1] === '' ? [] : Object.create(null))
      if (Array.isArray(node)) {
        if (seg !== '') throw invalid(`Invalid array: ${key}`, key)
        const child = make()
        node.push(child)
        if (!last) node = child as Params | Param[]
        continue
      }
      if (seg === '') throw invalid(`Invalid array: ${key}`, key)
      const existing: Param | undefined = node[seg]
      if (last) {
        if (existing !== undefined && typeof existing !== 'string') throw invalid(`Invalid value for ${key}: both a value and nested parameters were sent`, key)
        node[seg] = value
        break
      }
      const wantArray = path[i + 1] === ''
      if (existing === undefined) node[seg] = make()
      else if (typeof existing === 'string' || Array.isArray(existing) !== wantArray) throw invalid(`Invalid value for ${key}: both a value and nested parameters were sent`, key)
      node = node[seg] as Params | Param[]
    }
  }
  return root
}

const at = (prefix: string, key: string) => (prefix ? `${prefix}[${key}]` : key)
const isObj = (v: Param | undefined): v is Params => typeof v === 'object' && v !== null && !Array.isArray(v)

function rejectUnknown(p: Params, allowed: readonly string[], prefix = '') {
  for (const k of Object.keys(p)) if (!allowed.includes(k)) throw invalid(`Received unknown parameter: ${at(prefix, k)}`, at(prefix, k))
}

function obj(p: Params, key: string, prefix: string): Params | undefined {
  const v = p[key]
  if (v === undefined || v === '') return undefined
  if (!isObj(v)) throw invalid(`Invalid object`, at(prefix, key))
  return v
}

function list(p: Params, key: string, prefix: string): Param[] | undefined {
  const v = p[key]
  if (v === undefined || v === '') return undefined
  if (Array.isArray(v)) return v
  if (!isObj(v)) throw invalid('Invalid array', at(prefix, key))
  const keys = Object.keys(v)
  const indices = keys.map(Number).sort((a, b) => a - b)
  if (!keys.every(k => /^(0|[1-9]\d*)$/.test(k)) || !indices.every((n, i) => n === i)) throw invalid('Invalid array', at(prefix, key))
  return indices.map(i => v[String(i)]!)
}

function str(p: Params, key: string, prefix: string, max = 5000): string | undefined {
  const v = p[key]
  if (v === undefined || v === '') return undefined
  if (typeof v !== 'string') throw invalid('Invalid string', at(prefix, key))
  if (v.length > max) throw invalid(`Invalid string: must be at most ${max} characters`, at(prefix, key))
  return v
}

function int(p: Params, key: string, prefix: string, min: number, max = Number.MAX_SAFE_INTEGER): number | undefined {
  const v = p[key]
  if (v === undefined || v === '') return undefined
  if (typeof v !== 'string' || !/^-?\d+$/.test(v)) throw invalid(`Invalid integer: ${typeof v === 'string' ? v : 'object'}`, at(prefix, key))
  const n = Number(v)
  if (n < min) throw invalid(`This value must be greater than or equal to ${min}.`, at(prefix, key))
  if (n > max) throw invalid(`This value must be less than or equal to ${max}.`, at(prefix, key))
  return n
}

function oneOf<T extends string>(p: Params, key: string, prefix: string, values: readonly T[]): T | undefined {
  const v = str(p, key, prefix)
  if (v === undefined) return undefined
  if (!(values as readonly string[]).includes(v)) throw invalid(`Invalid ${key}: must be one of ${values.join(', ')}`, at(prefix, key))
  return v as T
}

function required<T>(v: T | undefined, param: string): T {
  if (v === undefined) throw invalid(`Missing required param: ${param}.`, param)
  return v
}

function metadata(p: Params, key: string, prefix: string): Record<string, string> {
  const out: Record<string, string> = {}
  const m = obj(p, key, prefix)
  if (!m) return out
  for (const [k, v] of Object.entries(m)) {
    const param = at(at(prefix, key), k)
    if (typeof v !== 'string') throw invalid('Invalid string', param)
    if (k.length > METADATA_KEY_MAX) throw invalid(`Invalid metadata: keys can be up to ${METADATA_KEY_MAX} characters long`, param)
    if (v.length > METADATA_VALUE_MAX) throw invalid(`Invalid metadata: values can be up to ${METADATA_VALUE_MAX} characters long`, param)
    if (v !== '') out[k] = v
  }
  if (Object.keys(out).length > METADATA_MAX_KEYS) throw invalid(`Invalid metadata: metadata can have up to ${METADATA_MAX_KEYS} keys`, at(prefix, key))
  return out
}

function httpUrl(p: Params, key: string): string | undefined {
  const v = str(p, key, '', 5000)
  if (v === undefined) return undefined
  try {
    // Stripe leaves the {CHECKOUT_SESSION_ID} template in place until the redirect.
    const u = new URL(v.replace('{CHECKOUT_SESSION_ID}', 'x'))
    if (u.protocol === 'http:' || u.protocol === 'https:') return v
  }
  catch { /* falls through */ }
  throw invalid('Not a valid URL', key, 'url_invalid')
}

// ——— ids, clocks ———

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789'
function newId(prefix: string, length = 24): string {
  let s = prefix
  for (const b of randomBytes(length)) s += ALPHABET[b % ALPHABET.length]
  return s
}

/** `t=<unix>,v1=<hex HMAC-SHA256 of "<t>.<payload>">`, as https://docs.stripe.com/webhooks#verify-manually describes. */
export function signPayload(payload: string, secret: string, timestamp: number): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex')
  return `t=${timestamp},v1=${v1}`
}

function fractionDigits(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() }).resolvedOptions().maximumFractionDigits ?? 2
}

// ——— the wire shapes (the SDK's types, except that decimals travel as strings) ———

type WirePrice = Omit<Stripe.Price, 'unit_amount_decimal'> & { unit_amount_decimal: string | null }
type WireLineItem = Omit<Stripe.LineItem, 'price'> & { price: WirePrice }
type Session = Omit<Stripe.Checkout.Session, 'line_items'>
type Json = Record<string, unknown>

interface SessionState {
  session: Session
  lines: WireLineItem[]
  piMetadata: Record<string, string>
  piDescription: string | null
  piReceiptEmail: string | null
}

interface PaymentInput { card: string, expiry?: string, cvc?: string, name?: string }
type PaymentOutcome
  = | { kind: 'paid', redirect: string }
    | { kind: 'declined', message: string }
    | { kind: 'invalid', message: string, status: number }

export async function startStripeFake(opts: StripeFakeOptions): Promise<StripeFake> {
  const now = opts.now ?? Date.now
  const nowS = () => Math.floor(now() / 1000)
  const retryDelayMs = opts.retryDelayMs ?? 200
  const webhookUrl = new URL(opts.webhookUrl)

  const sessions = new Map<string, SessionState>()
  const openSessions = new Set<string>()
  const paymentIntents = new Map<string, Stripe.PaymentIntent>()
  const charges = new Map<string, Stripe.Charge>()
  const refunds = new Map<string, Stripe.Refund>()
  const sessionOfIntent = new Map<string, string>()
  const events: FakeEvent[] = []
  const eventsById = new Map<string, { rec: FakeEvent, payload: string, orderKey: string }>()
  const idempotency = new Map<string, { fingerprint: string, status: number, body: string }>()
  let fault: FaultMode = null
  let closed = false
  let baseUrl = ''

  // Everything that may outlive a request, so close() can end it.
  const heldResponses = new Set<{ timer: NodeJS.Timeout, res: ServerResponse }>()
  const sleepers = new Set<{ timer: NodeJS.Timeout, wake: () => void }>()
  const inflight = new Set<ClientRequest>()
  const queues = new Map<string, Promise<void>>()

  const lookup = (id: string): Json | undefined =>
    (sessions.get(id)?.session ?? paymentIntents.get(id) ?? charges.get(id) ?? refunds.get(id)) as Json | undefined

  // ——— webhooks ———

  function sleep(ms: number): Promise<void> {
    return new Promise((wake) => {
      const s = { timer: setTimeout(() => { sleepers.delete(s); wake() }, ms), wake }
      sleepers.add(s)
    })
  }

  function post(payload: string): Promise<number> {
    return new Promise((ok, fail) => {
      // The signature uses the wall clock even when `now` is moved: the receiver checks it against its own clock.
      const signature = signPayload(payload, opts.webhookSecret, Math.floor(Date.now() / 1000))
      const send = webhookUrl.protocol === 'https:' ? httpsRequest : httpRequest
      const req = send(webhookUrl, {
        method: 'POST',
        agent: false,
        timeout: WEBHOOK_TIMEOUT_MS,
        headers: {
          'content-type': 'application/json; charset=utf-8',
          'content-length': Buffer.byteLength(payload),
          'stripe-signature': signature,
          'user-agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)',
        },
      }, (res) => {
        res.resume()
        res.on('end', () => ok(res.statusCode ?? 0))
        res.on('error', fail)
      })
      inflight.add(req)
      req.on('close', () => inflight.delete(req))
      req.on('timeout', () => req.destroy(new Error(`no answer within ${WEBHOOK_TIMEOUT_MS} ms`)))
      req.on('error', fail)
      req.end(payload)
    })
  }

  async function deliver(id: string) {
    const entry = eventsById.get(id)
    if (!entry) return
    const d = entry.rec.delivery
    d.status = 'pending'
    for (let attempt = 0; attempt <= WEBHOOK_RETRIES && !closed; attempt++) {
      if (attempt > 0) await sleep(retryDelayMs * 2 ** (attempt - 1))
      if (closed) break
      d.attempts++
      try {
        const status = await post(entry.payload)
        d.lastStatus = status
        if (status >= 200 && status < 300) {
          d.status = 'delivered'
          d.lastError = null
          d.deliveredAt = new Date().toISOString()
          return
        }
        d.lastError = `webhook answered HTTP ${status}`
      }
      catch (e) {
        d.lastStatus = null
        d.lastError = e instanceof Error ? e.message : String(e)
      }
    }
    d.status = 'failed'
  }

  /** Deliveries for one session go one after another, in the order the events happened. */
  function enqueue(id: string, orderKey: string) {
    const prev = queues.get(orderKey) ?? Promise.resolve()
    const next = prev
      .then(() => new Promise<void>(r => setImmediate(r))) // after the API response has gone out
      .then(() => deliver(id))
      .catch(() => { /* deliver() records its own failures */ })
    queues.set(orderKey, next)
    void next.finally(() => { if (queues.get(orderKey) === next) queues.delete(orderKey) })
  }

  interface RequestInfo { id: string, idempotencyKey: string | null }

  function emit(type: Stripe.Event.Type, object: object, orderKey: string, request: RequestInfo | null, previous?: Json) {
    const event: Stripe.EventBase = {
      id: newId('evt_'),
      object: 'event',
      api_version: API_VERSION,
      created: nowS(),
      data: { object: structuredClone(object), ...(previous ? { previous_attributes: previous } : {}) },
      livemode: false,
      pending_webhooks: 1,
      request: { id: request?.id ?? null, idempotency_key: request?.idempotencyKey ?? null },
      type,
    }
    const rec: FakeEvent = { id: event.id, type, event, delivery: { status: 'pending', attempts: 0, lastStatus: null, lastError: null, deliveredAt: null } }
    events.push(rec)
    eventsById.set(event.id, { rec, payload: JSON.stringify(event, null, 2), orderKey })
    enqueue(event.id, orderKey)
  }

  // ——— sessions ———

  function expireSession(state: SessionState, request: RequestInfo | null) {
    const s = state.session
    s.status = 'expired'
    s.url = null
    openSessions.delete(s.id)
    emit('checkout.session.expired', s, s.id, request)
  }

  function sweep() {
    const t = nowS()
    for (const id of [...openSessions]) {
      const state = sessions.get(id)
      if (state && state.session.expires_at <= t) expireSession(state, null)
    }
  }

  function createSession(p: Params): SessionState {
    rejectUnknown(p, ['mode', 'line_items', 'success_url', 'cancel_url', 'customer_email', 'client_reference_id', 'metadata',
      'expires_at', 'payment_intent_data', 'locale', 'submit_type', 'payment_method_types', 'customer_creation', 'ui_mode', 'expand'])
    const mode = required(oneOf(p, 'mode', '', ['payment', 'setup', 'subscription']), 'mode')
    if (mode !== 'payment') throw invalid('The local Stripe fake supports only mode=payment.', 'mode')
    const uiMode = oneOf(p, 'ui_mode', '', ['hosted', 'embedded', 'custom'])
    if (uiMode && uiMode !== 'hosted') throw invalid('The local Stripe fake supports only ui_mode=hosted.', 'ui_mode')
    const created = nowS()
    const id = newId('cs_test_', 58)

    const rawLines = required(list(p, 'line_items', ''), 'line_items')
    if (rawLines.length === 0) throw invalid('Missing required param: line_items.', 'line_items')
    if (rawLines.length > MAX_LINE_ITEMS) throw invalid(`A Checkout Session can have at most ${MAX_LINE_ITEMS} line items.`, 'line_items')
    let currency: string | undefined
    const lines: WireLineItem[] = rawLines.map((raw, i) => {
      const prefix = `line_items[${i}]`
      if (!isObj(raw)) throw invalid('Invalid object', prefix)
      rejectUnknown(raw, ['price', 'price_data', 'quantity'], prefix)
      if (raw.price !== undefined) throw invalid('The local Stripe fake stores no prices: pass price_data instead.', at(prefix, 'price'), 'resource_missing')
      const pd = required(obj(raw, 'price_data', prefix), at(prefix, 'price_data'))
      const pdPrefix = at(prefix, 'price_data')
      rejectUnknown(pd, ['currency', 'unit_amount', 'product_data', 'tax_behavior'], pdPrefix)
      const cur = required(str(pd, 'currency', pdPrefix), at(pdPrefix, 'currency')).toLowerCase()
      try {
        if (!/^[a-z]{3}$/.test(cur)) throw new RangeError(cur)
        fractionDigits(cur)
      }
      catch { throw invalid(`Invalid currency: ${cur}`, at(pdPrefix, 'currency')) }
      if (currency && cur !== currency) throw invalid('All line items must use the same currency.', at(pdPrefix, 'currency'))
      currency = cur
      const unitAmount = required(int(pd, 'unit_amount', pdPrefix, 0, MAX_AMOUNT), at(pdPrefix, 'unit_amount'))
      const prod = required(obj(pd, 'product_data', pdPrefix), at(pdPrefix, 'product_data'))
      const prodPrefix = at(pdPrefix, 'product_data')
      rejectUnknown(prod, ['name', 'description', 'metadata'], prodPrefix)
      const name = required(str(prod, 'name', prodPrefix, 250), at(prodPrefix, 'name'))
      str(prod, 'description', prodPrefix)
      metadata(prod, 'metadata', prodPrefix)
      const taxBehavior = oneOf(pd, 'tax_behavior', pdPrefix, ['exclusive', 'inclusive', 'unspecified'])
      const quantity = required(int(raw, 'quantity', prefix, 1, 999_999), at(prefix, 'quantity'))
      const amount = unitAmount * quantity
      const price: WirePrice = {
        id: newId('price_'), object: 'price', active: false, billing_scheme: 'per_unit', created, currency: cur,
        custom_unit_amount: null, livemode: false, lookup_key: null, metadata: {}, nickname: null, product: newId('prod_', 14),
        recurring: null, tax_behavior: taxBehavior ?? 'unspecified', tiers_mode: null, transform_quantity: null, type: 'one_time',
        unit_amount: unitAmount, unit_amount_decimal: String(unitAmount),
      }
      return {
        id: newId('li_'), object: 'item', adjustable_quantity: null, amount_discount: 0, amount_subtotal: amount, amount_tax: 0,
        amount_total: amount, currency: cur, description: name, metadata: {}, price, quantity,
      }
    })
    const total = lines.reduce((sum, l) => sum + l.amount_total, 0)
    if (total > MAX_AMOUNT) throw invalid(`The Checkout Session's total amount due must be no more than ${MAX_AMOUNT}.`, 'line_items', 'amount_too_large')

    const successUrl = httpUrl(p, 'success_url') ?? null
    const cancelUrl = httpUrl(p, 'cancel_url') ?? null
    const customerEmail = str(p, 'customer_email', '', 800) ?? null
    if (customerEmail !== null && !/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(customerEmail)) throw invalid(`Invalid email address: ${customerEmail}`, 'customer_email', 'email_invalid')
    const clientReferenceId = str(p, 'client_reference_id', '', 200) ?? null
    const expiresAt = int(p, 'expires_at', '', 0) ?? created + SESSION_MAX_LIFETIME_S
    if (expiresAt < created + SESSION_MIN_LIFETIME_S) throw invalid(`The \`expires_at\` timestamp must be at least ${SESSION_MIN_LIFETIME_S} seconds in the future (the local fake relaxes Stripe's 30-minute minimum).`, 'expires_at')
    if (expiresAt > created + SESSION_MAX_LIFETIME_S) throw invalid('The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.', 'expires_at')
    const pid = obj(p, 'payment_intent_data', '') ?? Object.create(null) as Params
    rejectUnknown(pid, ['metadata', 'description', 'receipt_email'], 'payment_intent_data')
    const methodTypes = (list(p, 'payment_method_types', '') ?? ['card']).map((v, i) => {
      if (v !== 'card') throw invalid('The local Stripe fake supports only the card payment method.', `payment_method_types[${i}]`)
      return v
    })

    const session: Session = {
      id, object: 'checkout.session',
      adaptive_pricing: { enabled: false }, after_expiration: null, allow_promotion_codes: null, allowed_payment_method_types: null,
      amount_subtotal: total, amount_total: total,
      automatic_tax: { enabled: false, liability: null, provider: null, status: null },
      billing_address_collection: null, cancel_url: cancelUrl, client_reference_id: clientReferenceId, client_secret: null,
      collected_information: null, consent: null, consent_collection: null, created, currency: currency ?? null, currency_conversion: null,
      custom_fields: [], custom_text: { after_submit: null, shipping_address: null, submit: null, terms_of_service_acceptance: null },
      customer: null, customer_account: null, customer_creation: oneOf(p, 'customer_creation', '', ['always', 'if_required']) ?? 'if_required',
      customer_details: null,
      customer_email: customerEmail, discounts: [], expires_at: expiresAt, integration_identifier: null, invoice: null,
      invoice_creation: null, livemode: false, locale: (str(p, 'locale', '') ?? null) as Session['locale'], managed_payments: null,
      metadata: metadata(p, 'metadata', ''), mode: 'payment', origin_context: null, payment_intent: null, payment_link: null,
      payment_method_collection: 'always', payment_method_configuration_details: null, payment_method_options: {},
      payment_method_types: methodTypes as string[], payment_status: 'unpaid', permissions: null, recovered_from: null,
      saved_payment_method_options: null, setup_intent: null, shipping_address_collection: null, shipping_cost: null, shipping_options: [],
      status: 'open', submit_type: oneOf(p, 'submit_type', '', ['auto', 'book', 'donate', 'pay', 'subscribe']) ?? null,
      subscription: null, success_url: successUrl, total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
      ui_mode: 'hosted', url: `${opts.publicUrl ?? baseUrl}/pay/${id}`, wallet_options: null,
    }
    const state: SessionState = {
      session, lines,
      piMetadata: metadata(pid, 'metadata', 'payment_intent_data'),
      piDescription: str(pid, 'description', 'payment_intent_data', 1000) ?? null,
      piReceiptEmail: str(pid, 'receipt_email', 'payment_intent_data', 800) ?? null,
    }
    sessions.set(id, state)
    openSessions.add(id)
    return state
  }

  function lineItemsList(state: SessionState, limit = 10, startingAfter?: string) {
    const from = startingAfter ? state.lines.findIndex(l => l.id === startingAfter) + 1 : 0
    const data = state.lines.slice(from, from + limit)
    return { object: 'list', data, has_more: from + limit < state.lines.length, url: `/v1/checkout/sessions/${state.session.id}/line_items` }
  }

  // ——— payments ———

  function newIntent(state: SessionState): Stripe.PaymentIntent {
    const s = state.session
    const id = newId('pi_')
    const pi: Stripe.PaymentIntent = {
      id, object: 'payment_intent', allowed_payment_method_types: null, amount: s.amount_total ?? 0, amount_capturable: 0,
      amount_details: { tip: {} }, amount_received: 0, application: null, application_fee_amount: null, automatic_payment_methods: null,
      canceled_at: null, cancellation_reason: null, capture_method: 'automatic_async', client_secret: `${id}_secret_${newId('', 25)}`,
      confirmation_method: 'automatic', created: nowS(), currency: s.currency ?? 'usd', customer: null, customer_account: null,
      description: state.piDescription, excluded_payment_method_types: null, last_payment_error: null, latest_charge: null,
      livemode: false, managed_payments: null, metadata: { ...state.piMetadata }, next_action: null, on_behalf_of: null,
      payment_method: null, payment_method_configuration_details: null,
      payment_method_options: { card: { installments: null, mandate_options: null, network: null, request_three_d_secure: 'automatic' } },
      payment_method_types: ['card'], payment_record: null, processing: null, receipt_email: state.piReceiptEmail, review: null,
      setup_future_usage: null, shipping: null, source: null, statement_descriptor: null, statement_descriptor_suffix: null,
      status: 'requires_payment_method', transfer_data: null, transfer_group: null,
    }
    paymentIntents.set(id, pi)
    sessionOfIntent.set(id, s.id)
    s.payment_intent = id
    return pi
  }

  function newCharge(pi: Stripe.PaymentIntent, state: SessionState, card: { number: string, expMonth: number, expYear: number, name: string | null }, ok: boolean): Stripe.Charge {
    const id = newId('ch_')
    const pm = newId('pm_')
    const charge: Stripe.Charge = {
      id, object: 'charge', amount: pi.amount, amount_captured: ok ? pi.amount : 0, amount_refunded: 0, application: null,
      application_fee: null, application_fee_amount: null, balance_transaction: ok ? newId('txn_') : null,
      billing_details: { address: { city: null, country: null, line1: null, line2: null, postal_code: null, state: null }, email: state.session.customer_email, name: card.name, phone: null, tax_id: null },
      calculated_statement_descriptor: 'LARMOIR', captured: ok, created: nowS(), currency: pi.currency, customer: null,
      description: pi.description, disputed: false, failure_balance_transaction: null,
      failure_code: ok ? null : 'card_declined', failure_message: ok ? null : 'Your card was declined.',
      fraud_details: {}, livemode: false, metadata: { ...pi.metadata }, on_behalf_of: null,
      outcome: ok
        ? { advice_code: null, network_advice_code: null, network_decline_code: null, network_status: 'approved_by_network', reason: null, risk_level: 'normal', risk_score: 20, seller_message: 'Payment complete.', type: 'authorized' }
        : { advice_code: 'try_again_later', network_advice_code: null, network_decline_code: null, network_status: 'declined_by_network', reason: 'generic_decline', risk_level: 'normal', risk_score: 20, seller_message: 'The bank did not return any further details with this decline.', type: 'issuer_declined' },
      paid: ok, payment_intent: pi.id, payment_method: pm,
      payment_method_details: {
        type: 'card',
        card: {
          amount_authorized: ok ? pi.amount : null, authorization_code: null, brand: 'visa', checks: { address_line1_check: null, address_postal_code_check: null, cvc_check: 'pass' },
          country: 'US', exp_month: card.expMonth, exp_year: card.expYear, extended_authorization: { status: 'disabled' }, fingerprint: null,
          funding: 'credit', incremental_authorization: { status: 'unavailable' }, installments: null, last4: card.number.slice(-4), mandate: null,
          multicapture: { status: 'unavailable' }, network: 'visa', network_token: { used: false }, network_transaction_id: null,
          overcapture: { maximum_amount_capturable: pi.amount, status: 'unavailable' }, regulated_status: 'unregulated', three_d_secure: null, wallet: null,
          electronic_commerce_indicator: null, transaction_link_id: null,
        },
      },
      receipt_email: pi.receipt_email, receipt_number: null, receipt_url: null, refunded: false, review: null, shipping: null,
      source: null, source_transfer: null, statement_descriptor: null, statement_descriptor_suffix: null,
      status: ok ? 'succeeded' : 'failed', transfer_data: null, transfer_group: null,
    }
    charges.set(id, charge)
    pi.latest_charge = id
    pi.payment_method = pm
    return charge
  }

  function parseExpiry(raw: string): { month: number, year: number } | null {
    const m = /^\s*(\d{1,2})\s*\/\s*(\d{2}|\d{4})\s*$/.exec(raw)
    if (!m) return null
    const month = Number(m[1])
    const year = m[2]!.length === 2 ? 2000 + Number(m[2]) : Number(m[2])
    if (month < 1 || month > 12) return null
    const today = new Date(now())
    if (year < today.getUTCFullYear() || (year === today.getUTCFullYear() && month < today.getUTCMonth() + 1)) return null
    return { month, year }
  }

  /** The one payment path, shared by the hosted form and the JSON control endpoint. */
  function pay(state: SessionState, input: PaymentInput, requireDetails: boolean): PaymentOutcome {
    const s = state.session
    if (s.status !== 'open') return { kind: 'invalid', status: 409, message: `This checkout session is ${s.status}; it can no longer be paid.` }
    const number = input.card.replace(/[\s-]/g, '')
    if (number !== TEST_CARD_SUCCESS && number !== TEST_CARD_DECLINE) {
      return { kind: 'invalid', status: 400, message: 'This is a local test page: use a test card, 4242 4242 4242 4242 to pay or 4000 0000 0000 0002 to see a decline.' }
    }
    let exp = { month: 12, year: new Date(now()).getUTCFullYear() + 3 }
    if (requireDetails || input.expiry) {
      const parsed = parseExpiry(input.expiry ?? '')
      if (!parsed) return { kind: 'invalid', status: 400, message: 'Enter a future expiry date as MM/YY.' }
      exp = parsed
    }
    if ((requireDetails || input.cvc) && !/^\d{3,4}$/.test((input.cvc ?? '').trim())) return { kind: 'invalid', status: 400, message: 'Enter the 3-digit security code (CVC).' }

    const pi = (typeof s.payment_intent === 'string' && paymentIntents.get(s.payment_intent)) || newIntent(state)
    const name = input.name?.trim() || null
    if (number === TEST_CARD_DECLINE) {
      const charge = newCharge(pi, state, { number, expMonth: exp.month, expYear: exp.year, name }, false)
      pi.status = 'requires_payment_method'
      pi.last_payment_error = {
        type: 'card_error', code: 'card_declined', decline_code: 'generic_decline', message: 'Your card was declined.',
        charge: charge.id, doc_url: `${DOCS}#card-declined`, payment_method_type: 'card', advice_code: 'try_again_later',
      }
      emit('payment_intent.payment_failed', pi, s.id, null)
      return { kind: 'declined', message: 'Your card was declined. Nothing was charged; try the other test card.' }
    }

    newCharge(pi, state, { number, expMonth: exp.month, expYear: exp.year, name }, true)
    pi.status = 'succeeded'
    pi.amount_received = pi.amount
    pi.last_payment_error = null
    s.status = 'complete'
    s.payment_status = 'paid'
    s.url = null
    s.customer_details = {
      address: null, business_name: null, email: s.customer_email, individual_name: null, name, phone: null, tax_exempt: 'none', tax_ids: [],
    }
    openSessions.delete(s.id)
    emit('checkout.session.completed', s, s.id, null)
    const redirect = s.success_url ? s.success_url.replaceAll('{CHECKOUT_SESSION_ID}', s.id) : `${opts.publicUrl ?? baseUrl}/pay/${s.id}`
    return { kind: 'paid', redirect }
  }

  // ——— refunds ———

  function createRefund(p: Params, request: RequestInfo): Stripe.Refund {
    rejectUnknown(p, ['payment_intent', 'charge', 'amount', 'metadata', 'reason', 'expand'])
    const piId = str(p, 'payment_intent', '')
    const chId = str(p, 'charge', '')
    if (!piId && !chId) throw invalid('One of `charge` or `payment_intent` is required.', 'charge')
    let charge: Stripe.Charge | undefined
    if (piId) {
      const pi = paymentIntents.get(piId)
      if (!pi) throw invalid(`No such payment_intent: '${piId}'`, 'payment_intent', 'resource_missing')
      if (pi.status !== 'succeeded' || typeof pi.latest_charge !== 'string') throw invalid(`This PaymentIntent (${piId}) does not have a successful charge to refund.`, 'payment_intent')
      charge = charges.get(pi.latest_charge)
      if (chId && chId !== pi.latest_charge) throw invalid(`Charge ${chId} does not belong to PaymentIntent ${piId}.`, 'charge')
    }
    else if (chId) {
      charge = charges.get(chId)
      if (!charge) throw invalid(`No such charge: '${chId}'`, 'charge', 'resource_missing')
    }
    if (!charge || charge.status !== 'succeeded') throw invalid(`Charge ${charge?.id ?? chId} did not succeed and cannot be refunded.`, 'charge')
    const remaining = charge.amount - charge.amount_refunded
    if (remaining <= 0) throw invalid(`Charge ${charge.id} has already been refunded.`, 'charge', 'charge_already_refunded')
    const amount = int(p, 'amount', '', 1) ?? remaining
    if (amount > remaining) {
      throw invalid(`Refund amount (${formatAmount(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatAmount(remaining, charge.currency)})`, 'amount', 'amount_too_large')
    }
    const reason = oneOf(p, 'reason', '', ['duplicate', 'fraudulent', 'requested_by_customer']) ?? null
    const refund: Stripe.Refund = {
      id: newId('re_'), object: 'refund', amount, balance_transaction: newId('txn_'), charge: charge.id, created: nowS(),
      currency: charge.currency, customer: null, customer_account: null,
      destination_details: { card: { reference_status: 'pending', reference_type: 'acquirer_reference_number', type: 'refund' }, type: 'card' },
      metadata: metadata(p, 'metadata', ''), payment_intent: charge.payment_intent, payment_method: charge.payment_method, reason,
      receipt_number: null, source_transfer_reversal: null, status: 'succeeded', transfer_reversal: null,
    }
    refunds.set(refund.id, refund)
    const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded }
    charge.amount_refunded += amount
    charge.refunded = charge.amount_refunded === charge.amount
    const orderKey = (typeof charge.payment_intent === 'string' && sessionOfIntent.get(charge.payment_intent)) || charge.id
    emit('refund.created', refund, orderKey, request)
    emit('charge.refunded', charge, orderKey, request, previous)
    return refund
  }

  // ——— the /v1 API ———

  /** Replaces id strings by the objects they name, as `expand[]=payment_intent.latest_charge` does. */
  function expand(object: Json, paths: string[]): Json {
    const copy = structuredClone(object)
    for (const [i, path] of paths.entries()) {
      const parts = path.split('.')
      if (parts.length > 4) throw invalid('You cannot expand more than 4 levels of a property.', `expand[${i}]`)
      let node: Json = copy
      for (const [depth, part] of parts.entries()) {
        const value = node[part]
        if (part === 'line_items' && node.object === 'checkout.session' && depth === parts.length - 1) {
          const state = sessions.get(String(node.id))
          if (state) node.line_items = lineItemsList(state)
          break
        }
        if (value === null) break
        let target: Json | undefined
        if (typeof value === 'string' && ['payment_intent', 'latest_charge', 'charge'].includes(part)) target = lookup(value)
        else if (typeof value === 'object' && value !== null) target = value as Json
        if (!target) throw invalid(`This property cannot be expanded (${part}).`, `expand[${i}]`)
        node[part] = target === value ? target : structuredClone(target)
        node = node[part] as Json
      }
    }
    return copy
  }

  function expandParam(p: Params): string[] {
    return (list(p, 'expand', '') ?? []).map((v, i) => {
      if (typeof v !== 'string') throw invalid('Invalid string', `expand[${i}]`)
      return v
    })
  }

  function missing(kind: string, id: string, param: string) {
    return new ApiError(404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such ${kind}: '${id}'`, param })
  }

  function route(method: string, path: string, p: Params, request: RequestInfo): { status: number, body: unknown } {
    const ok = (body: unknown) => ({ status: 200, body })
    let m: RegExpExecArray | null
    if (method === 'POST' && path === '/v1/checkout/sessions') {
      const state = createSession(p)
      return ok(expand(state.session as unknown as Json, expandParam(p)))
    }
    if ((m = /^\/v1\/checkout\/sessions\/([^/]+)$/.exec(path)) && method === 'GET') {
      rejectUnknown(p, ['expand'])
      const state = sessions.get(m[1]!)
      if (!state) throw missing('checkout.session', m[1]!, 'session')
      return ok(expand(state.session as unknown as Json, expandParam(p)))
    }
    if ((m = /^\/v1\/checkout\/sessions\/([^/]+)\/line_items$/.exec(path)) && method === 'GET') {
      rejectUnknown(p, ['limit', 'starting_after', 'expand'])
      const state = sessions.get(m[1]!)
      if (!state) throw missing('checkout.session', m[1]!, 'session')
      return ok(lineItemsList(state, int(p, 'limit', '', 1, 100), str(p, 'starting_after', '')))
    }
    if ((m = /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/.exec(path)) && method === 'POST') {
      rejectUnknown(p, ['expand'])
      const state = sessions.get(m[1]!)
      if (!state) throw missing('checkout.session', m[1]!, 'session')
      if (state.session.status !== 'open') {
        throw invalid(`Only Checkout Sessions with a status of "open" can be expired; this one is "${state.session.status}".`, 'session')
      }
      expireSession(state, request)
      return ok(expand(state.session as unknown as Json, expandParam(p)))
    }
    if ((m = /^\/v1\/payment_intents\/([^/]+)$/.exec(path)) && method === 'GET') {
      rejectUnknown(p, ['expand', 'client_secret'])
      const pi = paymentIntents.get(m[1]!)
      if (!pi) throw missing('payment_intent', m[1]!, 'intent')
      return ok(expand(pi as unknown as Json, expandParam(p)))
    }
    if ((m = /^\/v1\/charges\/([^/]+)$/.exec(path)) && method === 'GET') {
      rejectUnknown(p, ['expand'])
      const ch = charges.get(m[1]!)
      if (!ch) throw missing('charge', m[1]!, 'charge')
      return ok(expand(ch as unknown as Json, expandParam(p)))
    }
    if (method === 'POST' && path === '/v1/refunds') {
      const refund = createRefund(p, request)
      return ok(expand(refund as unknown as Json, expandParam(p)))
    }
    if ((m = /^\/v1\/refunds\/([^/]+)$/.exec(path)) && method === 'GET') {
      rejectUnknown(p, ['expand'])
      const re = refunds.get(m[1]!)
      if (!re) throw missing('refund', m[1]!, 'refund')
      return ok(expand(re as unknown as Json, expandParam(p)))
    }
    if ((m = /^\/v1\/events\/([^/]+)$/.exec(path)) && method === 'GET') {
      rejectUnknown(p, ['expand'])
      const ev = eventsById.get(m[1]!)
      if (!ev) throw missing('event', m[1]!, 'id')
      return ok(ev.rec.event)
    }
    throw new ApiError(404, { type: 'invalid_request_error', message: `Unrecognized request URL (${method}: ${path}). The local Stripe fake answers only the calls Larmoir makes.` })
  }

  function apiKeyOf(req: IncomingMessage): string | null {
    const h = req.headers.authorization ?? ''
    const bearer = /^Bearer\s+(\S+)$/i.exec(h)
    if (bearer) return bearer[1]!
    const basic = /^Basic\s+(\S+)$/i.exec(h)
    if (basic) return Buffer.from(basic[1]!, 'base64').toString('utf8').split(':')[0] ?? null
    return null
  }

  async function handleApi(req: IncomingMessage, res: ServerResponse, url: URL) {
    const requestId = newId('req_', 14)
    const method = req.method ?? 'GET'
    const idempotencyKey = typeof req.headers['idempotency-key'] === 'string' ? req.headers['idempotency-key'] : null
    const send = (status: number, body: string, extra: Record<string, string> = {}) => {
      if (res.headersSent || res.destroyed) return
      res.writeHead(status, {
        'content-type': 'application/json',
        'request-id': requestId,
        'stripe-version': String(req.headers['stripe-version'] ?? API_VERSION),
        ...(idempotencyKey && method === 'POST' ? { 'idempotency-key': idempotencyKey } : {}),
        ...extra,
      }).end(body)
    }
    const sendError = (e: ApiError) => send(e.status, JSON.stringify({ error: e.body }))

    const raw = await readBody(req)
    if (raw === null) return sendError(new ApiError(413, { type: 'invalid_request_error', message: 'Request body too large.' }))

    if (fault === 'error') return sendError(new ApiError(500, { type: 'api_error', message: 'Simulated outage of the local Stripe fake (fault mode "error").' }))
    if (fault === 'timeout') {
      // Hold the socket, as a hung upstream would, until the client gives up or the bound is reached.
      const held = { res, timer: setTimeout(() => {
        heldResponses.delete(held)
        sendError(new ApiError(500, { type: 'api_error', message: 'Simulated timeout of the local Stripe fake (fault mode "timeout").' }))
      }, FAULT_HOLD_MS) }
      heldResponses.add(held)
      res.on('close', () => { clearTimeout(held.timer); heldResponses.delete(held) })
      return
    }

    const key = apiKeyOf(req)
    if (!key) {
      return sendError(new ApiError(401, { type: 'invalid_request_error', message: 'You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. \'Authorization: Bearer YOUR_SECRET_KEY\').' }))
    }
    if (!/^sk_test_\w+$/.test(key)) {
      return sendError(new ApiError(401, { type: 'invalid_request_error', message: `Invalid API Key provided: ${key.slice(0, 8)}${'*'.repeat(Math.max(0, key.length - 12))}${key.slice(-4)}. The local Stripe fake takes test-mode secret keys (sk_test_…) only.` }))
    }

    let params: Params
    try { params = parseForm(method === 'GET' || method === 'DELETE' ? url.search.slice(1) : raw) }
    catch (e) { return sendError(e instanceof ApiError ? e : invalid('Invalid request body.')) }

    // Stripe compares the parameters, not the bytes; a sorted pair list is a stable fingerprint of them.
    const idemKey = idempotencyKey && method === 'POST' ? `${key}\u0000${idempotencyKey}` : null
    const fingerprint = `${method} ${url.pathname} ${JSON.stringify([...new URLSearchParams(raw)].sort())}`
    if (idemKey) {
      const stored = idempotency.get(idemKey)
      if (stored && stored.fingerprint !== fingerprint) {
        return sendError(new ApiError(400, { type: 'idempotency_error', message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idempotencyKey}' if you meant to execute a different request.` }))
      }
      if (stored) return send(stored.status, stored.body, { 'idempotent-replayed': 'true' })
    }

    let result: { status: number, body: unknown }
    try { result = route(method, url.pathname, params, { id: requestId, idempotencyKey }) }
    catch (e) {
      if (e instanceof ApiError) return sendError(e)
      throw e
    }
    const body = JSON.stringify(result.body, null, 2)
    // Only requests that ran are remembered; a rejected one may be retried with the same key (as Stripe does).
    if (idemKey && result.status < 300) {
      if (idempotency.size >= MAX_IDEMPOTENCY_KEYS) idempotency.delete(idempotency.keys().next().value!)
      idempotency.set(idemKey, { fingerprint, status: result.status, body })
    }
    send(result.status, body)
  }

  // ——— the hosted page ———

  function pageLines(state: SessionState): PageLine[] {
    return state.lines.map(l => ({ name: l.description ?? '', quantity: l.quantity ?? 1, unitAmount: l.price.unit_amount ?? 0, amount: l.amount_total }))
  }

  function statusPage(state: SessionState): string {
    const s = state.session
    if (s.status === 'complete') {
      const next = s.success_url?.replaceAll('{CHECKOUT_SESSION_ID}', s.id)
      return renderStatusPage({ title: 'Payment received', message: `This payment of ${formatAmount(s.amount_total ?? 0, s.currency ?? 'usd')} is complete.`, ...(next ? { link: { href: next, label: 'Continue' } } : {}) })
    }
    return renderStatusPage({ title: 'This payment page has expired', message: 'The time to pay ran out, so nothing was charged. Start again from the booking page.', ...(s.cancel_url ? { link: { href: s.cancel_url, label: 'Go back' } } : {}) })
  }

  async function handlePage(req: IncomingMessage, res: ServerResponse, id: string) {
    const html = (status: number, body: string) => res.writeHead(status, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' }).end(body)
    const state = sessions.get(id)
    if (!state) return html(404, renderStatusPage({ title: 'No such payment page', message: 'This link does not match any checkout session of this local test server.' }))
    const s = state.session
    const view = { sessionId: s.id, lines: pageLines(state), total: s.amount_total ?? 0, currency: s.currency ?? 'usd', customerEmail: s.customer_email, cancelUrl: s.cancel_url }
    if (req.method === 'GET') return html(200, s.status === 'open' ? renderPayPage(view) : statusPage(state))
    if (req.method !== 'POST') return html(405, renderStatusPage({ title: 'Method not allowed', message: 'Use the form on this page.' }))
    const raw = await readBody(req)
    if (raw === null) return html(413, renderStatusPage({ title: 'Too large', message: 'The form sent too much data.' }))
    if (s.status !== 'open') return html(409, statusPage(state))
    const form = new URLSearchParams(raw)
    const input: PaymentInput = { card: form.get('card') ?? '', expiry: form.get('expiry') ?? '', cvc: form.get('cvc') ?? '', name: form.get('name') ?? '' }
    const outcome = pay(state, input, true)
    if (outcome.kind === 'paid') return res.writeHead(303, { location: outcome.redirect }).end()
    const values = { name: input.name, card: input.card, expiry: input.expiry }
    html(outcome.kind === 'declined' ? 402 : outcome.status, renderPayPage({ ...view, error: outcome.message, values }))
  }

  // ——— test and debug controls ———

  async function handleControl(req: IncomingMessage, res: ServerResponse, url: URL) {
    const json = (status: number, body: unknown) => res.writeHead(status, { 'content-type': 'application/json' }).end(JSON.stringify(body, null, 2))
    const readJson = async (): Promise<Json | null> => {
      const raw = await readBody(req)
      if (raw === null) return null
      try {
        const v: unknown = JSON.parse(raw || '{}')
        return typeof v === 'object' && v !== null && !Array.isArray(v) ? v as Json : null
      }
      catch { return null }
    }
    let m: RegExpExecArray | null
    if (req.method === 'GET' && url.pathname === '/__fake/events') return json(200, events)
    if (req.method === 'POST' && (m = /^\/__fake\/events\/([^/]+)\/redeliver$/.exec(url.pathname))) {
      const entry = eventsById.get(m[1]!)
      if (!entry) return json(404, { error: `no event ${m[1]}` })
      entry.rec.delivery.status = 'pending'
      enqueue(entry.rec.id, entry.orderKey)
      return json(202, { id: entry.rec.id })
    }
    if (req.method === 'POST' && url.pathname === '/__fake/fault') {
      const body = await readJson()
      const mode = body?.mode
      if (mode !== null && mode !== 'error' && mode !== 'timeout') return json(400, { error: 'mode must be null, "error" or "timeout"' })
      fault = mode
      return json(200, { mode })
    }
    if (req.method === 'POST' && (m = /^\/__fake\/sessions\/([^/]+)\/pay$/.exec(url.pathname))) {
      const state = sessions.get(m[1]!)
      if (!state) return json(404, { error: `no checkout session ${m[1]}` })
      const body = await readJson()
      if (!body || typeof body.card !== 'string') return json(400, { error: 'send JSON { "card": "4242424242424242" }' })
      const text = (k: string) => (typeof body[k] === 'string' ? body[k] : undefined)
      const outcome = pay(state, { card: body.card, expiry: text('expiry'), cvc: text('cvc'), name: text('name') }, false)
      if (outcome.kind === 'paid') return json(200, { redirect: outcome.redirect })
      if (outcome.kind === 'declined') return json(402, { error: { type: 'card_error', code: 'card_declined', decline_code: 'generic_decline', message: outcome.message } })
      return json(outcome.status, { error: { message: outcome.message } })
    }
    json(404, { error: 'unknown control endpoint' })
  }

  function readBody(req: IncomingMessage): Promise<string | null> {
    return new Promise((ok, fail) => {
      const chunks: Buffer[] = []
      let size = 0
      let tooLarge = false
      req.on('data', (c: Buffer) => {
        size += c.length
        if (size > MAX_BODY_BYTES) tooLarge = true
        else chunks.push(c)
      })
      req.on('end', () => ok(tooLarge ? null : Buffer.concat(chunks).toString('utf8')))
      req.on('error', fail)
    })
  }

  const server: Server = createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://127.0.0.1')
    sweep()
    let handled: Promise<unknown>
    let m: RegExpExecArray | null
    if (url.pathname === '/v1' || url.pathname.startsWith('/v1/')) handled = handleApi(req, res, url)
    else if ((m = /^\/pay\/([\w-]+)$/.exec(url.pathname))) handled = handlePage(req, res, m[1]!)
    else if (url.pathname.startsWith('/__fake/')) handled = handleControl(req, res, url)
    else handled = Promise.resolve(res.writeHead(404, { 'content-type': 'text/plain' }).end('Local Stripe fake: nothing here.'))
    handled.catch((e: unknown) => {
      if (res.headersSent) return void res.destroy()
      res.writeHead(500, { 'content-type': 'application/json' })
        .end(JSON.stringify({ error: { type: 'api_error', message: `Local Stripe fake failed: ${e instanceof Error ? e.message : String(e)}` } }))
    })
  })

  await new Promise<void>((ok, fail) => { server.once('error', fail); server.listen(opts.port, '127.0.0.1', () => ok()) })
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  const sweeper = setInterval(sweep, SWEEP_MS)
  sweeper.unref()

  return {
    url: baseUrl,
    events,
    setFault: (mode) => { fault = mode },
    drain: async () => {
      // Each round waits for the queues as they stand; deliveries cannot enqueue more, so this ends.
      for (let round = 0; round < 100 && queues.size > 0; round++) await Promise.all([...queues.values()])
    },
    close: async () => {
      closed = true
      clearInterval(sweeper)
      for (const h of heldResponses) { clearTimeout(h.timer); h.res.destroy() }
      heldResponses.clear()
      for (const s of sleepers) { clearTimeout(s.timer); s.wake() }
      sleepers.clear()
      for (const r of inflight) r.destroy()
      await new Promise<void>((ok) => {
        server.close(() => ok())
        server.closeAllConnections()
      })
    },
  }
}
