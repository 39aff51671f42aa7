import { readFileSync, readdirSync } from 'node:fs'
import { createRequire } from 'node:module'
import { join, relative, resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ConsoleMessage, Locator, Page } from 'playwright-core'
import { DateTime } from 'luxon'
import { openBrowser, shot, showCurveChart, signInThroughForm } from '../support/browser'
import { allProducts, Client } from '../support/http'
import { inviteStaff, requestPasswordReset, signedIn } from '../support/people'
import { bookAndPay, demoFlightId, newGuest, newSession } from '../support/booking'
import { DEMO_PASSWORD, DEMO_USERS, DEMO_VENUE } from '../../server/demo/data'

/**
 * Every page file, opened in Chromium as the person who would open it. The list of pages is read
 * from pages/ on disk; the table below says, per page file, who opens it, how its params are
 * filled and which element proves it works. A page file without a row fails, and so does a row
 * without a page file. Each page must answer below 400 with a content security policy, show its
 * main control, and cause no policy violation, script error, console error, hydration mismatch,
 * or serious or critical axe-core finding.
 */
const ROOT = resolve(import.meta.dirname, '../..')
const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8')

function vueFilesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((d) => {
    const path = join(dir, d.name)
    return d.isDirectory() ? vueFilesUnder(path) : d.name.endsWith('.vue') ? [path] : []
  })
}

/** `pages/manage/flights/[id].vue` → `/manage/flights/[id]`; an `index.vue` stands for its folder. */
function routeOfPage(file: string): string {
  const rel = relative(join(ROOT, 'pages'), file).replace(/\\/g, '/').replace(/\.vue$/, '')
  return `/${rel.replace(/(^|\/)index$/, '')}`.replace(/(.)\/$/, '$1')
}

const PAGE_FILES = vueFilesUnder(join(ROOT, 'pages')).map(f => ({ file: relative(ROOT, f), route: routeOfPage(f) }))
  .sort((a, b) => a.route.localeCompare(b.route))

type Who = 'anonymous' | 'guest' | 'host' | 'marketing' | 'manager'

/** What beforeAll makes through the API so that every page has something real to show. */
interface Fixtures {
  flight: number
  session: number
  /** The session's day in the venue's zone, for the host's day. */
  sessionDay: string
  product: number
  booking: number
  bookingReference: string
  welcomeToken: string
  resetToken: string
}

interface PageRow {
  who: Who
  /** One value per `[param]` of the route. */
  params?: (f: Fixtures) => Record<string, string | number>
  query?: (f: Fixtures) => Record<string, string>
  /** The element that proves the page works: visible once the page has loaded its data. */
  main: (page: Page, f: Fixtures) => Locator
}

const GUEST = DEMO_USERS.find(u => u.role === 'guest')!
const FLIGHT_NAME = 'Shoreline Flight' // the demo flight (server/demo/data.ts)
const PRODUCT_CODE = 'SV-FOR-19' // a demo product no other test edits the note of (server/demo/data.ts)
const PRODUCT_NAME = 'Low Tide Fortified Red'
const ARTICLE = 'tasting-a-flight' // shipped in content/articles/
const PARTY = 2

