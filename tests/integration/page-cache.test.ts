import { createHash } from 'node:crypto'
import { request } from 'node:http'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { Client } from '../support/http'
import { signedIn } from '../support/people'
import { flightWithContent, type ContentFlight } from '../support/content'
import { bookingBody, newGuest, newSession, waitFor } from '../support/booking'

/**
 * Public pages served whole from the page cache (server/utils/pageCache.ts, server/plugins/pageCache.ts):
 * what is kept, for whom, how a write ends it, and that the content security policy holds on a
 * page served from it.
 */
let flight: ContentFlight
let pourPath: string

/** One anonymous visit: a fresh client with no cookies, as a new visitor arrives. */
async function visit(path: string, client = new Client()) {
  const res = await client.send('GET', path)
  return { status: res.status, headers: res.headers, body: await res.text() }
}

/** Visits until the page is served from the cache (the first visit after a write renders it). */
async function cachedVisit(path: string) {
  return waitFor(async () => {
    const v = await visit(path)
    return v.headers.get('x-page-cache') === 'hit' ? v : null
  }, `${path} served from the page cache`)
}

/** Headers allowed to differ between two visitors served the same cached page. */
const PER_RESPONSE = new Set(['date', 'age', 'keep-alive', 'connection'])
const headersOf = (h: Headers) => Object.fromEntries([...h].filter(([k]) => !PER_RESPONSE.has(k)))

beforeAll(async () => {
  flight = await flightWithContent('page-cache')
  pourPath = `/pour/${flight.flightId}/1`
})

