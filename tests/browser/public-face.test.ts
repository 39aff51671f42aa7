import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Locator, Page } from 'playwright-core'
import { openBrowser, shot, signInThroughForm } from '../support/browser'
import { allProducts, Client } from '../support/http'
import { signedIn } from '../support/people'
import { demoFlightId } from '../support/booking'
import { DEMO_PASSWORD, DEMO_VENUE } from '../../server/demo/data'
import { formatDay, formatTime } from '../../shared/dates'
import { formatMoney } from '../../shared/money'
import type { PublishedFlight, FlightView } from '../../shared/types/flights'

/**
 * The venue's public face in a browser: the home page sells the room on a phone (a photo, the
 * flight on sale with its price and next date, nothing wider than the screen), the flight page
 * shows marketing's introduction, photos and notes, and the header works on a phone (a menu
 * button, Escape, focus) and marks the current page on every width.
 */
const PHONE = { width: 375, height: 812 } // a small current phone in CSS pixels (common practice, no source)
const DESKTOP = { width: 1280, height: 900 }
const clock = { timeZone: DEMO_VENUE.timeZone, locale: DEMO_VENUE.locale }

async function loaded(img: Locator): Promise<number> {
  await img.scrollIntoViewIfNeeded()
  await expect.poll(() => img.evaluate(i => (i as HTMLImageElement).complete && (i as HTMLImageElement).naturalWidth)).toBeGreaterThan(0)
  return img.evaluate(i => (i as HTMLImageElement).naturalWidth)
}

/** The page is no wider than the screen: nothing to scroll sideways. */
async function fitsWidth(page: Page) {
  const { scroll, inner } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, inner: window.innerWidth }))
  expect(scroll, 'the page scrolls sideways').toBeLessThanOrEqual(inner)
}