const PAGES: Record<string, PageRow> = {
  '/': { who: 'anonymous', main: p => p.getByRole('link', { name: 'See the flights and book' }) },
  '/account': { who: 'guest', main: p => p.getByRole('main').locator('dl', { hasText: GUEST.email }) },
  '/articles': { who: 'anonymous', main: p => p.getByRole('main').getByRole('link', { name: /How to taste a flight/ }) },
  '/articles/[slug]': { who: 'anonymous', params: () => ({ slug: ARTICLE }), main: p => p.getByRole('article').locator('.prose-larmoir p').first() },
  '/book/[sessionId]': { who: 'guest', params: f => ({ sessionId: f.session }), main: p => p.getByRole('button', { name: /^Continue to payment/ }) },
  '/bookings': { who: 'guest', main: (p, f) => p.getByRole('article').filter({ hasText: f.bookingReference }) },
  '/bookings/[id]': { who: 'guest', params: f => ({ id: f.booking }), main: (p, f) => p.getByRole('img', { name: `QR code of booking reference ${f.bookingReference}` }) },
  '/cards/flights/[id]': { who: 'marketing', params: f => ({ id: f.flight }), main: p => p.getByRole('article').filter({ has: p.getByRole('heading', { level: 1, name: FLIGHT_NAME }) }) },
  '/cards/sessions/[id]': { who: 'host', params: f => ({ id: f.session }), main: p => p.getByText(`${PARTY} cards`, { exact: true }) },
  '/flights': { who: 'anonymous', main: p => p.getByRole('main').getByRole('link', { name: FLIGHT_NAME }) },
  '/flights/[id]': { who: 'anonymous', params: f => ({ id: f.flight }), main: p => p.locator('[data-curve-chart]') },
  '/forgot-password': { who: 'anonymous', main: p => p.getByRole('button', { name: 'Send me a link' }) },
  '/glass': { who: 'anonymous', main: p => p.locator('[data-curve-chart]') },
  '/host': { who: 'host', query: f => ({ date: f.sessionDay }), main: (p, f) => p.locator(`section[aria-labelledby="s-${f.session}"]`).getByRole('button', { name: 'Print all cards' }) },
  '/manage': { who: 'manager', main: p => p.getByRole('link', { name: /Active products/ }) },
  '/manage/bookings': { who: 'manager', main: p => p.getByRole('button', { name: 'Show', exact: true }) },
  '/manage/observations': { who: 'manager', main: p => p.getByRole('link', { name: 'Download CSV' }) },
  '/manage/content': { who: 'marketing', main: (p, f) => p.locator(`a[href="/manage/content/product_note/${f.product}"]`) },
  '/manage/content/[kind]/[subject]': { who: 'marketing', params: f => ({ kind: 'product_note', subject: f.product }), main: p => p.getByLabel('Text (Markdown)') },
  '/manage/flights': { who: 'marketing', main: p => p.getByRole('table', { name: 'Flights' }).getByRole('link').first() },
  '/manage/flights/[id]': { who: 'manager', params: f => ({ id: f.flight }), main: p => p.getByRole('button', { name: 'Make a new version' }) },
  '/manage/flights/new': { who: 'manager', main: p => p.getByRole('button', { name: 'Save draft' }) },
  '/manage/glasses': { who: 'manager', main: p => p.getByRole('button', { name: 'Save glass' }).first() },
  '/manage/products': { who: 'host', main: p => p.getByRole('table', { name: 'Products' }).getByText(PRODUCT_NAME) },
  '/manage/products/[id]': { who: 'manager', params: f => ({ id: f.product }), main: p => p.getByRole('button', { name: 'Add the measurement' }) },
  '/manage/products/import': { who: 'manager', main: p => p.getByRole('button', { name: 'Check the sheet' }) },
  '/manage/products/new': { who: 'manager', main: p => p.getByRole('button', { name: 'Add the product' }) },
  '/manage/sessions': { who: 'manager', main: p => p.getByRole('button', { name: /^Schedule (session|\d+ sessions)$/ }) },
  '/manage/staff': { who: 'manager', main: p => p.getByRole('button', { name: 'Send invitation' }) },
  '/manage/venue': { who: 'manager', main: p => p.getByRole('button', { name: 'Save settings' }) },
  '/pour/[flightId]': { who: 'anonymous', params: f => ({ flightId: f.flight }), main: p => p.getByRole('link', { name: /^1\. / }) },
  '/pour/[flightId]/[position]': { who: 'anonymous', params: f => ({ flightId: f.flight, position: 1 }), main: p => p.locator('[data-curve-chart]') },
  '/reset-password': { who: 'anonymous', query: f => ({ token: f.resetToken }), main: p => p.getByRole('button', { name: 'Save my new password' }) },
  '/signin': { who: 'anonymous', main: p => p.getByRole('button', { name: 'Sign in' }) },
  '/signup': { who: 'anonymous', main: p => p.getByRole('button', { name: 'Create my account' }) },
  '/verify-email': { who: 'anonymous', query: () => ({ token: 'v'.repeat(43) }), main: p => p.getByRole('button', { name: 'Confirm my address' }) },
  '/welcome': { who: 'anonymous', query: f => ({ token: f.welcomeToken }), main: p => p.getByRole('button', { name: 'Set my password' }) },
}

