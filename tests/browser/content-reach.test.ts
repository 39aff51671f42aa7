import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { openBrowser, shot, signInThroughForm } from '../support/browser'
import { inspectPdf, pdfRuns, unitBreaks } from '../support/pdf'
import { signedIn } from '../support/people'
import { bookAndPay, newGuest, newSession } from '../support/booking'
import { CONTENT, flightWithContent, type ContentFlight } from '../support/content'
import { DEMO_PASSWORD } from '../../server/demo/data'

/** Page sizes Chromium writes for @page A5 and 5.5in × 8.5in, in points (ISO 216 A5 148 × 210 mm; US half letter 5.5 × 8.5 in). */
const PAPERS = [['a5', 419.53, 595.28], ['half-letter', 396, 612]] as const

let flight: ContentFlight
beforeAll(async () => {
  flight = await flightWithContent('browser')
})

/** Script errors and content security policy violations on a page, as they happen. */
async function watchProblems(page: Page): Promise<string[]> {
  const problems: string[] = []
  page.on('console', (m) => { if (m.type() === 'error' && !/^Hydration completed but contains mismatches/.test(m.text())) problems.push(`console: ${m.text()}`) })
  page.on('pageerror', e => problems.push(`script error: ${e.message}`))
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', e => console.error(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || 'inline'}`))
  })
  return problems
}

async function photoLoaded(page: Page, alt: string) {
  const photo = page.getByRole('img', { name: alt })
  await photo.scrollIntoViewIfNeeded()
  await expect.poll(() => photo.evaluate((img: HTMLImageElement) => (img.complete ? img.naturalWidth : 0))).toBeGreaterThan(0)
  // The box was reserved from the stored size: it keeps the photo's proportions.
  const box = (await photo.boundingBox())!
  expect(box.height / box.width).toBeCloseTo(flight.photo.height / flight.photo.width, 1)
}

describe('marketing\'s words and photo where guests read them', () => {
  it('on a phone: the flight page has the introduction, the photo and the formatted notes; so has the pour page', async () => {
    const { context, close } = await openBrowser({ width: 390, height: 844 }) // a common phone viewport (common practice, no source)
    try {
      const page = await context.newPage()
      const problems = await watchProblems(page)
      await page.goto(`/flights/${flight.flightId}`)
      const intro = page.locator('header .prose-larmoir')
      await intro.getByText('A walk along the').waitFor()
      expect(await intro.locator('strong').allInnerTexts()).toEqual(['tide line'])
      expect(await intro.locator('em').allInnerTexts()).toEqual(['slowly'])
      const first = page.locator('article', { hasText: flight.names[0] })
      expect(await first.locator('.prose-larmoir li').allInnerTexts()).toEqual(['lemon zest', 'a chalky finish'])
      expect(await first.locator('.prose-larmoir strong').allInnerTexts()).toEqual(['sea salt', 'chalky'])
      expect(await page.locator('article', { hasText: flight.names[4] }).locator('.prose-larmoir ol > li').allInnerTexts()).toEqual(['Dark cherry', 'Cocoa and dried fig'])
      await photoLoaded(page, CONTENT.photoAlt)
      await page.evaluate(() => window.scrollTo(0, 0))
      await shot(page, 'content-flight-phone')

      await page.goto(`/pour/${flight.flightId}/1`)
      await page.locator('.prose-larmoir li', { hasText: 'lemon zest' }).waitFor()
      await page.getByText('About Tide line flight').waitFor()
      await photoLoaded(page, CONTENT.photoAlt)
      await page.evaluate(() => window.scrollTo(0, 0))
      await shot(page, 'content-pour-phone')
      expect(problems).toEqual([])
    }
    finally { await close() }

    const desktop = await openBrowser({ width: 1280, height: 900 })
    try {
      const page = await desktop.context.newPage()
      await page.goto(`/flights/${flight.flightId}`)
      await photoLoaded(page, CONTENT.photoAlt)
      await page.evaluate(() => window.scrollTo(0, 0))
      await shot(page, 'content-flight-desktop')
    }
    finally { await desktop.close() }
  })

  it('the card pages: Print works under the page\'s policy, and the browser prints one card a page at A5 and half letter', async () => {
    const manager = await signedIn('manager')
    const { id: sessionId } = await newSession(manager, { flightId: flight.flightId, seats: 8 })
    await bookAndPay(await newGuest('cards-a'), sessionId, 3)
    await bookAndPay(await newGuest('cards-b'), sessionId, 2)

    const { context, close } = await openBrowser({ width: 1100, height: 1000 })
    try {
      const page = await context.newPage()
      await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
      await page.waitForURL(u => !u.pathname.startsWith('/signin'))
      const problems = await watchProblems(page)
      // The print dialog is the browser's: record that the button asked for it.
      await page.addInitScript(() => {
        const w = window as unknown as { printCalls: number }
        w.printCalls = 0
        window.print = () => { w.printCalls++ }
      })
      const printCalls = () => page.evaluate(() => (window as unknown as { printCalls: number }).printCalls)

      for (const [path, cards] of [[`/cards/flights/${flight.flightId}`, 1], [`/cards/sessions/${sessionId}`, 5]] as const) {
        await page.goto(path)
        await expect.poll(() => page.locator('.card-sheet[data-fit]').count()).toBe(cards)
        expect(await page.locator('.card-sheet').first().getByText('A walk along the').count()).toBe(1)
        expect(await page.locator('.card-sheet').first().locator('.card-note').first().locator('li').allInnerTexts()).toEqual(['lemon zest', 'a chalky finish'])
        await page.getByRole('button', { name: 'Print' }).click()
        expect(await printCalls(), `${path}: Print calls window.print`).toBe(1)
        for (const [paper, width, height] of PAPERS) {
          await page.getByLabel('Paper').selectOption(paper)
          await expect.poll(() => page.locator(`.card-sheet[data-fitted-for="${paper}"]`).count()).toBe(cards)
          const printed = await page.pdf({ preferCSSPageSize: true, printBackground: true })
          const pdf = inspectPdf(printed, `content-browser-card-${cards}-${paper}`)
          // The print page keeps the PDF's rules: nothing under 8.5 pt, no unit parted from its figure. Chromium writes
          // 8.5 pt as a hair under 25.5 px at pdftohtml's zoom of 3, which reads 8.33; 8.2 pt or less would read 8.0.
          expect(pdfRuns(printed).filter(r => r.size < 8.3).map(r => `${r.size}: ${r.text}`), `${path} at ${paper}`).toEqual([])
          expect(unitBreaks(printed), `${path} at ${paper}`).toEqual([])
          expect(pdf.pages, `${path} at ${paper}: one page per card`).toBe(cards)
          expect(pdf.width).toBeCloseTo(width, -0.5)
          expect(pdf.height).toBeCloseTo(height, -0.5)
          expect(pdf.pageText(cards).replace(/\s+/g, ' ')).toContain('Scan for more')
        }
        if (cards === 1) await shot(page, 'content-card-page')
      }
      expect(problems).toEqual([])
    }
    finally { await close() }
  })
})
