import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { openBrowser, signInThroughForm } from '../support/browser'
import { Client } from '../support/http'
import { signedIn } from '../support/people'
import { demoFlightId, newSession } from '../support/booking'
import { DEMO_PASSWORD } from '../../server/demo/data'

/**
 * Every kind of page, opened in Chromium as the person who would open it: no content security
 * policy violation, no script error, and no serious or critical accessibility finding from axe-core.
 */
const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8')

type Who = 'anonymous' | 'guest' | 'manager'
interface PageKind { name: string, who: Who, path: () => string }

const ids = { flight: 0, session: 0, product: 0, booking: 0 }
const PAGES: PageKind[] = [
  { name: 'home', who: 'anonymous', path: () => '/' },
  { name: 'sign-in', who: 'anonymous', path: () => '/signin' },
  { name: 'sign-up', who: 'anonymous', path: () => '/signup' },
  { name: 'flights list', who: 'anonymous', path: () => '/flights' },
  { name: 'flight page', who: 'anonymous', path: () => `/flights/${ids.flight}` },
  { name: 'glass page', who: 'anonymous', path: () => '/glass' },
  { name: 'pours of a flight', who: 'anonymous', path: () => `/pour/${ids.flight}` },
  { name: 'pour page', who: 'anonymous', path: () => `/pour/${ids.flight}/1` },
  { name: 'articles', who: 'anonymous', path: () => '/articles' },
  { name: 'article', who: 'anonymous', path: () => '/articles/tasting-a-flight' },
  { name: 'booking form', who: 'guest', path: () => `/book/${ids.session}` },
  { name: 'my bookings', who: 'guest', path: () => '/bookings' },
  { name: 'manager overview', who: 'manager', path: () => '/manage' },
  { name: 'products', who: 'manager', path: () => '/manage/products' },
  { name: 'product page', who: 'manager', path: () => `/manage/products/${ids.product}` },
  { name: 'new product', who: 'manager', path: () => '/manage/products/new' },
  { name: 'import', who: 'manager', path: () => '/manage/products/import' },
  { name: 'flights table', who: 'manager', path: () => '/manage/flights' },
  { name: 'builder', who: 'manager', path: () => `/manage/flights/${ids.flight}` },
  { name: 'new flight', who: 'manager', path: () => '/manage/flights/new' },
  { name: 'sessions', who: 'manager', path: () => '/manage/sessions' },
  { name: 'glasses', who: 'manager', path: () => '/manage/glasses' },
  { name: 'staff', who: 'manager', path: () => '/manage/staff' },
  { name: 'venue', who: 'manager', path: () => '/manage/venue' },
  { name: 'notes and articles', who: 'manager', path: () => '/manage/content' },
  { name: 'content editor', who: 'manager', path: () => `/manage/content/product_note/${ids.product}` },
  { name: 'bookings view', who: 'manager', path: () => '/manage/bookings' },
  { name: 'card print page', who: 'manager', path: () => `/cards/flights/${ids.flight}` },
]

interface Finding { id: string, impact: string, help: string, nodes: string[] }

async function visit(page: Page, path: string) {
  const problems: string[] = []
  // Vue's hydration-mismatch notice is a rendering difference, not a policy or script failure.
  page.on('console', (m) => { if (m.type() === 'error' && !/^Hydration completed but contains mismatches/.test(m.text())) problems.push(`console: ${m.text()}`) })
  page.on('pageerror', e => problems.push(`script error: ${e.message}`))
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      console.error(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || 'inline'}`)
    })
  })
  const res = await page.goto(path, { waitUntil: 'networkidle' })
  expect(res?.status(), path).toBeLessThan(400)
  expect(res?.headers()['content-security-policy'], path).toMatch(/script-src 'self' 'nonce-/)
  await page.waitForTimeout(300) // charts draw on the next frame
  return problems
}

async function axe(page: Page): Promise<Finding[]> {
  await page.evaluate(axeSource)
  return page.evaluate(async () => {
    const w = window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: { id: string, impact: string, help: string, nodes: { target: string[] }[] }[] }> } }
    const r = await w.axe.run(document, { resultTypes: ['violations'] })
    return r.violations.map(v => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.slice(0, 5).map(n => n.target.join(' ')) }))
  })
}

describe('every page kind', () => {
  const browsers = {} as Record<Who, { context: BrowserContext, close: () => Promise<void> }>

  beforeAll(async () => {
    const manager = await signedIn('manager')
    ids.flight = await demoFlightId()
    ids.session = (await newSession(manager, { seats: 12 })).id
    ids.product = ((await manager.get('/api/products')).body as { id: number }[])[0]!.id
    for (const who of ['anonymous', 'guest', 'manager'] as const) {
      browsers[who] = await openBrowser()
      if (who !== 'anonymous') {
        const page = await browsers[who].context.newPage()
        await signInThroughForm(page, `${who}@saltmarsh.test`, DEMO_PASSWORD)
        await page.waitForURL(u => !u.pathname.startsWith('/signin'))
        await page.close()
      }
    }
    expect((await new Client().get('/api/health')).status).toBe(200)
  }, 60_000)
  afterAll(async () => {
    for (const b of Object.values(browsers)) await b.close()
  })

  it.each(PAGES.map(p => [p.name, p] as const))('%s', async (_name, kind) => {
    const page = await browsers[kind.who].context.newPage()
    try {
      const problems = await visit(page, kind.path())
      const serious = (await axe(page)).filter(f => f.impact === 'serious' || f.impact === 'critical')
      if (process.env.LARMOIR_PAGES_DEBUG) console.log('PAGEDEBUG', kind.name, JSON.stringify({ problems, serious }))
      expect(problems, 'no CSP violation or script error').toEqual([])
      expect(serious, 'axe-core: no serious or critical violation (WCAG 2.1 AA rules as axe-core ships them)').toEqual([])
    }
    finally { await page.close() }
  })
})
