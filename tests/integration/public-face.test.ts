import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { DateTime } from 'luxon'
import sharp from 'sharp'
import type { BrowserContext } from 'playwright-core'
import { allProducts, Client } from '../support/http'
import { signedIn } from '../support/people'
import { withDb } from '../support/db'
import { openBrowser } from '../support/browser'
import { bookAndPay, newGuest, newSession } from '../support/booking'
import { DEMO_PRODUCTS, DEMO_VENUE } from '../../server/demo/data'
import { holidayOn } from '../../server/demo/holidays'
import { EVENT_LD_LIMIT } from '../../shared/seo'

/**
 * The venue's public face as machines read it: the sitemap and robots.txt, schema.org JSON-LD on
 * the home and flight pages, the link-preview tags with an image that loads; and the demo's story
 * (a note and a photo for every product, no weekly session on a public holiday).
 */
const appUrl = () => inject('appUrl')
let browser: { context: BrowserContext, close: () => Promise<void> }
beforeAll(async () => { browser = await openBrowser() })
afterAll(async () => browser.close())

/** Parses XML in Chromium's own parser; a document that is not well formed comes back as a parsererror. */
async function parseXml(xml: string): Promise<{ error: string | null, locs: string[], lastmods: string[], root: string, ns: string | null }> {
  const page = await browser.context.newPage()
  try {
    return await page.evaluate((text) => {
      const doc = new DOMParser().parseFromString(text, 'application/xml')
      const error = doc.getElementsByTagName('parsererror')[0]?.textContent ?? null
      const all = (tag: string) => [...doc.getElementsByTagName(tag)].map(e => e.textContent ?? '')
      return { error, locs: all('loc'), lastmods: all('lastmod'), root: doc.documentElement.localName, ns: doc.documentElement.namespaceURI }
    }, xml)
  }
  finally { await page.close() }
}

async function html(path: string): Promise<string> {
  const res = await new Client().raw(path)
  expect(res.status, path).toBe(200)
  return res.text()
}

/** Every `<script type="application/ld+json">` block of a page, parsed. */
function jsonLd(page: string): Record<string, any>[] {
  const blocks = [...page.matchAll(/<script\b[^>]*type="application\/ld\+json"[^>]*>([\s\S]*?)<\/script>/g)].map(m => JSON.parse(m[1]!))
  return blocks.flatMap(b => (Array.isArray(b) ? b : [b]))
}

/** The content of `<meta property|name="key">`. */
function meta(page: string, key: string): string | undefined {
  const tag = [...page.matchAll(/<meta\b[^>]*>/g)].map(m => m[0]).find(t => t.includes(`property="${key}"`) || t.includes(`name="${key}"`))
  return tag?.match(/content="([^"]*)"/)?.[1]?.replace(/&amp;/g, '&')
}

/** A published flight of two demo pours, of its own, so its page lists only the sessions made here. */
async function ownFlight(manager: Client, name: string, publish = true): Promise<number> {
  const products = (await allProducts(manager)) as { id: number, code: string }[]
  const glass = ((await manager.get('/api/glasses')).body as { id: number }[])[0]!.id
  const pour = (code: string) => ({ productId: products.find(p => p.code === code)!.id, volumeMl: 60, glassId: glass, servingTempC: 12 })
  const res = await manager.post('/api/flights', { name, summary: `${name}: two pours`, pours: [pour('SV-ALB-24'), pour('SV-CF-23')] })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  if (publish) expect((await manager.post(`/api/flights/${res.body.id}/publish`)).status).toBe(200)
  return res.body.id
}

