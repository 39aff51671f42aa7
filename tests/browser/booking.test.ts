import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import type { BrowserContext } from 'playwright-core'
import { openBrowser, shot, signInThroughForm } from '../support/browser'
import { uniqueEmail } from '../support/http'
import { DEMO_PASSWORD } from '../../server/demo/data'

const PHONE = { width: 390, height: 844 } // a common phone viewport in CSS pixels (common practice, no source)

describe('a guest books and pays through the pages', () => {
  let desktop: { context: BrowserContext, close: () => Promise<void> }
  let phone: { context: BrowserContext, close: () => Promise<void> }
  const guest = { name: 'Noor Halvorsen', email: uniqueEmail('browser-guest'), password: 'browser-guest-pass-1' }
  let flightPath = ''
  let reference = ''

  beforeAll(async () => {
    desktop = await openBrowser()
    phone = await openBrowser(PHONE)
  })
  afterAll(async () => {
    await desktop.close()
    await phone.close()
  })

  it('shows the flights and a flight page with its pours, chart and sessions', { timeout: 60_000 }, async () => {
    const page = await desktop.context.newPage()
    await page.goto('/')
    await page.getByRole('link', { name: 'See the flights and book' }).click()
    await page.waitForURL('**/flights')
    await page.getByRole('heading', { name: 'Shoreline Flight' }).waitFor()
    await shot(page, 'booking-flights-list')
    await page.getByRole('link', { name: 'Shoreline Flight' }).click()
    await page.waitForURL('**/flights/*')
    flightPath = new URL(page.url()).pathname
    await page.getByRole('heading', { name: 'The pours, in order' }).waitFor()
    expect(await page.locator('ol > li article').count()).toBe(6)
    await page.locator('canvas').first().waitFor()
    await page.waitForTimeout(300) // the chart draws on the next frame
    await shot(page, 'booking-flight-desktop')
    await page.close()

    const small = await phone.context.newPage()
    await small.goto(flightPath)
    await small.getByRole('heading', { name: 'Next sessions' }).waitFor()
    await small.locator('canvas').first().waitFor()
    await small.waitForTimeout(300)
    const overflow = await small.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    await shot(small, 'booking-flight-phone')
    await small.close()
  })

  it('signs up on the way, books, pays with the test card and sees the booking', { timeout: 90_000 }, async () => {
    const page = await desktop.context.newPage()
    await page.goto(flightPath)
    await page.getByRole('link', { name: /^Book / }).first().click()
    await page.waitForURL(/\/signin\?redirect=/)
    await page.getByRole('link', { name: 'New here? Create an account' }).click()
    await page.waitForURL(/\/signup\?redirect=/)
    await page.getByLabel('Your name').fill(guest.name)
    await page.getByLabel('E-mail').fill(guest.email)
    await page.getByLabel('Password').fill(guest.password)
    await page.getByLabel('Date of birth').fill('1987-09-21')
    await page.getByRole('button', { name: 'Create my account' }).click()
    await page.waitForURL('**/book/*')
    await page.getByRole('heading', { name: 'Book your seats' }).waitFor()

    await page.getByLabel('Guests in your party').selectOption('2')
    await page.getByLabel('Phone').fill('+1 207 555 0134')
    await page.getByRole('button', { name: /Continue to payment/ }).click()
    await page.getByText('Confirm that everyone in your party').first().waitFor() // the age confirmation is required
    await page.getByLabel(/Everyone in my party is 21 or older/).check()
    await shot(page, 'booking-form')
    await page.getByRole('button', { name: /Continue to payment/ }).click()

    await page.waitForURL(`${inject('stripeUrl')}/pay/**`)
    await page.getByRole('heading', { name: 'Card details' }).waitFor()
    await shot(page, 'booking-payment-page')
    await page.getByLabel('Name on card').fill(guest.name)
    await page.getByLabel('Card number').fill('4242 4242 4242 4242') // Stripe docs: test card numbers
    await page.getByLabel('Expiry (MM/YY)').fill('12/34')
    await page.getByLabel('CVC').fill('123')
    await page.getByRole('button', { name: /^Pay / }).click()

    await page.waitForURL(/\/bookings\/\d+\?paid=1/)
    await page.getByRole('heading', { name: 'You\'re booked' }).waitFor({ timeout: 20_000 })
    reference = (await page.locator('[data-reference]').innerText()).trim()
    expect(reference).toMatch(/^[0-9A-HJKMNP-TV-Z]{10}$/)
    await shot(page, 'booking-confirmation')

    await page.goto('/bookings')
    await page.getByText(reference).first().waitFor()
    await shot(page, 'booking-my-bookings')
    await page.close()
  })

  it('reads well on a phone: the form, the confirmation and my bookings', { timeout: 60_000 }, async () => {
    const page = await phone.context.newPage()
    await signInThroughForm(page, guest.email, guest.password)
    await page.waitForURL('**/account')
    await page.goto(flightPath)
    await page.getByRole('link', { name: /^Book / }).first().click()
    await page.getByRole('heading', { name: 'Book your seats' }).waitFor()
    await shot(page, 'booking-form-phone')
    await page.goto('/bookings')
    await page.getByText(reference).first().waitFor()
    await shot(page, 'booking-my-bookings-phone')
    await page.getByRole('link', { name: 'Details' }).first().click()
    await page.getByRole('heading', { name: 'You\'re booked' }).waitFor()
    await shot(page, 'booking-confirmation-phone')
    await page.close()
  })

  it('shows the manager the guest\'s booking in the bookings view', { timeout: 60_000 }, async () => {
    const manager = await openBrowser()
    const page = await manager.context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
    await page.goto('/manage/bookings')
    await page.getByRole('heading', { name: 'Bookings', exact: true }).waitFor()
    await page.getByText(reference).waitFor()
    await shot(page, 'booking-manager-view')
    await manager.close()
  })
})
