import { mkdirSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { DateTime } from 'luxon'
import { SHOTS_DIR, openBrowser, payWithTestCard, shot, showCurveChart, signInThroughForm } from '../support/browser'
import { Client, uniqueEmail } from '../support/http'
import { withDb } from '../support/db'
import { linkUrl, waitForMail } from '../support/mail'
import { bookingBody, checkoutIdOf, demoFlightId, newGuest, newSession, payCheckout, signedIn, waitForState } from '../support/booking'
import { DEMO_PASSWORD, DEMO_VENUE } from '../../server/demo/data'
import { formatMoney } from '../../shared/money'

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
    await showCurveChart(page)
    await page.evaluate(() => window.scrollTo(0, 0))
    await shot(page, 'booking-flight-desktop')
    await page.close()

    const small = await phone.context.newPage()
    await small.goto(flightPath)
    await small.getByRole('heading', { name: 'Next sessions' }).waitFor()
    await showCurveChart(small)
    await small.evaluate(() => window.scrollTo(0, 0))
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
    const bookPath = new URL(page.url()).searchParams.get('redirect')!
    await page.getByRole('button', { name: 'Create my account' }).click()
    await page.getByText('Check your e-mail').waitFor()
    await shot(page, 'booking-signup-check-email')

    // Signed in before confirming the address, the booking page says what to do instead of the form.
    await signInThroughForm(page, guest.email, guest.password)
    await page.waitForURL('**/account')
    await page.goto(bookPath)
    await page.getByRole('heading', { name: 'Confirm your e-mail address to book' }).waitFor()
    expect(await page.getByRole('button', { name: /Continue to payment/ }).count()).toBe(0)
    await shot(page, 'booking-confirm-address')

    // The link in the e-mail confirms the address and brings the guest back to the session they chose.
    await page.goto(linkUrl(await waitForMail(guest.email, /Confirm your e-mail address/), '/verify-email'))
    await page.getByRole('button', { name: 'Confirm my address' }).click()
    await page.waitForURL(`**${bookPath}`)
    await page.getByRole('heading', { name: 'Book your seats' }).waitFor()
    await page.getByText(`We send the confirmation and your door code to ${guest.email}`).waitFor()

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
    await payWithTestCard(page, guest.name)

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

describe('on a phone: going back from the payment page, the cut-off, the sessions list', () => {
  let phone: { context: BrowserContext, close: () => Promise<void> }
  let manager: Client
  const GUEST_PASSWORD = 'guest-password-1' // what newGuest signs up with

  beforeAll(async () => {
    phone = await openBrowser(PHONE)
    manager = await signedIn('manager@saltmarsh.test')
  })
  afterAll(async () => { await phone.close() })

  /** A new guest signed in on a phone of their own (a browser profile each, so no cookie is shared). */
  async function guestPage(tag: string): Promise<{ page: Page, guest: Awaited<ReturnType<typeof newGuest>>, close: () => Promise<void> }> {
    const guest = await newGuest(tag)
    const browser = await openBrowser(PHONE)
    const page = await browser.context.newPage()
    await signInThroughForm(page, guest.email, GUEST_PASSWORD)
    await page.waitForURL('**/account')
    return { page, guest, close: browser.close }
  }
  const rowsOf = (sessionId: number) => withDb(async (c) => {
    const [rows] = await c.query('SELECT id, state, party_size AS partySize FROM bookings WHERE session_id = ?', [sessionId])
    return rows as { id: number, state: string, partySize: number }[]
  })

  it('Back from the payment page resumes the same hold: party, phone, time to pay, and "Continue paying" opens the same checkout', { timeout: 90_000 }, async () => {
    const session = await newSession(manager, { seats: 6 })
    const { page, guest, close } = await guestPage('back-resume')
    await page.goto(`/book/${session.id}`)
    await page.getByRole('heading', { name: 'Book your seats' }).waitFor()
    await page.getByLabel('Guests in your party').selectOption('3')
    await page.getByLabel('Phone').fill('+1 207 555 0177')
    await page.getByLabel(/Everyone in my party is 21 or older/).check()
    await page.getByRole('button', { name: /Continue to payment/ }).click()
    await page.waitForURL(`${inject('stripeUrl')}/pay/**`)
    await page.getByRole('heading', { name: 'Card details' }).waitFor()
    const checkoutUrl = page.url()

    await page.goBack()
    await page.waitForURL(`**/book/${session.id}`)
    const held = page.getByRole('region', { name: /Your seats are held/ })
    await held.waitFor()
    await expect.poll(() => held.innerText()).toMatch(/3 guests/)
    expect(await held.innerText()).toContain('+1 207 555 0177')
    expect(await held.innerText()).toContain(guest.email)
    expect(await held.innerText()).toMatch(/\d+ minutes? left to pay/)
    expect(await page.getByRole('button', { name: /Continue to payment/ }).count()).toBe(0)
    // The aside counts this hold among the seats taken: 3 of 6 left, not the 6 of before.
    await expect.poll(() => page.getByText('3 of 6').count()).toBe(1)
    await shot(page, 'booking-resumed-hold-phone')
    expect(await rowsOf(session.id)).toHaveLength(1)

    await page.getByRole('link', { name: /Continue paying/ }).click()
    await page.waitForURL(`${inject('stripeUrl')}/pay/**`)
    expect(page.url()).toBe(checkoutUrl)
    expect(await rowsOf(session.id)).toHaveLength(1)

    // Back once more, then change the booking: the seats go back and the form opens with what was typed.
    await page.goBack()
    await held.waitFor()
    await page.getByRole('button', { name: /Change the booking/ }).click()
    await page.getByRole('button', { name: /Continue to payment/ }).waitFor()
    expect(await page.getByLabel('Guests in your party').inputValue()).toBe('3')
    expect(await page.getByLabel('Phone').inputValue()).toBe('+1 207 555 0177')
    await expect.poll(() => page.getByText('6 of 6').count()).toBe(1)
    expect((await rowsOf(session.id)).map(r => r.state)).toEqual(['expired'])
    await close()
  })

  it('a page the browser restores from its back-forward cache looks again: no stale seats, no stale form', { timeout: 60_000 }, async () => {
    const session = await newSession(manager, { seats: 6 })
    const { page, guest, close } = await guestPage('bfcache')
    await page.goto(`/book/${session.id}`)
    await page.getByRole('button', { name: /Continue to payment/ }).waitFor()
    expect(await page.getByText('6 of 6').count()).toBe(1)
    // Meanwhile, in another tab, the same guest holds 2 seats of this session.
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    expect(res.status).toBe(201)
    // The event a restored page gets (HTML Living Standard, "pageshow" with persisted = true).
    await page.evaluate(() => window.dispatchEvent(new PageTransitionEvent('pageshow', { persisted: true })))
    await page.getByRole('region', { name: /Your seats are held/ }).waitFor()
    await expect.poll(() => page.getByText('4 of 6').count()).toBe(1)
    await close()
  })

  it('"Give the seats back" ends with the guest\'s own reason and nothing charged', { timeout: 60_000 }, async () => {
    const session = await newSession(manager, { seats: 6 })
    const { page, guest, close } = await guestPage('gives-back-page')
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    await page.goto(`/bookings/${res.body.booking.id}`)
    await page.getByRole('button', { name: 'Give the seats back' }).click()
    await page.getByText('You gave the seats back before paying, so nothing was charged.').waitFor()
    expect(await page.getByText(/not paid for in time/).count()).toBe(0)
    await shot(page, 'booking-seats-given-back-phone')
    await close()
  })

  it('states the cut-off of this session before paying: when it closes, or that it has closed, with the venue to contact', { timeout: 60_000 }, async () => {
    const later = await newSession(manager, { hoursAhead: DEMO_VENUE.cancellationCutoffHours + 5 })
    const soon = await newSession(manager, { hoursAhead: 5 })
    const { page, close } = await guestPage('cutoff-shown')
    await page.goto(`/book/${later.id}`)
    const cut = DateTime.fromISO(later.startsAt).minus({ hours: DEMO_VENUE.cancellationCutoffHours }).setZone(DEMO_VENUE.timeZone).setLocale('en-US')
    const total = page.locator('[data-total-panel]')
    await expect.poll(() => total.innerText()).toMatch(new RegExp(`Online cancellation closes at ${cut.toFormat('ccc, LLL d')}, ${cut.toFormat('h:mm a').replace(/\s/g, '\\s')} E[DS]T, that is in [56] hours\\.`))
    await page.getByLabel('Guests in your party').selectOption('2')
    await shot(page, 'booking-form-cutoff-open-phone')
    await total.screenshot({ path: resolve(SHOTS_DIR, 'booking-form-cutoff-open-total.png') })

    await page.goto(`/book/${soon.id}`)
    await expect.poll(() => total.innerText()).toContain('Online cancellation for this session has already closed: this booking cannot be cancelled online.')
    expect(await total.innerText()).toContain(DEMO_VENUE.phone)
    expect(await total.innerText()).toContain(DEMO_VENUE.email)
    await shot(page, 'booking-form-cutoff-closed-phone')
    await total.screenshot({ path: resolve(SHOTS_DIR, 'booking-form-cutoff-closed-total.png') })
    await close()
  })

  it('the flight page shows more dates on request, and no "no sessions" line while there are some', { timeout: 60_000 }, async () => {
    for (let i = 0; i < 5; i++) await newSession(manager, { hoursAhead: 24 * (20 + i) })
    const page = await phone.context.newPage()
    const flightId = await demoFlightId()
    await page.goto(`/flights/${flightId}`)
    const list = page.getByRole('complementary').getByRole('listitem')
    await page.getByRole('heading', { name: 'Next sessions' }).waitFor()
    expect(await list.count()).toBe(4)
    const more = page.getByRole('button', { name: /^Show \d+ more dates?$/ })
    const hidden = Number(/\d+/.exec(await more.innerText())![0])
    expect(hidden).toBeGreaterThanOrEqual(5)
    // The page came with the next six; the others are asked for on the click.
    const [answer] = await Promise.all([page.waitForResponse(r => /\/api\/flights\/\d+\/sessions$/.test(new URL(r.url()).pathname)), more.click()])
    expect(answer.status()).toBe(200)
    await expect.poll(() => list.count()).toBe(4 + hidden)
    expect(await more.count()).toBe(0)
    expect(await page.getByText('No sessions are open for booking right now.').count()).toBe(0)
    // "From" is the lowest price a guest can book, as the home page's card says it.
    const published = ((await new Client().get('/api/flights/published')).body as { id: number, priceFromMinor: number | null }[]).find(f => f.id === flightId)!
    expect(published.priceFromMinor).not.toBeNull()
    expect(await page.getByText(/^From .+ per guest$/).innerText()).toBe(`From ${formatMoney(published.priceFromMinor!, 'USD', DEMO_VENUE.locale)} per guest`)
    await page.close()
  })

  it('the confirmation e-mail, as a mail program shows it', { timeout: 60_000 }, async () => {
    const session = await newSession(manager, { hoursAhead: DEMO_VENUE.cancellationCutoffHours + 30 })
    const guest = await newGuest('mail-shown')
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    expect((await payCheckout(checkoutIdOf(res.body.checkoutUrl))).status).toBe(200)
    await waitForState(res.body.booking.id, 'confirmed')
    const mail = await waitForMail(guest.email, /Booking confirmed/)
    // The fake's HTML view: the part as received, its cid: image turned into a data: URL by the parser.
    const html = await (await fetch(`${inject('mailUrl')}/messages/${mail.id}/html`)).text()
    const dir = resolve(SHOTS_DIR, '../mail')
    mkdirSync(dir, { recursive: true })
    const file = resolve(dir, 'confirmation.html')
    writeFileSync(file, html)
    for (const [name, viewport] of [['booking-email-confirmation-phone', PHONE], ['booking-email-confirmation-desktop', { width: 1000, height: 900 }]] as const) {
      const viewer = await openBrowser(viewport)
      const page = await viewer.context.newPage()
      await page.goto(`file://${file}`)
      await page.getByText(res.body.booking.reference).first().waitFor()
      const qr = page.locator('img[alt*="QR"]')
      expect(await qr.evaluate(img => (img as HTMLImageElement).naturalWidth)).toBeGreaterThan(100)
      await shot(page, name)
      await viewer.close()
    }
  })
})
