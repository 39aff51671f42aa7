import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import sharp from 'sharp'
import { DateTime } from 'luxon'
import type { BrowserContext, Page } from 'playwright-core'
import { addPourByName, openBrowser, payWithTestCard, shot, signInThroughForm } from '../support/browser'
import { uniqueEmail } from '../support/http'
import { linkUrl, waitForMail } from '../support/mail'
import { withDb } from '../support/db'
import { inspectPdf } from '../support/pdf'
import { runTag } from '../support/labSheets'
import { DEMO_PASSWORD, DEMO_VENUE } from '../../server/demo/data'

/**
 * The whole chain, one role handing to the next, each asserted where the next role looks: a
 * manager invites a host and a marketer (both accept through the e-mailed links); the manager adds
 * products, builds and publishes a flight and schedules a session with the new host; the marketer
 * writes a note with a list and bold, an introduction and a photo, and publishes them; a guest on a
 * phone finds the flight (introduction, photo, formatted note), books, pays, gets the e-mail and
 * comes back; the host finds the party by its reference, seats it and prints the cards; the card
 * PDF carries the introduction and the note, one page per card.
 */
const PHONE = { width: 390, height: 844 } // a common phone viewport in CSS pixels (common practice, no source)
const TABLET = { width: 1024, height: 768 } // a common tablet viewport in CSS pixels (common practice, no source)

type Browser = { context: BrowserContext, close: () => Promise<void> }

const tag = runTag()
const host = { name: `Ilse Brandvold ${tag}`, email: uniqueEmail('journey-host'), password: 'journey-host-password' }
const marketer = { name: `Caspar Delorme ${tag}`, email: uniqueEmail('journey-marketing'), password: 'journey-marketing-password' }
const guest = { name: 'Wren Okafor', email: uniqueEmail('journey-guest'), password: 'journey-guest-password' }
const flightName = `Journey Flight ${tag}`
const products = [
  { code: `JY-A-${tag}`, name: `Kestrel Point Rosé ${tag}`, kind: 'still_wine', abv: '12.5', sugar: '3.1' },
  { code: `JY-B-${tag}`, name: `Lantern Reach Rye ${tag}`, kind: 'spirit', abv: '40', sugar: '0' },
]
const intro = `Two pours from the coast, chosen for the journey ${tag}.`
const noteWords = { bold: `wild strawberry ${tag}`, items: [`Pale salmon pink ${tag}`, `Dry finish ${tag}`] }

/** Accepts an e-mailed invitation in a fresh browser and returns it signed in. */
async function acceptInvitation(person: { email: string, password: string }, viewport = TABLET): Promise<Browser> {
  const browser = await openBrowser(viewport)
  const link = linkUrl(await waitForMail(person.email, /invited/), '/welcome')
  const page = await browser.context.newPage()
  await page.goto(link)
  await page.getByLabel('New password').fill(person.password)
  await page.getByRole('button', { name: 'Set my password' }).click()
  await page.waitForURL(u => u.pathname !== '/welcome')
  await page.close()
  return browser
}

async function invite(page: Page, person: { name: string, email: string }, role: string) {
  const form = page.locator('form', { has: page.getByRole('button', { name: 'Send invitation' }) })
  await form.getByLabel('Name').fill(person.name)
  await form.getByLabel('E-mail').fill(person.email)
  await form.getByLabel('Role').selectOption(role)
  await form.getByRole('button', { name: 'Send invitation' }).click()
  await page.getByText(`Invitation sent to ${person.email}`).waitFor()
}