describe('the sitemap and robots.txt', () => {
  it('lists home, the flights, every published flight, the glass page and the articles, and no draft or retired flight', async () => {
    const manager = await signedIn('manager')
    const draft = await ownFlight(manager, `Sitemap draft ${Date.now()}`, false)
    const retired = await ownFlight(manager, `Sitemap retired ${Date.now()}`)
    expect((await manager.post(`/api/flights/${retired}/retire`)).status).toBe(200)

    const res = await new Client().raw('/sitemap.xml')
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^application\/xml/)
    const xml = await parseXml(await res.text())
    expect(xml.error).toBeNull()
    expect(xml.root).toBe('urlset')
    expect(xml.ns).toBe('http://www.sitemaps.org/schemas/sitemap/0.9') // the sitemaps.org protocol's namespace

    const published = (await new Client().get('/api/flights/published')).body as { id: number }[]
    expect(published.length).toBeGreaterThan(0)
    // The articles guests can read now (another test may have unpublished one of the shipped two).
    const articles = ((await new Client().get('/api/articles')).body as { slug: string }[]).map(a => `/articles/${a.slug}`)
    expect(articles.length).toBeGreaterThan(0)
    const expected = ['/', '/flights', '/glass', '/articles', ...articles, ...published.map(f => `/flights/${f.id}`)]
    for (const path of expected) expect(xml.locs, path).toContain(new URL(path, appUrl()).toString())
    const readable = new Set(expected.map(p => new URL(p, appUrl()).toString()))
    expect(xml.locs.filter(l => !readable.has(l)), 'nothing but those pages').toEqual([])
    const drafts = ((await manager.get('/api/flights')).body as { id: number, status: string }[]).filter(f => f.status !== 'published').map(f => f.id)
    expect(drafts).toContain(draft)
    expect(drafts).toContain(retired)
    for (const id of drafts) expect(xml.locs).not.toContain(new URL(`/flights/${id}`, appUrl()).toString())
    expect(xml.locs.filter(l => /\/(manage|host|cards|book|bookings|account)(\/|$)/.test(new URL(l).pathname))).toEqual([])
    // One lastmod per page, a W3C datetime in UTC (sitemaps.org).
    expect(xml.lastmods).toHaveLength(xml.locs.length)
    for (const m of xml.lastmods) expect(m).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/)
  })

  it('robots.txt names the sitemap by its full address and keeps crawlers off staff and guest pages', async () => {
    const res = await new Client().raw('/robots.txt')
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^text\/plain/)
    const text = await res.text()
    expect(text).toMatch(/^User-agent: \*$/m)
    expect(text).toContain(`Sitemap: ${new URL('/sitemap.xml', appUrl())}`)
    for (const path of ['/manage', '/host', '/bookings', '/account']) expect(text).toMatch(new RegExp(`^Disallow: ${path}`, 'm'))
    expect(text).not.toMatch(/^Disallow: \/\s*$/m)
  })
})

