import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext } from 'playwright-core'
import { addPourByName, openBrowser, shot, showCurveChart, signInThroughForm } from '../support/browser'
import { DEMO_PASSWORD } from '../../server/demo/data'

describe('the flight builder and the public glass page', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  beforeAll(async () => ({ context, close } = await openBrowser({ width: 1366, height: 1024 })))
  afterAll(async () => close())

  it('a manager builds a flight: adds pours, sees live figures, reorders by keyboard, saves and publishes', async () => {
    const page = await context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
    await page.goto('/manage/flights/new')
    await page.getByLabel('Flight name').fill('Browser-built flight')
    for (const name of ['Tidewater Albariño', 'Orchard Gate Dry Cider', 'Marsh Samphire Gin']) {
      await addPourByName(page, name)
    }
    await page.getByText('Per guest').waitFor()
    await page.getByText('Standard drinks (14 g)').waitFor()
    const firstTitle = page.locator('ol > li h3').first()
    expect(await firstTitle.innerText()).toContain('Tidewater')
    await page.getByRole('button', { name: 'Move pour 2 up' }).focus()
    await page.keyboard.press('Enter')
    await expect.poll(() => firstTitle.innerText()).toContain('Orchard Gate')
    // A pour's product is changed by searching the catalogue; the live figures follow the new product.
    const third = page.locator('ol > li').nth(2)
    await third.getByLabel('Product', { exact: true }).fill('low tide')
    await page.getByRole('option', { name: /^Low Tide Fortified Red/ }).click()
    await expect.poll(() => third.locator('h3').innerText()).toMatch(/Low Tide Fortified Red[\s\S]*19\.5 % ABV/)
    await third.getByLabel('Product', { exact: true }).fill('marsh samph')
    await page.getByRole('option', { name: /^Marsh Samphire Gin/ }).click()
    await expect.poll(() => third.locator('h3').innerText()).toMatch(/Marsh Samphire Gin[\s\S]*43 % ABV/)
    await page.waitForTimeout(500)
    await shot(page, 'flight-builder-new')
    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.waitForURL(/\/manage\/flights\/\d+$/)
    await page.getByText('Saved.').waitFor()
    await page.getByRole('button', { name: 'Publish' }).click()
    await page.getByText('Published: guests can now see').waitFor()
    await shot(page, 'flight-builder-published')
    await page.goto('/manage/flights')
    await page.getByText('Browser-built flight').waitFor()
    await shot(page, 'flights-table')
    await page.goto('/manage/sessions')
    await page.getByText('Schedule sessions').waitFor()
    await shot(page, 'sessions')
    await page.close()
  })

  it('over the per-guest limit, the builder warns', async () => {
    const page = await context.newPage()
    await page.goto('/manage/flights/new')
    for (const name of ['Marsh Samphire Gin', 'Low Tide Fortified Red']) {
      await addPourByName(page, name)
    }
    await page.getByLabel('Pour (fl oz)').first().fill('6')
    await page.getByLabel('Pour (fl oz)').first().press('Tab')
    await page.getByText('over the venue\'s limit').waitFor()
    await shot(page, 'flight-builder-over-limit')
    await page.close()
  })

  it('the public page explains the effect with the venue\'s own products, on a phone too', async () => {
    const page = await context.newPage()
    await page.goto('/glass')
    await page.getByText('Our bottles, glass by glass').waitFor()
    expect(await page.getByText('Tears say nothing about quality').count()).toBeGreaterThanOrEqual(6)
    await showCurveChart(page)
    await page.evaluate(() => window.scrollTo(0, 0))
    await shot(page, 'glass-page')
    await page.close()
    const phone = await openBrowser({ width: 390, height: 844 })
    const p2 = await phone.context.newPage()
    await p2.goto('/glass')
    await showCurveChart(p2)
    await p2.evaluate(() => window.scrollTo(0, 0))
    await shot(p2, 'glass-page-phone')
    await phone.close()
  })
})

describe('the print-ready card', () => {
  it('renders the flight card for printing, and the QR target page on a phone', async () => {
    const { context, close } = await openBrowser({ width: 900, height: 1200 })
    const page = await context.newPage()
    await signInThroughForm(page, 'host@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/host')
    await page.goto('/cards/flights/1')
    await page.getByText('This flight:').waitFor()
    expect(await page.locator('section.card-block').count()).toBe(6) // one block per pour
    expect(await page.locator('.card-glasses thead svg').count()).toBe(6) // and one glass each in the row
    await shot(page, 'card-print-page')
    await page.emulateMedia({ media: 'print' })
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false)
    await page.close()
    await close()
    const phone = await openBrowser({ width: 390, height: 844 })
    const p2 = await phone.context.newPage()
    await p2.goto('/pour/1/5')
    await p2.getByText('What to look for, and why').waitFor()
    await shot(p2, 'pour-page-phone')
    await phone.close()
  })
})