/** Fills the route's `[params]` from the row and adds its query. */
function pathOf(route: string, row: PageRow, f: Fixtures): string {
  const params = row.params?.(f) ?? {}
  const names = [...route.matchAll(/\[{1,2}(?:\.\.\.)?(\w+)\]{1,2}/g)].map(m => m[1]!)
  expect(Object.keys(params).sort(), `${route}: the row fills exactly the route's params`).toEqual([...names].sort())
  const path = route.replace(/\[{1,2}(?:\.\.\.)?(\w+)\]{1,2}/g, (_, name: string) => encodeURIComponent(String(params[name])))
  const query = new URLSearchParams(row.query?.(f) ?? {}).toString()
  return query ? `${path}?${query}` : path
}

const shotName = (route: string) => `page-${route === '/' ? 'home' : route.slice(1).replace(/[[\]]/g, '').replace(/\//g, '-')}`

interface Finding { id: string, impact: string, help: string, nodes: string[] }

/**
 * Records every console error, every console message about hydration and every uncaught script
 * error; `settled()` gives them once each has been described.
 */
function watch(page: Page): { settled: () => Promise<string[]> } {
  const found: Promise<string>[] = []
  page.on('console', (m) => {
    if (m.type() === 'error' || /hydrat/i.test(m.text())) found.push(describeMessage(m))
  })
  page.on('pageerror', e => found.push(Promise.resolve(`script error: ${e.message}`)))
  return { settled: () => Promise.all(found) }
}

/** Vue passes the element of a hydration mismatch as an argument: its opening markup says where. */
async function describeMessage(m: ConsoleMessage): Promise<string> {
  const elements = await Promise.all(m.args().map(a => a.evaluate(n => (n instanceof Element ? n.outerHTML.slice(0, 200) : null)).catch(() => null)))
  const where = elements.filter(Boolean).join(' | ')
  return `console ${m.type()}: ${m.text()}${where ? ` — at ${where}` : ''}`
}

async function axe(page: Page): Promise<Finding[]> {
  await page.evaluate(axeSource)
  return page.evaluate(async () => {
    const w = window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: { id: string, impact: string, help: string, nodes: { target: string[] }[] }[] }> } }
    const r = await w.axe.run(document, { resultTypes: ['violations'] })
    return r.violations.map(v => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.slice(0, 5).map(n => n.target.join(' ')) }))
  })
}

// A visitor's browser is seldom in the server's time zone or locale: a value rendered from the
// clock or the locale then differs between the server's HTML and the browser's, which is a
// hydration mismatch. UTC+14 is the zone furthest ahead of the server's UTC and 18 to 19 hours
// from the venue's; en-GB writes dates in another order than en-US (common practice, no source).
const BROWSER_PLACE = { timezoneId: 'Pacific/Kiritimati', locale: 'en-GB' }