describe('schema.org JSON-LD', () => {
  it('the flight page has an Event for each session on sale, with its price, offset times and seats', async () => {
    const manager = await signedIn('manager')
    const flightId = await ownFlight(manager, `Event flight ${Date.now()}`)
    const open = await newSession(manager, { flightId, seats: 8, priceMinor: 4250 })
    const full = await newSession(manager, { flightId, seats: 2, priceMinor: 3900 })
    await bookAndPay(await newGuest('ld-full'), full.id, 2)

    const page = await html(`/flights/${flightId}`)
    const sessions = (await new Client().get(`/api/flights/${flightId}/sessions`)).body as { id: number, startsAt: string, endsAt: string, priceMinor: number, seatsLeft: number }[]
    expect(sessions.map(s => s.id).sort()).toEqual([open.id, full.id].sort())
    const events = jsonLd(page).filter(d => d['@type'] === 'Event')
    expect(events).toHaveLength(sessions.length)
    for (const s of sessions) {
      const e = events.find(x => x.offers?.url === new URL(`/book/${s.id}`, appUrl()).toString())
      expect(e, `an Event for session ${s.id}`).toBeDefined()
      expect(e!['@context']).toBe('https://schema.org')
      // schema.org Offer.price: the amount in major units, "." as the decimal mark (schema.org/price).
      expect(e!.offers.price).toBe((s.priceMinor / 100).toFixed(2)) // US dollars have 2 minor digits (ISO 4217)
      expect(e!.offers.priceCurrency).toBe('USD')
      expect(e!.offers.availability).toBe(s.seatsLeft > 0 ? 'https://schema.org/InStock' : 'https://schema.org/SoldOut') // schema.org ItemAvailability
      for (const [field, instant] of [['startDate', s.startsAt], ['endDate', s.endsAt]] as const) {
        expect(e![field]).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}[+-]\d{2}:\d{2}$/) // ISO 8601 with the offset
        expect(new Date(e![field]).getTime()).toBe(new Date(instant).getTime())
        // The offset is New York's at that instant (EST -05:00 or EDT -04:00).
        expect(e![field].slice(-6)).toBe(DateTime.fromISO(instant, { zone: DEMO_VENUE.timeZone }).toFormat('ZZ'))
      }
      expect(e!.location).toMatchObject({ '@type': 'Place', 'name': DEMO_VENUE.name, 'address': DEMO_VENUE.address })
      expect(e!.remainingAttendeeCapacity).toBe(s.seatsLeft)
    }
    expect(events.find(e => e.offers.url.endsWith(`/book/${full.id}`))!.offers.availability).toBe('https://schema.org/SoldOut')
    expect(events.find(e => e.offers.url.endsWith(`/book/${open.id}`))!.offers).toMatchObject({ price: '42.50', availability: 'https://schema.org/InStock' })
  })

  it('a flight with more sessions on sale than the page describes gets Events for the soonest only', async () => {
    const manager = await signedIn('manager')
    const flightId = await ownFlight(manager, `Busy event flight ${Date.now()}`)
    for (let i = 0; i <= EVENT_LD_LIMIT; i++) await newSession(manager, { flightId, hoursAhead: 24 * (10 + i) })
    const sessions = (await new Client().get(`/api/flights/${flightId}/sessions`)).body as { id: number, startsAt: string }[]
    expect(sessions.length).toBe(EVENT_LD_LIMIT + 1)
    const soonest = [...sessions].sort((a, b) => a.startsAt.localeCompare(b.startsAt)).slice(0, EVENT_LD_LIMIT)
    const events = jsonLd(await html(`/flights/${flightId}`)).filter(d => d['@type'] === 'Event')
    expect(events.map(e => e.offers.url).sort()).toEqual(soonest.map(s => new URL(`/book/${s.id}`, appUrl()).toString()).sort())
  })

  it('the home page describes the venue as a LocalBusiness with its address, phone and opening hours', async () => {
    const [business] = jsonLd(await html('/')).filter(d => d['@type'] === 'LocalBusiness')
    expect(business).toMatchObject({ name: DEMO_VENUE.name, address: DEMO_VENUE.address, telephone: DEMO_VENUE.phone, url: new URL('/', appUrl()).toString() })
    const openings = Object.values(DEMO_VENUE.openingHours).flat().length
    expect(business!.openingHoursSpecification).toHaveLength(openings)
    expect(business!.image).toMatch(new RegExp(`^${appUrl()}/media/`))
  })
})

