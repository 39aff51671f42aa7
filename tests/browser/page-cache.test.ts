import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { openBrowser, shot } from '../support/browser'
import { Client } from '../support/http'
import { demoFlightId, waitFor } from '../support/booking'

/**
 * A page served whole from the page cache (server/plugins/pageCache.ts) runs in a browser as a
 * freshly rendered one does: its inline scripts match the policy's hashes, so the console shows
 * no policy violation and no error, and the page hydrates (its menu button works on a phone).
 */
const PHONE = { width: 375, height: 812 } // a small current phone in CSS pixels (common practice, no source)
let browser: Awaited<ReturnType<typeof openBrowser>>
let flightId: number

beforeAll(async () => {
  browser = await openBrowser(PHONE)
  flightId = await demoFlightId()
})
afterAll(async () => { await browser?.close() })

describe('a page from the page cache in a browser', () => {
  it.each(['/', 'flight', 'pour', '/glass'])('%s loads with no policy violation or console error, and hydrates', async (which) => {
    const path = which === 'flight' ? `/flights/${flightId}` : which === 'pour' ? `/pour/${flightId}/1` : which
    // Another visitor has been here first: the page is in the cache.
    await waitFor(async () => (await new Client().send('GET', path)).headers.get('x-page-cache') === 'hit', `${path} cached`)
    const page = await browser.context.newPage()
    try {
      const problems: string[] = []
      page.on('console', (m) => { if (m.type() === 'error' || /hydrat/i.test(m.text())) problems.push(`console ${m.type()}: ${m.text()}`) })
      page.on('pageerror', e => problems.push(`script error: ${e.message}`))
      await page.addInitScript(() => {
        document.addEventListener('securitypolicyviolation', e => console.error(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || 'inline'}`))
      })
      const res = await page.goto(path, { waitUntil: 'networkidle' })
      expect(res?.status()).toBe(200)
      expect(res?.headers()['x-page-cache'], `${path} came from the cache`).toBe('hit')
      // Hydrated: the menu button opens the menu (a click does nothing on HTML that never hydrated).
      const menu = page.getByRole('button', { name: 'Menu' })
      await menu.click()
      await expect.poll(() => menu.getAttribute('aria-expanded')).toBe('true')
      await shot(page, `page-cache-${which.replace(/\W/g, '') || 'home'}`)
      expect(problems, `${path}: no CSP violation, script error, console error or hydration mismatch`).toEqual([])
    }
    finally { await page.close() }
  })
})
