import { mkdtempSync, mkdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { resolve } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { inject } from 'vitest'

/** Debian's chromium, with the flags this machine needs, and a fresh profile each time. */
const FLAGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync']

export const SHOTS_DIR = resolve(import.meta.dirname, '../../test-results/screenshots')

/**
 * `where` sets the browser's time zone and locale (IANA zone, BCP 47 tag); without it the browser
 * takes the machine's, which is the server's too.
 */
export async function openBrowser(viewport = { width: 1280, height: 900 }, where: { timezoneId?: string, locale?: string } = {}): Promise<{ context: BrowserContext, close: () => Promise<void> }> {
  const profile = mkdtempSync(resolve(tmpdir(), 'larmoir-chromium-'))
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    args: FLAGS,
    headless: true,
    viewport,
    ...where,
    baseURL: inject('appUrl'),
  })
  // Fail a step within seconds, with the locator in the message, rather than at the test's timeout.
  context.setDefaultTimeout(10_000)
  return {
    context,
    close: async () => {
      await context.close()
      rmSync(profile, { recursive: true, force: true })
    },
  }
}

export async function shot(page: Page, name: string): Promise<string> {
  mkdirSync(SHOTS_DIR, { recursive: true })
  const path = resolve(SHOTS_DIR, `${name}.png`)
  await page.screenshot({ path, fullPage: true })
  return path
}

export async function signInThroughForm(page: Page, email: string, password: string) {
  await page.goto('/signin')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
}

/** Pays on the Stripe fake's hosted page with its always-successful test card (Stripe docs: test card numbers). */
export async function payWithTestCard(page: Page, nameOnCard: string) {
  await page.getByLabel('Name on card').fill(nameOnCard)
  await page.getByLabel('Card number').fill('4242 4242 4242 4242')
  await page.getByLabel('Expiry (MM/YY)').fill('12/34')
  await page.getByLabel('CVC').fill('123')
  await page.getByRole('button', { name: /^Pay / }).click()
}

/**
 * The σ and index chart of a page (GlassCurveChart) loads when it comes near the screen: scroll
 * to it, wait for its canvas and the frame it draws on, and answer the canvas.
 */
export async function showCurveChart(page: Page, nth = 0) {
  const box = page.locator('[data-curve-chart]').nth(nth)
  await box.scrollIntoViewIfNeeded()
  const canvas = box.locator('canvas')
  await canvas.waitFor()
  await page.waitForTimeout(300) // the chart draws on the next frame
  return canvas
}

/** Adds a pour to the flight builder the way a manager does: search the catalogue by name, choose, Add. */
export async function addPourByName(page: Page, name: string) {
  const field = page.getByLabel('Add a pour')
  await field.fill(name)
  await page.getByRole('option', { name: new RegExp(`^${name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`) }).first().click()
  await page.getByRole('button', { name: 'Add', exact: true }).click()
}
