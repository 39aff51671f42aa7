import { mkdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Locator, Page, Request } from 'playwright-core'
import { SHOTS_DIR, openBrowser, shot, showCurveChart, signInThroughForm } from '../support/browser'
import { Client } from '../support/http'
import { demoFlightId } from '../support/booking'
import { DEMO_PASSWORD, DEMO_PRODUCTS } from '../../server/demo/data'
import { LIQUID_COLOUR_FILL } from '../../shared/liquidColours'
import type { PourPage } from '../../shared/types/cards'
import type { FlightView } from '../../shared/types/flights'
import type { ProductPage, ProductView } from '../../shared/types/products'

/**
 * What a guest reads about the glass: the pour page a card's QR code opens shows the API's own
 * ranges and the room they assume; the strongest pour that runs tears shows slower ones than the
 * table wines; the public page's humidity choice redraws the curve for that room; and the
 * builder's rows carry the same figures. Screenshots at a laptop's and a phone's width.
 */

type Range = { low: number, high: number }

/** "5.4–16 mm" → { low: 5.4, high: 16 }; "about 9 mm" → { low: 9, high: 9 }. */
function parseRange(text: string): Range {
  const t = text.replace(/\s+/g, ' ').trim()
  const pair = /(\d+(?:\.\d+)?)–(\d+(?:\.\d+)?)/.exec(t)
  if (pair) return { low: Number(pair[1]), high: Number(pair[2]) }
  const one = /about (\d+(?:\.\d+)?)/.exec(t)
  if (!one) throw new Error(`no range in "${text}"`)
  return { low: Number(one[1]), high: Number(one[1]) }
}

/** A range printed to 2 significant figures is within 5 % of the API's (rounding, common practice, no source). */
function expectShown(shown: Range, api: Range, what: string) {
  expect(Math.abs(shown.low - api.low) / api.low, `${what} low`).toBeLessThanOrEqual(0.05)
  expect(Math.abs(shown.high - api.high) / api.high, `${what} high`).toBeLessThanOrEqual(0.05)
}

const figure = (page: Page, key: string) => page.locator(`[data-figure="${key}"] dd`).first()
const fahrenheit = (c: number) => Math.round((c * 9) / 5 + 32) // °F = °C × 9/5 + 32 (definition)

/** Every label inside the diagram's SVG lies inside its viewBox (real font metrics, so nothing clips). */
async function labelsInside(svg: Locator): Promise<string[]> {
  return svg.evaluate((el) => {
    const s = el as SVGSVGElement
    const v = s.viewBox.baseVal
    const out: string[] = []
    for (const t of Array.from(s.querySelectorAll('text'))) {
      const b = t.getBBox()
      if (b.x < v.x - 0.01 || b.y < v.y - 0.01 || b.x + b.width > v.x + v.width + 0.01 || b.y + b.height > v.y + v.height + 0.01) out.push(t.textContent ?? '')
    }
    return out
  })
}

async function elementShot(target: Locator, name: string) {
  mkdirSync(SHOTS_DIR, { recursive: true })
  await target.screenshot({ path: resolve(SHOTS_DIR, `${name}.png`) })
}