describe('the page cache', () => {
  it.each(['/', '/flights', 'flight', '/glass', 'pour'])('serves %s to two anonymous visitors byte for byte, headers alike but for Date and Age', async (which) => {
    const path = which === 'flight' ? `/flights/${flight.flightId}` : which === 'pour' ? pourPath : which
    const first = await cachedVisit(path)
    const second = await visit(path, new Client())
    expect(second.status).toBe(200)
    expect(second.headers.get('x-page-cache')).toBe('hit')
    expect(second.body).toBe(first.body)
    expect(headersOf(second.headers)).toEqual(headersOf(first.headers))
    // RFC 9111 §5.2.2.4: any cache must ask again before reuse; the ETag makes that a 304.
    expect(first.headers.get('cache-control')).toBe('no-cache')
    expect(first.headers.get('vary')).toBe('Cookie, Accept-Encoding')
    const again = await new Client().send('GET', path, undefined, { 'if-none-match': first.headers.get('etag')! })
    expect(again.status).toBe(304)
  })

  it('never keeps or serves a page to someone signed in, and a guest\'s name never reaches a later anonymous visitor', async () => {
    const guest = await signedIn('guest')
    const name = (await guest.get('/api/account')).body.name as string
    expect(name.length).toBeGreaterThan(3)
    const own = await visit(pourPath, guest)
    expect(own.status).toBe(200)
    expect(own.body).toContain(name) // the header shows who is signed in, so a kept copy would show it to the next visitor
    expect(own.headers.get('x-page-cache')).toBeNull()
    expect(own.headers.get('cache-control')).toBe('private, no-store') // RFC 9111 §5.2.2.5, §5.2.2.7: no shared cache keeps it
    for (let i = 0; i < 3; i++) {
      const anonymous = await visit(pourPath)
      expect(anonymous.status).toBe(200)
      expect(anonymous.body).not.toContain(name)
      expect(anonymous.headers.get('x-page-cache')).toMatch(/^(hit|miss)$/)
    }
  })

  it('serves a guest who has opened a pour page (and so carries only the observation form\'s device cookie) from the cache', async () => {
    // The challenge route is what gives a browser its device cookie.
    const guest = new Client()
    const challenge = await guest.get('/api/observations/challenge')
    expect(challenge.status).toBe(200)
    const set = challenge.headers.get('set-cookie') ?? ''
    expect(set).toMatch(/^larmoir_device=/)
    const cookie = set.split(';')[0]!
    await waitFor(async () => (await guest.send('GET', '/flights', undefined, { cookie })).headers.get('x-page-cache') === 'hit', '/flights from the cache with the device cookie')
    const again = await guest.send('GET', '/flights', undefined, { cookie })
    expect(again.headers.get('x-page-cache')).toBe('hit')
    expect(again.headers.get('set-cookie')).toBeNull()
  })

  it('renders live a request that carries any cookie or a query string, and pages that are not public', async () => {
    const withCookie = await new Client().send('GET', '/flights', undefined, { cookie: 'something=else' })
    expect(withCookie.headers.get('x-page-cache')).toBeNull()
    const deviceAndMore = await new Client().send('GET', '/flights', undefined, { cookie: 'larmoir_device=abcdefabcdefabcdefabcdefabcdefab; something=else' })
    expect(deviceAndMore.headers.get('x-page-cache')).toBeNull()
    expect(withCookie.headers.get('cache-control')).toBe('private, no-store')
    expect((await visit('/flights?from=newsletter')).headers.get('x-page-cache')).toBeNull()
    for (const path of ['/signin', '/signup']) {
      const res = await visit(path)
      expect(res.status, path).toBe(200)
      expect(res.headers.get('x-page-cache'), path).toBeNull()
      expect(res.headers.get('cache-control'), path).toBe('private, no-store')
    }
  })

  it('a published note, a venue setting and a product\'s change show on the next visit', async () => {
    const marketing = await signedIn('marketing')
    const manager = await signedIn('manager')
    const productId = flight.productIds[0]!
    await cachedVisit(pourPath)

    const note = `Windfall pear and a cellar-cool finish, note ${Date.now().toString(36)}.`
    expect((await marketing.request('PUT', `/api/content/product_note/${productId}`, { body: note })).status).toBe(200)
    const draft = await visit(pourPath)
    expect(draft.body).not.toContain(note) // a draft is not public: the page may stay as it was
    expect((await marketing.post(`/api/content/product_note/${productId}/publish`)).status).toBe(200)
    const published = await visit(pourPath)
    expect(published.headers.get('x-page-cache')).toBe('miss')
    expect(published.body).toContain(note)

    const { id: _id, ...settings } = (await manager.get('/api/venue')).body
    await cachedVisit('/')
    const address = `${settings.address} (door ${Date.now().toString(36)})`
    try {
      expect((await manager.patch('/api/venue', { ...settings, address })).status).toBe(200)
      expect((await visit('/')).body).toContain(address)
    }
    finally {
      expect((await manager.patch('/api/venue', settings)).status).toBe(200)
    }
    expect((await visit('/')).body).not.toContain(address)

    const product = (await manager.get(`/api/products/${productId}`)).body
    await cachedVisit(pourPath)
    const renamed = `${product.name} Reserve`
    expect((await manager.patch(`/api/products/${productId}`, { name: renamed })).status).toBe(200)
    try {
      expect((await visit(pourPath)).body).toContain(renamed)
    }
    finally {
      await manager.patch(`/api/products/${productId}`, { name: product.name })
    }
  })

  it('a booking shows on the flight page within a few seconds, while the booking path itself reads seats live', async () => {
    const manager = await signedIn('manager')
    const session = await newSession(manager, { flightId: flight.flightId, seats: 6 })
    const path = `/flights/${flight.flightId}`
    const before = await cachedVisit(path)
    const guest = await newGuest('page-cache')
    const held = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    expect(held.status).toBe(201)
    // The booking route and the session's availability do not wait for the page cache.
    expect((await new Client().get(`/api/sessions/${session.id}/availability`)).body.session.seatsLeft).toBe(4)
    const changed = await waitFor(async () => {
      const v = await visit(path)
      return v.headers.get('etag') !== before.headers.get('etag') ? v : null
    }, 'the flight page re-rendered after the booking', 10_000) // the page cache's lag is 5 s (SEATS_LAG_MS)
    expect(changed.status).toBe(200)
  })
})