describe('one journey from invitation to printed card', () => {
  let manager: Browser
  let hostBrowser: Browser
  let marketing: Browser
  let phone: Browser
  let flightId = 0
  let sessionId = 0
  let reference = ''

  beforeAll(async () => {
    manager = await openBrowser({ width: 1366, height: 1000 })
  })
  afterAll(async () => {
    for (const b of [manager, hostBrowser, marketing, phone]) await b?.close()
  })

  it('the manager invites a host and a marketer, who both join through the e-mailed links', { timeout: 90_000 }, async () => {
    const page = await manager.context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
    await page.goto('/manage/staff')
    await invite(page, host, 'host')
    await invite(page, marketer, 'marketing')
    hostBrowser = await acceptInvitation(host)
    marketing = await acceptInvitation(marketer)
    const hostPage = await hostBrowser.context.newPage()
    await hostPage.goto('/account')
    expect(await hostPage.evaluate(async () => (await (await fetch('/api/account')).json()).role)).toBe('host')
    await hostPage.close()
    await page.close()
  })

  it('the manager adds products, builds and publishes a flight and schedules a session with the new host', { timeout: 120_000 }, async () => {
    const page = await manager.context.newPage()
    for (const p of products) {
      await page.goto('/manage/products/new')
      await page.getByLabel('Code', { exact: true }).fill(p.code)
      await page.getByLabel('Name', { exact: true }).fill(p.name)
      await page.getByLabel('Kind').selectOption(p.kind)
      await page.getByLabel('Producer').fill('Journey Cellars')
      await page.getByLabel(/Serving temperature/).fill(p.kind === 'spirit' ? '64' : '50')
      await page.getByLabel(/Cost per bottle/).fill('18.50')
      await page.getByLabel(/ABV/).fill(p.abv)
      await page.getByLabel(/Residual sugar/).fill(p.sugar)
      await page.getByLabel('Lab', { exact: true }).fill('Harbour Lab')
      await page.getByLabel('Method', { exact: true }).fill('Ebulliometry')
      await page.getByRole('button', { name: 'Add the product' }).click()
      await page.waitForURL(/\/manage\/products\/\d+(\?.*)?$/)
    }

    await page.goto('/manage/flights/new')
    await page.getByLabel('Flight name').fill(flightName)
    for (const p of products) {
      await addPourByName(page, p.name)
    }
    await page.getByText('Per guest').waitFor()
    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.waitForURL(/\/manage\/flights\/\d+$/)
    flightId = Number(new URL(page.url()).pathname.split('/').pop())
    await page.getByRole('button', { name: 'Publish' }).click()
    await page.getByText('Published: guests can now see').waitFor()

    await page.goto('/manage/sessions')
    const form = page.locator('form', { has: page.getByRole('button', { name: /^Schedule/ }) })
    await form.getByLabel('Flight').selectOption({ label: (await form.getByLabel('Flight').locator('option', { hasText: flightName }).innerText()).trim() })
    await form.getByLabel('First date').fill(DateTime.now().setZone(DEMO_VENUE.timeZone).plus({ days: 3 }).toISODate()!)
    await form.getByLabel('Start time').fill('15:30')
    await form.getByLabel('Host').selectOption({ label: host.name })
    await form.getByRole('button', { name: /^Schedule/ }).click()
    await page.getByText(/^Session scheduled: /).first().waitFor()
    sessionId = await withDb(async (c) => {
      const [rows] = await c.query('SELECT id FROM tasting_sessions WHERE flight_id = ? ORDER BY id DESC LIMIT 1', [flightId])
      return (rows as { id: number }[])[0]!.id
    })
    expect(sessionId).toBeGreaterThan(0)
    await shot(page, 'journey-manager-sessions')
    await page.close()
  })

  it('the marketer writes a note with a list and bold, an introduction and a photo, and publishes them', { timeout: 90_000 }, async () => {
    const page = await marketing.context.newPage()
    await page.goto('/manage/content')
    await page.getByRole('link', { name: new RegExp(products[0]!.name) }).click()
    await page.getByLabel('Text (Markdown)').fill(`A rosé for the **${noteWords.bold}** in it.\n\n- ${noteWords.items[0]}\n- ${noteWords.items[1]}\n`)
    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.getByText('Draft saved.').waitFor()
    await page.getByRole('button', { name: 'Publish' }).click()
    await page.getByText('Published: guests').waitFor()
    const png = await sharp({ create: { width: 600, height: 800, channels: 3, background: '#e7b9a8' } }).png().toBuffer()
    await page.getByLabel(/^Image \(JPEG, PNG or WebP/).setInputFiles({ name: 'rose-bottle.png', mimeType: 'image/png', buffer: png })
    await page.getByLabel('Describe it (for screen readers)').fill(`The ${products[0]!.name} bottle`)
    await page.getByRole('button', { name: 'Upload' }).click()
    await page.getByText('Uploaded.').waitFor()

    await page.goto('/manage/content')
    await page.getByRole('link', { name: new RegExp(flightName) }).click()
    await page.getByLabel('Text (Markdown)').fill(intro)
    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.getByText('Draft saved.').waitFor()
    await page.getByRole('button', { name: 'Publish' }).click()
    await page.getByText('Published: guests').waitFor()
    await page.close()
  })

  it('a guest on a phone finds the flight with its introduction, photo and formatted note, books, pays and gets the e-mail', { timeout: 120_000 }, async () => {
    phone = await openBrowser(PHONE)
    const page = await phone.context.newPage()
    await page.goto('/flights')
    await page.getByRole('link', { name: flightName }).first().click()
    await page.waitForURL(`**/flights/${flightId}`)
    await page.getByText(intro).waitFor()
    const photo = page.getByRole('img', { name: `The ${products[0]!.name} bottle` }).first()
    await photo.scrollIntoViewIfNeeded()
    await expect.poll(() => photo.evaluate(img => (img as HTMLImageElement).naturalWidth)).toBeGreaterThan(0)
    await page.locator('strong', { hasText: noteWords.bold }).first().waitFor()
    for (const item of noteWords.items) await page.locator('li', { hasText: item }).first().waitFor()
    await shot(page, 'journey-guest-flight-phone')

    await page.getByRole('link', { name: /^Book / }).first().click()
    await page.waitForURL(/\/signin\?redirect=/)
    await page.getByRole('link', { name: 'New here? Create an account' }).click()
    await page.getByLabel('Your name').fill(guest.name)
    await page.getByLabel('E-mail').fill(guest.email)
    await page.getByLabel('Password').fill(guest.password)
    await page.getByLabel('Date of birth').fill('1991-03-08')
    await page.getByRole('button', { name: 'Create my account' }).click()
    await page.getByText('Check your e-mail').waitFor()
    // The guest opens the link in the e-mail, which confirms the address and brings them back to the session.
    await page.goto(linkUrl(await waitForMail(guest.email, /Confirm your e-mail address/), '/verify-email'))
    await page.getByRole('button', { name: 'Confirm my address' }).click()
    await page.waitForURL(`**/book/${sessionId}`)
    await page.getByLabel('Guests in your party').selectOption('2')
    await page.getByLabel('Phone').fill('+1 207 555 0167')
    await page.getByLabel(/Everyone in my party is 21 or older/).check()
    await page.getByRole('button', { name: /Continue to payment/ }).click()
    await page.waitForURL(`${inject('stripeUrl')}/pay/**`)
    await payWithTestCard(page, guest.name)
    await page.waitForURL(/\/bookings\/\d+\?paid=1/)
    await page.getByRole('heading', { name: 'You\'re booked' }).waitFor({ timeout: 20_000 })
    reference = (await page.locator('[data-reference]').innerText()).trim()

    const mail = await waitForMail(guest.email, /Booking confirmed/)
    expect(mail.text).toContain(reference)
    expect(mail.text).toContain(flightName)

    // The guest comes back later: the booking is on their list.
    await page.goto('/bookings')
    await page.getByText(reference).first().waitFor()
    await shot(page, 'journey-guest-bookings-phone')
    await page.close()
  })

  it('the host finds the party by its reference, seats it and prints the cards, which carry the introduction and the note, one page per card', { timeout: 120_000 }, async () => {
    // The session is today, about to begin (moved in the database, as the host tests do): ten
    // minutes from now, or five minutes ago when ten minutes from now would be tomorrow in the venue.
    const soon = DateTime.now().setZone(DEMO_VENUE.timeZone).plus({ minutes: 10 })
    const start = soon.hasSame(DateTime.now().setZone(DEMO_VENUE.timeZone), 'day') ? soon : soon.minus({ minutes: 15 })
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [start.toUTC().toJSDate(), sessionId]))
    const page = await hostBrowser.context.newPage()
    await page.goto('/host')
    // The guest reads the reference aloud in two halves; the host types it in lower case.
    await page.getByLabel('Booking reference').fill(`${reference.slice(0, 5)} ${reference.slice(5)}`.toLowerCase())
    await page.getByRole('button', { name: 'Find', exact: true }).click()
    const row = page.locator('li[data-found]', { hasText: guest.name })
    await row.waitFor()
    await row.getByRole('button', { name: 'Arrived' }).click()
    for (const label of ['Guest 1', 'Guest 2']) await row.getByLabel(label).check()
    await row.getByRole('button', { name: 'Seat 2 guests' }).click()
    await row.getByText('Seated 2 of 2').waitFor()

    const panel = page.locator('section.panel').filter({ hasText: flightName })
    await panel.getByRole('button', { name: 'Print all cards' }).click()
    const link = panel.getByRole('link', { name: /Download 2 cards/ })
    await link.waitFor({ timeout: 45_000 })
    const href = await link.getAttribute('href')
    const pdf = Buffer.from(await (await page.context().request.get(href!)).body())
    const card = inspectPdf(pdf, 'journey-card-page-1')
    expect(card.pages, 'one page per seated guest').toBe(2)
    const flat = card.raw.replace(/\s+/g, ' ')
    expect(flat).toContain(intro.replace(/\s+/g, ' '))
    expect(flat).toContain(noteWords.bold)
    for (const item of noteWords.items) expect(flat).toContain(item)
    expect(card.pageText(1)).toContain(products[0]!.name)
    await shot(page, 'journey-host-day')
    await page.close()
  })
})
