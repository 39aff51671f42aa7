import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { resolve } from 'node:path'
import { openBrowser, shot, signInThroughForm } from '../support/browser'
import { SAMPLES_DIR, bigProductsSheet, productsErrorSheet, removeProducts, runTag, sampleCodes } from '../support/labSheets'
import { DEMO_PASSWORD, DEMO_PRODUCTS } from '../../server/demo/data'

/** A tablet held sideways, the way a manager works at the bar (common practice, no source). */
const TABLET = { width: 1024, height: 768 }
const tag = runTag()
const code = `${tag}-BR`

describe('products through the browser, as the manager on a tablet', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  let page: Page
  beforeAll(async () => {
    ({ context, close } = await openBrowser(TABLET))
    page = await context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
  })
  afterAll(async () => {
    await close()
    await removeProducts([code, ...sampleCodes('products')])
  })

  it('opens the products list from the overview', async () => {
    await page.getByRole('link', { name: /Active products/ }).click()
    await page.waitForURL('**/manage/products')
    const table = page.getByRole('table', { name: 'Products' })
    await table.getByRole('link', { name: DEMO_PRODUCTS[1]!.name }).waitFor()
    expect(await table.locator('tbody tr').count()).toBeGreaterThanOrEqual(DEMO_PRODUCTS.length) // other tests add products
    await shot(page, 'products-list')
    // The server searches, sorts and pages: each change is a new answer, so wait for the table to show it.
    await page.getByLabel('Find a product').fill('gin')
    await expect.poll(() => table.locator('tbody tr').count()).toBe(1)
    await page.getByLabel('Find a product').fill('')
    await expect.poll(() => table.locator('tbody tr').count()).toBeGreaterThanOrEqual(DEMO_PRODUCTS.length)
    await table.getByRole('button', { name: /ABV/ }).click() // numbers sort highest first on the first click
    await table.locator('th[aria-sort="descending"]', { hasText: 'ABV' }).waitFor()
    // Other test files add products of their own, so compare the column itself, top to bottom.
    const abvColumn = () => table.evaluate((t: HTMLTableElement) => {
      const col = [...t.tHead!.rows[0]!.cells].findIndex(c => /ABV/.test(c.textContent ?? ''))
      return [...t.tBodies[0]!.rows].map(r => Number.parseFloat(r.cells[col]!.textContent ?? ''))
    })
    await expect.poll(async () => { const a = await abvColumn(); return a.length >= DEMO_PRODUCTS.length && a.every((v, i) => i === 0 || a[i - 1]! >= v) }).toBe(true)
    const abvs = await abvColumn()
    // The first row is the highest ABV of the whole catalogue, not only of a page the browser had.
    const top = (await (await page.request.get('/api/products?status=active&sort=abv&dir=desc&pageSize=1')).json()).items[0]
    expect(abvs[0]).toBeCloseTo(top.current.abvPctVol, 1)
    expect(abvs[0]).toBeGreaterThanOrEqual(Math.max(...DEMO_PRODUCTS.map(p => p.abvPctVol)))
  })

  it('adds a product: messages per field first, then its page with the derived figures', async () => {
    await page.goto('/manage/products')
    await page.getByRole('link', { name: 'Add a product' }).click()
    await page.waitForURL('**/manage/products/new')
    await page.getByRole('button', { name: 'Add the product' }).click()
    await page.getByText('Please correct the fields marked below.').waitFor()
    await shot(page, 'products-new-errors')
    await page.getByLabel('Name', { exact: true }).fill('Brackish Bay Test White')
    await page.getByLabel('Code').fill(code)
    await page.getByLabel('Kind').selectOption('still_wine')
    await page.getByLabel('Producer').fill('Larmoir Test Cellar')
    await page.getByLabel('Vintage or batch').fill('2025')
    await page.getByLabel('Serving temperature (°F)').fill('50')
    await page.getByLabel('Cost per bottle (USD)').fill('13.75')
    await page.getByLabel('Sulfites').check()
    await page.getByLabel('ABV (% vol at 20 °C)').fill('12.5')
    await page.getByLabel('Residual sugar (g/L)').fill('3')
    await page.getByLabel('Measured on').fill('2026-10-02')
    await page.getByLabel('Lab', { exact: true }).fill('Wrenfield Cellar Lab (demo)')
    await page.getByLabel('Method').fill('Ebulliometry')
    await page.getByRole('button', { name: 'Add the product' }).click()
    await page.waitForURL(/\/manage\/products\/\d+/)
    await page.getByRole('heading', { name: 'Brackish Bay Test White' }).waitFor()
    expect(await page.getByLabel('Serving temperature (°F)').inputValue()).toBe('50')
    expect(await page.getByLabel('Cost per bottle (USD)').inputValue()).toBe('13.75')
    expect(await page.getByText(/2\.0\sfl\soz at 50\s°F/).count()).toBe(1) // 60 mL ≈ 2.0 US fl oz (1 fl oz = 29.5735 mL, US customary definition)
    await shot(page, 'products-page')
  })

  it('adds a lab measurement as a new history row; the figures follow it', async () => {
    const history = page.getByRole('table', { name: /Lab measurements/ })
    expect(await history.locator('tbody tr').count()).toBe(1)
    const before = await page.getByRole('region', { name: 'In one tasting pour' }).innerText()
    await page.getByLabel('ABV (% vol at 20 °C)').fill('13.4')
    await page.getByLabel('Residual sugar (g/L)').fill('1.5')
    await page.getByLabel('Measured on').fill('2026-11-24')
    await page.getByRole('button', { name: 'Add the measurement' }).click()
    await page.getByText('It is now the current one').waitFor()
    expect(await history.locator('tbody tr').count()).toBe(2)
    expect(await history.locator('tbody tr').first().innerText()).toContain('13.4')
    expect(await history.locator('tbody tr').nth(1).innerText()).toContain('12.5')
    expect(await page.getByRole('region', { name: 'Current measurement' }).innerText()).toContain('13.4')
    expect(await page.getByRole('region', { name: 'In one tasting pour' }).innerText()).not.toBe(before)
    await shot(page, 'products-measurement-added')
  })

  it('saves details typed in the venue\'s units; the pour figures are worked out again', async () => {
    await page.getByLabel('Serving temperature (°F)').fill('59')
    await page.getByLabel('Cost per bottle (USD)').fill('14.2')
    await page.getByRole('button', { name: 'Save changes' }).click()
    await page.getByText('Saved. The figures on this page').waitFor()
    await page.getByText(/2\.0\sfl\soz at 59\s°F/).waitFor()
    const id = Number(new URL(page.url()).pathname.split('/').pop())
    const saved = await page.evaluate(async pid => (await fetch(`/api/products/${pid}`)).json(), id)
    expect(saved.servingTempC).toBeCloseTo(15, 9) // 59 °F = 15 °C (°C = (°F − 32) × 5/9, exact)
    expect(saved.costPerBottleMinor).toBe(1420)
    await page.getByRole('button', { name: 'Save changes' }).click()
    await page.getByText('Nothing has changed.').waitFor()
  })

  it('imports the sample lab sheet through the page', async () => {
    await page.goto('/manage/products')
    await page.getByRole('link', { name: 'Import a lab sheet' }).click()
    await page.waitForURL('**/manage/products/import')
    await shot(page, 'products-import-start')
    await page.getByLabel('New products, each with its first measurement').check()
    await page.getByLabel('The CSV file').setInputFiles(resolve(SAMPLES_DIR, 'lab-sheet-products.csv'))
    await page.getByRole('button', { name: 'Check the sheet' }).click()
    await page.getByRole('button', { name: 'Import 20 rows' }).first().waitFor()
    expect(await page.getByRole('table', { name: 'Rows of the lab sheet' }).locator('tbody input[type=checkbox]:checked').count()).toBe(20)
    await shot(page, 'products-import-preview')
    await page.getByRole('button', { name: 'Import 20 rows' }).first().click()
    await page.getByText('Imported 20 products').waitFor()
    await shot(page, 'products-import-done')
    await page.getByRole('link', { name: 'See the products' }).click()
    await page.waitForURL('**/manage/products')
    await page.getByLabel('Find a product').fill('Sandbar')
    await page.getByRole('link', { name: 'Sandbar Rosé' }).waitFor()
  })

  it('shows what is wrong with each row, and rows with errors cannot be chosen', async () => {
    await page.goto('/manage/products/import')
    const sheet = productsErrorSheet(tag)
    await page.getByLabel('The CSV file').setInputFiles({ name: 'lab-sheet-with-errors.csv', mimeType: 'text/csv', buffer: Buffer.from(sheet.csv) })
    await page.getByRole('button', { name: 'Check the sheet' }).click()
    await page.getByRole('button', { name: 'Import 1 row' }).first().waitFor()
    const table = page.getByRole('table', { name: 'Rows of the lab sheet' })
    expect(await table.getByLabel('Import line 3').isDisabled()).toBe(true)
    expect(await table.getByLabel('Import line 2').isChecked()).toBe(true)
    await table.getByText('Unknown kind "kombucha"').waitFor()
    await page.getByLabel('Show').selectOption('problems')
    await shot(page, 'products-import-errors')
    await page.getByRole('button', { name: 'Select none' }).click()
    expect(await page.getByRole('button', { name: 'Import 0 rows' }).first().isDisabled()).toBe(true)
  })

  it('streams progress for a large sheet and pages its preview', async () => {
    await page.goto('/manage/products/import')
    await page.getByLabel('The CSV file').setInputFiles({ name: 'big.csv', mimeType: 'text/csv', buffer: Buffer.from(bigProductsSheet(5000, `${tag}W`)) })
    // A slow download keeps the large result in flight after the first progress lines have arrived.
    const cdp = await context.newCDPSession(page)
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: 200 * 1024, uploadThroughput: -1 })
    await page.getByRole('button', { name: 'Check the sheet' }).click()
    await page.getByText(/Checked [\d,]+ of 5,000 rows/).waitFor()
    expect(await page.getByRole('progressbar', { name: 'Checking the sheet' }).getAttribute('aria-valuemax')).toBe('5000')
    await shot(page, 'products-import-progress')
    await page.getByRole('button', { name: 'Import 5000 rows' }).first().waitFor({ timeout: 20_000 })
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 })
    expect(await page.getByText('5000 rows read').count()).toBe(1)
    expect(await page.getByRole('table', { name: 'Rows of the lab sheet' }).locator('tbody tr').count()).toBe(50)
  })

  it('reads well on a tablet held upright', async () => {
    const upright = await openBrowser({ width: 820, height: 1180 }) // a 10.9-inch tablet in portrait, CSS pixels (common practice, no source)
    const up = await upright.context.newPage()
    await signInThroughForm(up, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await up.waitForURL('**/manage')
    await up.goto('/manage/products')
    await up.getByRole('link', { name: DEMO_PRODUCTS[3]!.name }).waitFor()
    const fits = await up.evaluate(() => {
      const table = document.querySelector('table')!
      return document.documentElement.scrollWidth <= window.innerWidth && table.scrollWidth <= table.parentElement!.clientWidth
    })
    expect(fits, 'every column visible without scrolling sideways').toBe(true)
    await shot(up, 'products-list-upright')
    await up.getByRole('link', { name: DEMO_PRODUCTS[3]!.name }).click()
    await up.getByRole('heading', { name: DEMO_PRODUCTS[3]!.name }).waitFor()
    await shot(up, 'products-page-upright')
    await upright.close()
  })

  it('a host reads the list and a product page, without the manager\'s buttons or costs', async () => {
    const host = await openBrowser(TABLET)
    const hp = await host.context.newPage()
    await signInThroughForm(hp, 'host@saltmarsh.test', DEMO_PASSWORD)
    await hp.waitForURL('**/host')
    await hp.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Products' }).click()
    await hp.waitForURL('**/manage/products')
    await hp.getByLabel('Find a product').fill(DEMO_PRODUCTS[4]!.name) // other test files add products: the list may page
    await hp.getByRole('link', { name: DEMO_PRODUCTS[4]!.name }).click()
    await hp.getByRole('heading', { name: DEMO_PRODUCTS[4]!.name }).waitFor()
    expect(await hp.getByRole('button', { name: 'Add the measurement' }).count()).toBe(0)
    expect(await hp.getByText('Cost per bottle').count()).toBe(0)
    await shot(hp, 'products-host-page')
    await hp.goto('/manage/products/999999')
    await hp.getByText('Page not found').waitFor()
    expect(await hp.getByText('No such product.').count()).toBe(1)
    await host.close()
  })
})
