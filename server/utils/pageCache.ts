import { createHash } from 'node:crypto'
import { gzipSync } from 'node:zlib'
import type { H3Event } from 'h3'
import { DEVICE_COOKIE } from './observationGuard'

/**
 * Whole public pages, server-rendered once and kept in this process's memory for anonymous
 * visitors (server/plugins/pageCache.ts serves and stores them; DEVELOPERS.md, "Page cache").
 *
 * Only a GET or HEAD of a public page's exact path (PUBLIC_PAGES), with no query string and no
 * cookie but the ones no page is rendered from (PAGE_NEUTRAL_COOKIES: the observation form's device
 * cookie, read only by /api routes), is served from or stored in the cache: a signed-in visitor always carries
 * the session cookie, so nothing rendered for a person can be kept, and nothing they see can come
 * from here. Only a 200 that sets no cookie is stored.
 *
 * Every stored page belongs to a generation. A write that can change what a public page shows (a
 * flight published, a note, a venue setting, a product, a photo…) starts a new generation at once;
 * a write that changes only seats left (a booking, a payment, the door, the sweep) starts one at
 * most SEATS_LAG_MS later, so a run of bookings costs one new render per page per SEATS_LAG_MS. A
 * render that began in an older generation is not stored, so a page read before a write committed
 * cannot outlive it. Pages also expire MAX_AGE_MS after they were made, for what changes with time
 * alone (a session passing its booking cut-off, today's date).
 */

/** Seats left on a public page lag a booking by at most this (issue 17: "a few seconds"). */
const SEATS_LAG_MS = 5_000
/** What changes with time alone (cut-offs, "today") shows at most this late (common practice, no source). */
const MAX_AGE_MS = 60_000
/** The memory it may take: pages of 30–110 KB (common practice, no source). */
const MAX_ENTRIES = 400
const MAX_BYTES = 48 * 1024 * 1024

/** The public pages, by exact path. Anything else (staff pages, the booking form, sign-in) is rendered live. */
const PUBLIC_PAGES = [
  /^\/$/, /^\/flights$/, /^\/flights\/\d+$/, /^\/glass$/, /^\/pour\/\d+$/, /^\/pour\/\d+\/\d+$/,
  /^\/articles$/, /^\/articles\/[a-z0-9-]+$/,
]

/** A stored page: its bytes as rendered and gzipped once (most visitors accept gzip), with an ETag for each. */
export interface CachedPage { body: Buffer, gzipped: Buffer, csp: string, etag: string, gzippedEtag: string, storedAt: number, generation: number }

const pages = new Map<string, CachedPage>()
let bytes = 0
let generation = 1
let seatsTimer: ReturnType<typeof setTimeout> | null = null
/** Renders under way, by key: requests for the same page wait for the one render instead of starting their own. */
const rendering = new Map<string, { done: Promise<void>, resolve: () => void }>()

/**
 * Cookies no page is rendered from: the observation form's device cookie (server/utils/observationGuard.ts)
 * is read only by the /api routes that record and compare a glass. A guest who has opened a pour page
 * still gets cached pages; any other cookie (the session's above all) means a live render.
 */
const PAGE_NEUTRAL_COOKIES = new Set([DEVICE_COOKIE])

/** Whether a Cookie header carries only cookies no page is rendered from (or none). */
function onlyNeutralCookies(header: string | undefined): boolean {
  if (header === undefined) return true
  const names = header.split(';').map(p => p.split('=')[0]!.trim()).filter(Boolean)
  return names.length > 0 && names.every(n => PAGE_NEUTRAL_COOKIES.has(n))
}

/** The key of a request that may be served from and stored in the cache, else null. */
export function pageCacheKey(event: H3Event): string | null {
  if (event.method !== 'GET' && event.method !== 'HEAD') return null
  const url = event.node.req.url ?? ''
  if (url.includes('?')) return null
  if (!onlyNeutralCookies(event.node.req.headers.cookie) || event.node.req.headers.authorization !== undefined) return null
  return PUBLIC_PAGES.some(p => p.test(url)) ? url : null
}

export function currentPageGeneration(): number {
  return generation
}

/** The page for `key` if it is of this generation and young enough. */
export function cachedPage(key: string, now = Date.now()): CachedPage | null {
  const page = pages.get(key)
  if (!page) return null
  if (page.generation !== generation || now - page.storedAt >= MAX_AGE_MS) {
    drop(key)
    return null
  }
  // Most recently served last: the bound drops the least recently served first.
  pages.delete(key)
  pages.set(key, page)
  return page
}