describe('the guest\'s pages show the model\'s ranges', () => {
  let flightId: number
  let pages: PourPage[]
  beforeAll(async () => {
    flightId = await demoFlightId()
    const anon = new Client()
    const flight = await anon.get<FlightView>(`/api/flights/${flightId}`)
    expect(flight.status).toBe(200)
    pages = []
    for (const p of flight.body.pours) {
      const res = await anon.get<PourPage>(`/api/flights/${flightId}/pours/${p.position}`)
      expect(res.status).toBe(200)
      pages.push(res.body)
    }
    expect(pages.length).toBeGreaterThanOrEqual(4)
  })

  it('a pour page shows the API\'s band and speed ranges, the same as its text, and the room they assume', async () => {
    const wine = pages.find(p => p.pour.kind === 'Still wine' && p.pour.prediction.tearsExpected && p.pour.prediction.bandVisible)!
    expect(wine).toBeTruthy()
    const { ranges } = wine.pour.prediction
    for (const [width, name] of [[1280, 'pour-page-ranges'], [375, 'pour-page-ranges-phone']] as const) {
      const { context, close } = await openBrowser({ width, height: 900 })
      const page = await context.newPage()
      await page.goto(`/pour/${flightId}/${wine.pour.position}`)
      await page.getByRole('heading', { name: /^In the / }).waitFor()
      const band = await figure(page, 'band').innerText()
      const speed = await figure(page, 'speed').innerText()
      expectShown(parseRange(band), ranges.clearBandHeight_mm!, 'band')
      expectShown(parseRange(speed), ranges.tearFallSpeed_mm_s!, 'speed')
      expectShown(parseRange(await figure(page, 'onset').innerText()), ranges.tearOnset_s!, 'onset')
      expectShown(parseRange(await figure(page, 'show').innerText()), ranges.swirlShow_s!, 'curtain')
      // The words under "What to look for" (describePour, from the API) print the same figures.
      const words = wine.description.join(' ').replace(/\s+/g, ' ')
      expect(words).toContain(band.replace(/\s+/g, ' '))
      expect(words).toContain(speed.replace(/\s+/g, ' '))
      // The room: the film's own input, in the venue's unit (the demo venue writes °F).
      const room = (await page.locator('[data-room]').first().innerText()).replace(/\s+/g, ' ')
      expect(room).toContain(`${Math.round(wine.room.relativeHumidityPct)} % humidity`)
      expect(room).toContain(`${fahrenheit(wine.room.airTempC)} °F`)
      // The diagram's band label carries the range, and no label runs outside the drawing.
      const svg = page.locator('figure svg[data-show="band"]').first()
      expect((await svg.locator('text').allTextContents()).join(' ').replace(/\s+/g, ' ')).toContain(band.replace(/\s+/g, ' '))
      expect(await labelsInside(svg)).toEqual([])
      const box = (await svg.boundingBox())!
      expect(box.x + box.width).toBeLessThanOrEqual(width)
      // The index as a range, not one number.
      const index = parseRange(await page.locator('[data-index]').first().innerText())
      expect(index.high).toBeGreaterThan(index.low)
      await shot(page, name)
      await close()
    }
  })

  it('the strongest pour that runs tears (a spirit or fortified wine) shows slower tears than the table wines, by the API\'s numbers', async () => {
    const byStrength = [...pages].sort((a, b) => b.abvPctVol - a.abvPctVol)
    const strong = byStrength.find(p => p.pour.prediction.tearsExpected)!
    expect(['Spirit', 'Fortified wine']).toContain(strong.pour.kind)
    const wines = pages.filter(p => p.pour.kind === 'Still wine')
    expect(wines.length).toBeGreaterThan(0)
    const { context, close } = await openBrowser({ width: 375, height: 900 })
    const page = await context.newPage()
    const shownSpeed = async (p: PourPage) => {
      await page.goto(`/pour/${flightId}/${p.pour.position}`)
      const shown = parseRange(await figure(page, 'speed').innerText())
      expectShown(shown, p.pour.prediction.ranges.tearFallSpeed_mm_s!, p.pour.name)
      return shown
    }
    const strongShown = await shownSpeed(strong)
    await shot(page, 'pour-page-strongest-phone')
    for (const wine of wines) {
      expect(strong.pour.prediction.tearFallSpeed_mm_s!, wine.pour.name).toBeLessThan(wine.pour.prediction.tearFallSpeed_mm_s!)
      const wineShown = await shownSpeed(wine)
      expect(strongShown.low + strongShown.high, wine.pour.name).toBeLessThan(wineShown.low + wineShown.high)
    }
    // A stronger pour without tears says so, and shows no tear figures to contradict it.
    for (const p of byStrength.filter(p => !p.pour.prediction.tearsExpected)) {
      await page.goto(`/pour/${flightId}/${p.pour.position}`)
      await page.getByRole('heading', { name: /^In the / }).waitFor()
      expect(await page.locator('[data-figure]').count()).toBe(0)
      expect(await page.locator('[data-summary]').innerText()).toMatch(/no (distinct )?tears/i)
    }
    await close()
  })

  it('the glass page\'s humidity choice asks for the curve in that room, and says which room it shows', async () => {
    for (const [width, name] of [[1280, 'glass-page-humidity'], [375, 'glass-page-humidity-phone']] as const) {
      const { context, close } = await openBrowser({ width, height: 900 })
      const page = await context.newPage()
      const curves: Request[] = []
      page.on('request', (r) => {
        if (r.url().includes('/api/science/curve')) curves.push(r)
      })
      await page.goto('/glass')
      await showCurveChart(page)
      const caption = page.locator('figcaption').filter({ hasText: 'the index is 0 for water' })
      await expect.poll(() => caption.innerText()).toMatch(/50\s%\shumidity/)
      const answer = page.waitForResponse(r => r.url().includes('/api/science/curve') && new URL(r.url()).searchParams.get('rh') === '70')
      await page.getByText('70 %', { exact: true }).click()
      const res = await answer
      expect(res.status()).toBe(200)
      const q = new URL(res.url()).searchParams
      expect(q.get('rh')).toBe('70')
      const venueAir = ((await (await page.request.get('/api/venue')).json()) as { roomAirTempC: number }).roomAirTempC
      expect(Number(q.get('airTempC'))).toBeCloseTo(venueAir, 1) // the venue's usual air temperature
      expect(curves.some(r => new URL(r.url()).searchParams.get('rh') === '70')).toBe(true)
      await expect.poll(() => caption.innerText()).toMatch(/70\s%\shumidity/)
      await page.waitForTimeout(300)
      await shot(page, name)
      await close()
    }
  })

  it('the flight page\'s pour cards and the flight\'s pour list carry the same ranges and the room', async () => {
    const { context, close } = await openBrowser({ width: 375, height: 900 })
    const page = await context.newPage()
    await page.goto(`/flights/${flightId}`)
    const cards = page.locator('article').filter({ has: page.locator('[data-tear-figures]') })
    await cards.first().waitFor()
    expect(await cards.count()).toBe(pages.length)
    for (const [i, p] of pages.entries()) {
      const card = cards.nth(i)
      if (p.pour.prediction.tearsExpected) expectShown(parseRange(await card.locator('[data-figure="band"] dd').innerText()), p.pour.prediction.ranges.clearBandHeight_mm!, p.pour.name)
      else expect(await card.locator('[data-figure]').count()).toBe(0)
      expect((await card.locator('[data-room]').innerText()).replace(/\s+/g, ' ')).toContain(`${fahrenheit(p.room.airTempC)} °F`)
    }
    await shot(page, 'flight-page-ranges-phone')
    await page.goto(`/pour/${flightId}`)
    await page.getByRole('link', { name: /^1\. / }).waitFor()
    expect((await page.locator('[data-room]').innerText()).replace(/\s+/g, ' ')).toContain(`${Math.round(pages[0]!.room.relativeHumidityPct)} % humidity`)
    await shot(page, 'pour-list-ranges-phone')
    await close()
  })

  it('the builder\'s rows show the ranges and the room, on a laptop and a phone', async () => {
    for (const [width, name] of [[1280, 'builder-row-ranges'], [375, 'builder-row-ranges-phone']] as const) {
      const { context, close } = await openBrowser({ width, height: 900 })
      const page = await context.newPage()
      await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
      await page.waitForURL('**/manage')
      await page.goto(`/manage/flights/${flightId}`)
      const rows = page.locator('ol > li').filter({ has: page.locator('[data-tear-figures]') })
      await rows.first().waitFor()
      expect(await rows.count()).toBe(pages.length)
      for (const [i, p] of pages.entries()) {
        const row = rows.nth(i)
        if (p.pour.prediction.tearsExpected) expectShown(parseRange(await row.locator('[data-figure="speed"] dd').innerText()), p.pour.prediction.ranges.tearFallSpeed_mm_s!, p.pour.name)
        else expect(await row.locator('[data-figure]').count()).toBe(0)
        expect((await row.locator('[data-room]').innerText()).replace(/\s+/g, ' ')).toContain(`${Math.round(p.room.relativeHumidityPct)} % humidity`)
      }
      await elementShot(rows.nth(pages.findIndex(p => p.pour.kind === 'Still wine')), name)
      await shot(page, `${name}-page`)
      // A product's page: its tasting pour's ranges, as its API view gives them.
      const products = (await (await context.request.get('/api/products?kind=fortified&status=active&pageSize=100')).json() as ProductPage).items
      const listed = products.find(p => p.derived.tearsExpected)!
      const fortified = await (await context.request.get(`/api/products/${listed.id}`)).json() as ProductView
      await page.goto(`/manage/products/${fortified.id}`)
      const facts = page.locator('[data-tear-figures]')
      await facts.waitFor()
      expectShown(parseRange(await facts.locator('[data-figure="speed"] dd').innerText()), fortified.derived.predictions.ranges.tearFallSpeed_mm_s!, fortified.name)
      expect((await facts.locator('[data-room]').innerText()).replace(/\s+/g, ' ')).toContain(`${fahrenheit(fortified.derived.room.airTempC)} °F`)
      await shot(page, `product-facts-ranges${width < 500 ? '-phone' : ''}`)
      await close()
    }
  })

  it('on a 390 px phone the pour page draws the glass at least 160 px wide, labels inside, the liquid in the product\'s colour', async () => {
    const cabFranc = pages.find(p => p.pour.name === DEMO_PRODUCTS.find(d => d.code === 'SV-CF-23')!.name)!
    expect(cabFranc.pour.colour).toBe('ruby')
    const { context, close } = await openBrowser({ width: 390, height: 844 })
    const page = await context.newPage()
    await page.goto(`/pour/${flightId}/${cabFranc.pour.position}`)
    const svg = page.locator('figure svg[data-show]').first()
    await svg.waitFor()
    const box = (await svg.boundingBox())!
    expect(box.width).toBeGreaterThanOrEqual(160)
    expect(box.x + box.width).toBeLessThanOrEqual(390)
    expect(await labelsInside(svg)).toEqual([])
    // "band 11 mm" once lost its last letter to the SVG's edge: the range label is whole.
    const texts = (await svg.locator('text').allTextContents()).map(t => t.replace(/\s+/g, ' '))
    expect(texts.some(t => / mm$/.test(t))).toBe(true)
    expect(await svg.locator('[data-role="liquid"]').getAttribute('fill')).toBe(LIQUID_COLOUR_FILL.ruby.hex)
    await elementShot(page.locator('figure').filter({ has: page.locator('svg[data-show]') }).first(), 'pour-glass-drawing-phone')
    await shot(page, 'pour-page-drawing-phone')
    // The flight's pour list draws each pour's glass at least 96 px wide, in its own colour.
    await page.goto(`/pour/${flightId}`)
    const small = page.locator('figure svg[data-show]')
    await small.first().waitFor()
    expect(await small.count()).toBe(pages.length)
    for (let i = 0; i < pages.length; i++) {
      expect((await small.nth(i).boundingBox())!.width).toBeGreaterThanOrEqual(95)
      expect(await small.nth(i).getAttribute('data-colour')).toBe(pages[i]!.pour.colour)
    }
    await shot(page, 'pour-list-drawings-phone')
    await close()
  })

  it('a colour the manager chooses on the product form is the colour the guest\'s pour page draws', async () => {
    const albarino = pages.find(p => p.pour.name === DEMO_PRODUCTS.find(d => d.code === 'SV-ALB-24')!.name)!
    const { context, close } = await openBrowser({ width: 1280, height: 900 })
    const page = await context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
    const products = (await (await context.request.get(`/api/products?q=${encodeURIComponent(albarino.pour.name)}`)).json() as ProductPage).items
    const product = products.find(p => p.name === albarino.pour.name)!
    const before = product.colour
    try {
      await page.goto(`/manage/products/${product.id}`)
      const select = page.getByLabel('Colour in the glass')
      await select.waitFor()
      expect(await select.locator('option').first().innerText()).toMatch(/^Kind's usual colour/)
      await select.selectOption('deep_gold')
      await page.getByRole('button', { name: 'Save changes' }).click()
      await page.getByText('Saved. The figures on this page').waitFor()
      const guest = await openBrowser({ width: 390, height: 844 })
      const phone = await guest.context.newPage()
      await phone.goto(`/pour/${flightId}/${albarino.pour.position}`)
      const liquid = phone.locator('figure svg[data-show] [data-role="liquid"]').first()
      await liquid.waitFor()
      expect(await liquid.getAttribute('fill')).toBe(LIQUID_COLOUR_FILL.deep_gold.hex)
      await shot(phone, 'pour-page-manager-colour-phone')
      await guest.close()
    }
    finally {
      const res = await context.request.patch(`/api/products/${product.id}`, { data: { colour: before } })
      expect(res.status()).toBe(200)
      await close()
    }
  })
})