describe('link previews', () => {
  it.each([['home', '/'], ['the flights', '/flights'], ['a flight', 'flight'], ['an article', '/articles/tasting-a-flight']])('%s: Open Graph and Twitter tags with an absolute image that loads', async (_name, path) => {
    const target = path === 'flight' ? `/flights/${((await new Client().get('/api/flights/published')).body as { id: number, name: string }[]).find(f => f.name === 'Shoreline Flight')!.id}` : path
    const page = await html(target)
    expect(meta(page, 'og:title')?.length).toBeGreaterThan(3)
    expect(meta(page, 'og:description')?.length).toBeGreaterThan(10)
    expect(meta(page, 'og:type')).toBe(path.startsWith('/articles/') ? 'article' : 'website')
    expect(meta(page, 'og:url')).toBe(new URL(target, appUrl()).toString())
    expect(meta(page, 'twitter:card')).toBe('summary_large_image')
    expect(meta(page, 'twitter:title')).toBe(meta(page, 'og:title'))
    const image = meta(page, 'og:image')!
    expect(new URL(image).origin).toBe(new URL(appUrl()).origin) // absolute, on the configured public address
    expect(meta(page, 'twitter:image')).toBe(image)
    const res = await fetch(image)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toMatch(/^image\//)
    expect(Number(meta(page, 'og:image:width'))).toBeGreaterThan(0)
  })
})

describe('the demo tells the story', () => {
  it('every demo product has a published tasting note and a photo that loads; the room has its own photo', async () => {
    const marketing = await signedIn('marketing')
    const products = (await allProducts(marketing)) as { id: number, code: string }[]
    for (const d of DEMO_PRODUCTS) {
      const id = products.find(p => p.code === d.code)!.id
      const note = (await marketing.get(`/api/content/product_note/${id}`)).body
      expect(note.status, d.code).toBe('published')
      expect(note.publishedBody?.length, d.code).toBeGreaterThan(20)
      const photos = ((await marketing.get(`/api/images?productId=${id}`)).body as { role: string, src: string, altText: string }[]).filter(i => i.role === 'photo')
      expect(photos.length, d.code).toBeGreaterThan(0)
      expect(photos[0]!.altText.length, d.code).toBeGreaterThan(10)
      const media = await new Client().raw(`/media/${photos[0]!.src}`)
      expect(media.status).toBe(200)
      expect(media.headers.get('content-type')).toMatch(/^image\//)
    }
    const room = (await new Client().get('/api/venue/photo')).body
    expect(room.photo).toMatchObject({ productId: null, role: 'photo' })
    expect(room.photo.width).toBeGreaterThan(room.photo.height) // a wide photo for the top of the home page
  })

  it('puts no weekly demo session on a public holiday of the venue\'s country', async () => {
    // The demo's sessions are the rows of the seed's one insert: the first session's creation instant.
    const rows = await withDb(async c => (await c.query(`SELECT starts_at, series_id FROM tasting_sessions
      WHERE created_at = (SELECT created_at FROM tasting_sessions ORDER BY id LIMIT 1)`))[0] as { starts_at: Date, series_id: string | null }[])
    expect(rows.filter(r => r.series_id).length).toBeGreaterThanOrEqual(10)
    for (const r of rows) {
      const day = DateTime.fromJSDate(r.starts_at, { zone: DEMO_VENUE.timeZone }).toISODate()!
      // Only the one session later today may fall on a holiday (the seed marks it in its log).
      if (r.series_id) expect(holidayOn(day), `a weekly session on ${day}`).toBeNull()
    }
  })
})

describe('the venue\'s own photo', () => {
  it('marketing uploads a photo of the room without a product; the home page and its preview lead with it until it is deleted', async () => {
    const marketing = await signedIn('marketing')
    const demo = (await new Client().get('/api/venue/photo')).body.photo as { id: number }
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="700"><rect width="1200" height="700" fill="#d5eae7"/><rect y="450" width="1200" height="250" fill="#8c5a30"/></svg>'
    const upload = (fields: Record<string, string>) => {
      const form = new FormData()
      form.append('file', new Blob([new Uint8Array(svgPng)]), 'room.png')
      for (const [k, v] of Object.entries(fields)) form.append(k, v)
      return marketing.request('POST', '/api/images', form)
    }
    const svgPng = await sharp(Buffer.from(svg)).png().toBuffer()
    const label = await upload({ role: 'label', altText: 'A label' })
    expect(label.status).toBe(400)
    expect(label.body.data.fields.role).toMatch(/photo/)
    const res = await upload({ role: 'photo', altText: 'The bar, freshly painted' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    try {
      expect(res.body.productId).toBeNull()
      expect(((await marketing.get('/api/images?of=venue')).body as { id: number }[]).map(i => i.id)).toContain(res.body.id)
      expect((await new Client().get('/api/venue/photo')).body.photo.id).toBe(res.body.id)
      const home = await html('/')
      expect(home).toContain(`alt="The bar, freshly painted"`)
      expect(meta(home, 'og:image')).toContain(`/media/${res.body.src}?`)
      expect((await marketing.get('/api/images')).status).toBe(400) // a product or of=venue, one of them
    }
    finally {
      expect((await marketing.request('DELETE', `/api/images/${res.body.id}`)).status).toBe(200)
    }
    expect((await new Client().get('/api/venue/photo')).body.photo.id).toBe(demo.id)
  })
})