describe('on a phone', () => {
  let phone: { context: BrowserContext, close: () => Promise<void> }
  beforeAll(async () => { phone = await openBrowser(PHONE) })
  afterAll(async () => phone.close())

  it('the home page shows the room\'s photo and the flight on sale with its price and next date', async () => {
    const flights = (await new Client().get('/api/flights/published')).body as PublishedFlight[]
    const flight = flights.find(f => f.name === 'Shoreline Flight')!
    const next = flight.nextSessions[0]!
    const page = await phone.context.newPage()
    await page.goto('/')
    const hero = page.getByRole('img', { name: /tasting bar/ })
    expect(await loaded(hero)).toBeGreaterThan(0)
    const box = (await hero.boundingBox())!
    expect(box.width).toBeGreaterThan(PHONE.width * 0.9)
    expect(box.x + box.width).toBeLessThanOrEqual(PHONE.width + 0.5)

    const card = page.getByRole('article').filter({ has: page.getByRole('heading', { name: flight.name }) })
    await card.scrollIntoViewIfNeeded()
    await expect.poll(() => card.isVisible()).toBe(true)
    const text = await card.innerText()
    expect(text).toContain(`From ${formatMoney(flight.priceFromMinor!, 'USD', DEMO_VENUE.locale)} per guest`)
    expect(text).toContain(`${formatDay(next.startsAt, clock)} · ${formatTime(next.startsAt, clock)}`)
    expect(text).toMatch(/seats? left|Full/)
    expect(await card.getByRole('link', { name: /^Book / }).count()).toBeGreaterThan(0)
    expect(await loaded(card.getByRole('img').first())).toBeGreaterThan(0) // the flight's line-up
    await fitsWidth(page)
    await page.evaluate(() => window.scrollTo(0, 0))
    await shot(page, 'public-home-phone')
    await page.close()
  })

  it('the menu button opens and closes the links, by click and by Escape, and marks the current page', async () => {
    const page = await phone.context.newPage()
    await page.goto('/flights')
    const nav = page.getByRole('navigation', { name: 'Main' })
    const button = nav.getByRole('button', { name: 'Menu' })
    const panel = page.locator(`#${await button.getAttribute('aria-controls')}`)
    const flightsLink = nav.getByRole('link', { name: 'Flights', exact: true })
    // One row: the mark and the button side by side, the links hidden.
    const mark = (await nav.getByRole('link', { name: DEMO_VENUE.name }).boundingBox())!
    const btn = (await button.boundingBox())!
    expect(Math.abs((mark.y + mark.height / 2) - (btn.y + btn.height / 2))).toBeLessThan(4)
    expect(await button.getAttribute('aria-expanded')).toBe('false')
    expect(await panel.isVisible()).toBe(false)
    expect(await flightsLink.isVisible()).toBe(false)

    await button.click()
    expect(await button.getAttribute('aria-expanded')).toBe('true')
    await flightsLink.waitFor()
    expect(await flightsLink.getAttribute('aria-current')).toBe('page')
    expect(await nav.getByRole('link', { name: 'Articles' }).getAttribute('aria-current')).toBeNull()
    // Focus moves into the menu, to its first link.
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Flights')
    await shot(page, 'public-menu-open-phone')
    await fitsWidth(page)

    await page.keyboard.press('Escape')
    expect(await button.getAttribute('aria-expanded')).toBe('false')
    expect(await panel.isVisible()).toBe(false)
    expect(await button.evaluate(b => b === document.activeElement)).toBe(true)

    // The keyboard alone: Enter opens it, the button closes it again.
    await page.keyboard.press('Enter')
    expect(await button.getAttribute('aria-expanded')).toBe('true')
    await button.click()
    expect(await button.getAttribute('aria-expanded')).toBe('false')
    expect(await panel.isVisible()).toBe(false)

    // A link in it takes the guest there and closes it; the new page is the current one.
    await button.click()
    await nav.getByRole('link', { name: 'Articles' }).click()
    await page.waitForURL('**/articles')
    await expect.poll(() => button.getAttribute('aria-expanded')).toBe('false')
    await button.click()
    await expect.poll(() => nav.getByRole('link', { name: 'Articles' }).getAttribute('aria-current')).toBe('page')
    expect(await flightsLink.getAttribute('aria-current')).toBeNull()
    await page.close()
  })

  it('a flight page marks Flights as the current section and fits the screen', async () => {
    const page = await phone.context.newPage()
    await page.goto(`/flights/${await demoFlightId()}`)
    await page.getByRole('heading', { level: 1, name: 'Shoreline Flight' }).waitFor()
    await page.getByRole('button', { name: 'Menu' }).click()
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Flights', exact: true }).getAttribute('aria-current')).toBe('page')
    await page.keyboard.press('Escape')
    await fitsWidth(page)
    await shot(page, 'public-flight-phone')
    await page.close()
  })

  it('a note with a long word or address wraps inside its pour instead of widening the page', async () => {
    const manager = await signedIn('manager')
    const marketing = await signedIn('marketing')
    const product = await manager.post('/api/products', {
      code: `LW-${Date.now() % 100000}`, kind: 'still_wine', name: 'Longword Riesling', producer: 'Invented Cellars', vintageOrBatch: '2025', servingTempC: 9,
      allergens: ['sulfites'], bottleSizeMl: 750, costPerBottleMinor: 1000,
      measurement: { abvPctVol: 11, residualSugarGL: 12, lab: 'Test lab', method: 'Test method', measuredOn: '2026-10-01' },
    })
    expect(product.status, JSON.stringify(product.body)).toBe(201)
    const note = `Ask for https://example.test/${'a'.repeat(70)} and Rieslingweinbergslagenbezeichnungsverordnung.`
    expect((await marketing.request('PUT', `/api/content/product_note/${product.body.id}`, { body: note })).status).toBe(200)
    expect((await marketing.post(`/api/content/product_note/${product.body.id}/publish`)).status).toBe(200)
    const glass = ((await manager.get('/api/glasses')).body as { id: number }[])[0]!.id
    const red = ((await allProducts(manager)) as { id: number, code: string }[]).find(p => p.code === 'SV-CF-23')!.id
    const pours = [product.body.id, red].map(productId => ({ productId, volumeMl: 60, glassId: glass, servingTempC: 12 }))
    const flight = await manager.post('/api/flights', { name: `Long words ${Date.now()}`, summary: 'Two pours', pours })
    expect(flight.status, JSON.stringify(flight.body)).toBe(201)
    const published = await manager.post(`/api/flights/${flight.body.id}/publish`)
    expect(published.status, JSON.stringify(published.body)).toBe(200)
    const page = await phone.context.newPage()
    await page.goto(`/flights/${flight.body.id}`)
    await page.getByText('Rieslingweinbergslagen', { exact: false }).waitFor()
    await fitsWidth(page)
    await page.close()
  })
})