describe('the content security policy on a page from the cache', () => {
  it('allows exactly the inline scripts the page carries, by their SHA-256, and nothing inline else', async () => {
    for (const path of ['/', `/flights/${flight.flightId}`, pourPath]) {
      const page = await cachedVisit(path)
      const csp = page.headers.get('content-security-policy')!
      const scriptSrc = /(?:^|;\s*)script-src ([^;]*)/.exec(csp)?.[1] ?? ''
      expect(scriptSrc, path).not.toMatch(/'unsafe-inline'|'unsafe-eval'|'nonce-/) // CSP Level 3: hash-source only
      const allowed = new Set(scriptSrc.match(/'sha256-[^']+'/g) ?? [])
      // Inline scripts the browser would run: no src, and a JavaScript, module or import-map type.
      const inline = [...page.body.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/gi)]
        .filter(([, attrs]) => !/\ssrc=/.test(` ${attrs}`))
        .filter(([, attrs]) => /^(?:|text\/javascript|module|importmap)$/.test(/\stype="([^"]*)"/.exec(` ${attrs}`)?.[1] ?? ''))
      expect(inline.length, path).toBeGreaterThan(0) // Nuxt's runtime config
      const hashes = inline.map(([, , text]) => `'sha256-${createHash('sha256').update(text!, 'utf8').digest('base64')}'`)
      for (const h of hashes) expect(allowed.has(h), `${path}: ${h} in script-src`).toBe(true)
      expect(allowed.size, path).toBe(new Set(hashes).size) // no hash for a script the page does not carry
      expect(page.body, path).not.toMatch(/\snonce="/)
      expect(page.body, path).not.toMatch(/\son[a-z]+="/) // no inline event handlers
    }
  })

  it('sends pages and the built files compressed to a browser that accepts it, the same bytes once decoded', async () => {
    /** One GET on a bare socket: headers and bytes exactly as sent (fetch would decode them). */
    const raw = (path: string, encoding?: string) => new Promise<{ status: number, headers: Record<string, string | string[] | undefined>, body: Buffer }>((done, fail) => {
      const req = request(`${inject('appUrl')}${path}`, { headers: { 'x-forwarded-for': '10.9.8.7', ...(encoding ? { 'accept-encoding': encoding } : {}) } }, (res) => {
        const chunks: Buffer[] = []
        res.on('data', (c: Buffer) => chunks.push(c))
        res.on('end', () => done({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }))
      })
      req.on('error', fail)
      req.end()
    })
    const plain = await raw('/')
    expect(plain.headers['content-encoding']).toBeUndefined()
    const html = plain.body.toString('utf8')
    const assets = [...html.matchAll(/(?:src|href)="(\/_nuxt\/[^"]+\.(?:js|css))"/g)].map(m => m[1]!)
    expect(assets.some(a => a.endsWith('.js')) && assets.some(a => a.endsWith('.css'))).toBe(true)
    for (const asset of new Set(assets)) {
      const identity = await raw(asset)
      expect(identity.status, asset).toBe(200)
      if (identity.body.length < 1024) continue // too small to be worth encoding (Nitro skips them)
      const br = await raw(asset, 'br, gzip')
      const gz = await raw(asset, 'gzip')
      expect(br.headers['content-encoding'], asset).toBe('br')
      expect(gz.headers['content-encoding'], asset).toBe('gzip')
      expect(br.body.length, asset).toBeLessThan(identity.body.length / 2)
      expect(brotliDecompressSync(br.body).equals(identity.body), asset).toBe(true)
      expect(gunzipSync(gz.body).equals(identity.body), asset).toBe(true)
    }

    // The first visit after a write renders the page; it comes gzipped like every later one.
    const marketing = await signedIn('marketing')
    const productId = flight.productIds[0]!
    expect((await marketing.request('PUT', `/api/content/product_note/${productId}`, { body: `Quince and oyster shell, ${Date.now().toString(36)}.` })).status).toBe(200)
    expect((await marketing.post(`/api/content/product_note/${productId}/publish`)).status).toBe(200)
    const first = await raw(pourPath, 'gzip')
    expect(first.headers['x-page-cache']).toBe('miss')
    expect(first.headers['content-encoding']).toBe('gzip')
    const again = await raw(pourPath)
    expect(again.headers['x-page-cache']).toBe('hit')
    expect(gunzipSync(first.body).equals(again.body)).toBe(true)
  })
})