/** Keeps a rendered page, unless a write started a new generation while it was rendered. */
export function storePage(key: string, body: string, csp: string, renderedIn: number): CachedPage | null {
  if (renderedIn !== generation) return null
  drop(key)
  // Kept as bytes: a hit is written out as it is, not encoded again.
  const bytesOf = Buffer.from(body, 'utf8')
  const tag = createHash('sha1').update(bytesOf).digest('base64url')
  const page: CachedPage = { body: bytesOf, gzipped: gzipSync(bytesOf), csp, etag: `"${tag}"`, gzippedEtag: `"${tag}-gz"`, storedAt: Date.now(), generation }
  pages.set(key, page)
  bytes += bytesOf.length + page.gzipped.length
  for (const [k] of pages) {
    if (pages.size <= MAX_ENTRIES && bytes <= MAX_BYTES) break
    drop(k)
  }
  return page
}

function drop(key: string) {
  const page = pages.get(key)
  if (!page) return
  bytes -= page.body.length + page.gzipped.length
  pages.delete(key)
}

/** Marks a render of `key` as under way; returns false when one already is. */
export function beginPageRender(key: string): boolean {
  if (rendering.has(key)) return false
  let resolve!: () => void
  const done = new Promise<void>((r) => { resolve = r })
  rendering.set(key, { done, resolve })
  return true
}

export function endPageRender(key: string) {
  rendering.get(key)?.resolve()
  rendering.delete(key)
}

/** Waits (at most `ms`) for a render of `key` that another request started. */
export async function waitForPageRender(key: string, ms: number): Promise<void> {
  const r = rendering.get(key)
  if (r) await Promise.race([r.done, new Promise(done => setTimeout(done, ms))])
}

const publicData = new Map<string, { value: Promise<unknown>, generation: number, at: number }>()

/**
 * Public data that many pages and visitors read (the list of published flights), built once per
 * generation and at most `maxAgeMs` old; requests in between share one build. Bound to the same
 * generations as the pages, so a page rendered after a write never reads data from before it.
 */
export function cachedPublicData<T>(key: string, maxAgeMs: number, build: () => Promise<T>): Promise<T> {
  const known = publicData.get(key)
  if (known && known.generation === generation && Date.now() - known.at < maxAgeMs) return known.value as Promise<T>
  const value = build()
  const entry = { value, generation, at: Date.now() }
  publicData.set(key, entry)
  value.catch(() => { if (publicData.get(key) === entry) publicData.delete(key) })
  return value
}

/** Something a public page shows has changed: no stored page is served again. */
function invalidatePages(): void {
  generation++
  pages.clear()
  publicData.clear()
  bytes = 0
  if (seatsTimer) clearTimeout(seatsTimer)
  seatsTimer = null
}

/** Seats left have changed: stored pages go within SEATS_LAG_MS. */
export function seatsChanged(): void {
  if (seatsTimer) return
  seatsTimer = setTimeout(invalidatePages, SEATS_LAG_MS)
  seatsTimer.unref()
}

/**
 * Writes that change no public page (signing in and out, account links, checks that write nothing,
 * print jobs held in memory). Everything else that is not a GET starts a new generation when it
 * succeeds: a write this list forgets costs a render, never a stale page.
 */
const CHANGES_NOTHING_PUBLIC = [
  /^\/api\/auth\//, /^\/api\/account\//, /^\/api\/lab-sheets\/check$/, /^\/api\/flights\/preview$/,
  /^\/api\/sessions\/\d+\/card-jobs$/,
]
/**
 * Writes that change only seats left (and the guest's own pages, which are never cached), and
 * observations, which can move a glass's calibration and so its figures: a few seconds' lag, and a
 * stream of guests' readings costs one render per page per SEATS_LAG_MS, not one per reading.
 */
const CHANGES_SEATS = [
  /^\/api\/bookings$/, /^\/api\/bookings\/\d+\/(?:release|cancel|check-in|turn-away|no-show|undo-door)$/,
  /^\/api\/sessions\/\d+\/walk-ins$/, /^\/webhooks\/stripe$/,
  /^\/api\/observations$/, /^\/api\/sessions\/\d+\/observations$/,
]

/** Called when a request has been answered: a successful write ends what the cache holds, now or within SEATS_LAG_MS. */
export function noteWrite(method: string, path: string, status: number): void {
  if (method === 'GET' || method === 'HEAD' || method === 'OPTIONS' || status >= 400) return
  const bare = path.split('?')[0]!
  if (CHANGES_NOTHING_PUBLIC.some(p => p.test(bare))) return
  if (CHANGES_SEATS.some(p => p.test(bare))) seatsChanged()
  else invalidatePages()
}