describe('every page file', () => {
  const fx = {} as Fixtures
  const browsers = new Map<Who, Awaited<ReturnType<typeof openBrowser>>>()

  async function browserOf(who: Who) {
    let b = browsers.get(who)
    if (b) return b
    b = await openBrowser(undefined, BROWSER_PLACE)
    browsers.set(who, b)
    if (who !== 'anonymous') {
      const page = await b.context.newPage()
      await signInThroughForm(page, `${who}@saltmarsh.test`, DEMO_PASSWORD)
      await page.waitForURL(u => !u.pathname.startsWith('/signin'))
      await page.close()
    }
    return b
  }

  beforeAll(async () => {
    expect((await new Client().get('/api/health')).status).toBe(200)
    const manager = await signedIn('manager')
    const host = await signedIn('host')
    const marketing = await signedIn('marketing')
    const guest = await signedIn('guest')
    fx.flight = await demoFlightId()
    const session = await newSession(manager, { seats: 12 })
    fx.session = session.id
    fx.sessionDay = DateTime.fromISO(session.startsAt).setZone(DEMO_VENUE.timeZone).toISODate()!
    const hostId = (await host.get('/api/account')).body.id
    expect((await manager.patch(`/api/sessions/${fx.session}`, { hostId })).status).toBe(200)
    const booking = await bookAndPay({ client: guest, email: GUEST.email, name: GUEST.name, dateOfBirth: GUEST.dateOfBirth! }, fx.session, PARTY)
    fx.booking = booking.id
    fx.bookingReference = booking.reference
    fx.product = ((await allProducts(manager)) as { id: number, code: string }[]).find(p => p.code === PRODUCT_CODE)!.id
    // A saved draft, so the editor shows its revisions list too.
    expect((await marketing.request('PUT', `/api/content/product_note/${fx.product}`, { body: 'Dried plum, cocoa and **sea salt**.' })).status).toBe(200)
    fx.welcomeToken = (await inviteStaff(manager, 'host', 'Ines Carrow')).token
    fx.resetToken = (await requestPasswordReset((await newGuest('pages-reset')).email)).token
  }, 60_000)

  afterAll(async () => {
    for (const b of browsers.values()) await b.close()
  })

  it('has a row for every page file, and a page file for every row', () => {
    expect(PAGE_FILES.length, 'pages/ holds page files').toBeGreaterThan(0)
    const routes = new Set(PAGE_FILES.map(p => p.route))
    const withoutRow = PAGE_FILES.filter(p => !PAGES[p.route]).map(p => `${p.file} (${p.route})`)
    const withoutFile = Object.keys(PAGES).filter(r => !routes.has(r))
    expect.soft(withoutRow, 'page files without a row in PAGES: add who opens each, its params and its main control').toEqual([])
    expect.soft(withoutFile, 'rows in PAGES whose page file no longer exists: remove them').toEqual([])
  })

  it.each(PAGE_FILES.map(p => [p.file, p] as const))('%s', async (file, { route }) => {
    const row = PAGES[route]
    if (!row) throw new Error(`${file} (${route}) has no row in PAGES in tests/browser/pages.test.ts: say who opens it, how to fill its params and its main control`)
    const path = pathOf(route, row, fx)
    const page = await (await browserOf(row.who)).context.newPage()
    try {
      const messages = watch(page)
      await page.addInitScript(() => {
        document.addEventListener('securitypolicyviolation', (e) => {
          console.error(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || 'inline'}`)
        })
      })
      const res = await page.goto(path, { waitUntil: 'networkidle' })
      expect(res?.status(), `${path}: status`).toBeLessThan(400)
      expect(res?.headers()['content-security-policy'], `${path}: content security policy`).toMatch(/script-src 'self' 'sha256-[^']+'/)
      expect(new URL(page.url()).pathname, `${path}: the page itself, not a redirect`).toBe(path.split('?')[0])
      const main = row.main(page, fx)
      await main.waitFor({ state: 'visible' }).catch((e: Error) => {
        throw new Error(`${file}: its main control ${main} is not on the page (${e.message.split('\n')[0]})`)
      })
      // A page's σ and index chart loads when it nears the screen: it must, and draw.
      if (await page.locator('[data-curve-chart]').count()) await showCurveChart(page)
      await page.waitForTimeout(300) // charts draw on the next frame
      await shot(page, shotName(route))
      const serious = (await axe(page)).filter(f => f.impact === 'serious' || f.impact === 'critical')
      expect(await messages.settled(), `${path}: no CSP violation, script error, console error or hydration mismatch`).toEqual([])
      expect(serious, `${path}: axe-core, no serious or critical violation (WCAG 2.1 AA rules as axe-core ships them)`).toEqual([])
    }
    finally { await page.close() }
  })
})