describe('on a wide screen', () => {
  let desk: { context: BrowserContext, close: () => Promise<void> }
  beforeAll(async () => { desk = await openBrowser(DESKTOP) })
  afterAll(async () => desk.close())

  it('the flight page shows the introduction, the photos and the notes marketing published', async () => {
    const id = await demoFlightId()
    const flight = (await new Client().get(`/api/flights/${id}`)).body as FlightView
    expect(flight.intro, 'the demo flight has an introduction').not.toBeNull()
    const page = await desk.context.newPage()
    await page.goto(`/flights/${id}`)
    const main = page.getByRole('main')
    const firstLine = flight.intro!.text.split('\n')[0]!
    await main.getByText(firstLine).waitFor()
    for (const p of flight.pours) {
      expect(p.tastingNote, `${p.product.name} has a note`).not.toBeNull()
      expect(p.photo, `${p.product.name} has a photo`).not.toBeNull()
      const pour = main.getByRole('listitem').filter({ has: page.getByRole('heading', { name: new RegExp(p.product.name) }) })
      expect(await pour.innerText()).toContain(p.tastingNote!.text.split('\n')[0]!.replace(/\*\*/g, ''))
      expect(await loaded(pour.getByRole('img', { name: p.photo!.altText }))).toBeGreaterThan(0)
    }
    await page.evaluate(() => window.scrollTo(0, 0))
    await shot(page, 'public-flight-desktop')
    await page.close()
  })

  it('the header is one row with the current page marked; the home page shows the photo and the flight', async () => {
    const page = await desk.context.newPage()
    await page.goto('/')
    const nav = page.getByRole('navigation', { name: 'Main' })
    expect(await nav.getByRole('button', { name: 'Menu' }).isVisible()).toBe(false)
    const tops = await nav.getByRole('link').evaluateAll(links => links.map(l => Math.round(l.getBoundingClientRect().top + l.getBoundingClientRect().height / 2)))
    expect(new Set(tops).size, 'every header link on one line').toBe(1)
    expect(await loaded(page.getByRole('img', { name: /tasting bar/ }))).toBeGreaterThan(0)
    await page.getByRole('article').filter({ has: page.getByRole('heading', { name: 'Shoreline Flight' }) }).waitFor()
    await shot(page, 'public-home-desktop')
    await nav.getByRole('link', { name: 'In your glass' }).click()
    await page.waitForURL('**/glass')
    await expect.poll(() => nav.getByRole('link', { name: 'In your glass' }).getAttribute('aria-current')).toBe('page')
    expect(await nav.getByRole('link', { name: 'Flights', exact: true }).getAttribute('aria-current')).toBeNull()
    await page.close()
  })

  it('staff get their role\'s sections in one bar, the section being shown marked', async () => {
    const page = await desk.context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
    const nav = page.getByRole('navigation', { name: 'Main' })
    const sections = nav.getByRole('listitem').getByRole('link')
    expect(await sections.count()).toBe(11)
    expect(await nav.getByRole('link', { name: 'Seen in the glass' }).getAttribute('href')).toBe('/manage/observations')
    const tops = await sections.evaluateAll(links => links.map(l => Math.round(l.getBoundingClientRect().top)))
    expect(new Set(tops).size, 'the sections in one bar').toBe(1)
    expect(await nav.getByRole('link', { name: 'Overview' }).getAttribute('aria-current')).toBe('page')
    await nav.getByRole('link', { name: 'Products' }).click()
    await page.waitForURL('**/manage/products')
    await page.getByRole('table', { name: 'Products' }).getByRole('link').first().click()
    await page.waitForURL(/\/manage\/products\/\d+$/)
    await expect.poll(() => nav.getByRole('link', { name: 'Products' }).getAttribute('aria-current')).toBe('page')
    expect(await nav.getByRole('link', { name: 'Overview' }).getAttribute('aria-current')).toBeNull()
    await shot(page, 'staff-bar-desktop')
    await page.close()
  })
})
