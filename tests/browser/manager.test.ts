import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { DateTime } from 'luxon'
import { addPourByName, openBrowser, shot, signInThroughForm } from '../support/browser'
import { countRows, withDb } from '../support/db'
import { bookAndPay, bookingBody, checkoutIdOf, demoFlightId, newGuest, newSession, payCheckout, signedIn, waitForState } from '../support/booking'
import { allProducts, type Client } from '../support/http'
import { DEMO_PASSWORD, DEMO_VENUE } from '../../server/demo/data'
import { formatDay, formatDayTime, formatTime } from '../../shared/dates'
import { formatMoney } from '../../shared/money'
import type { ManagerOverview } from '../../shared/types/reports'

/**
 * The manager's screens in a browser whose clock runs in Tokyo while the venue is in New York: every
 * time on the page must be the venue's, and the server's page and the browser's must agree.
 */
const BROWSER_ZONE = 'Asia/Tokyo'
const venueClock = { timeZone: DEMO_VENUE.timeZone, locale: 'en-US' } // the demo venue keeps the default locale
const sqlTime = (d: Date) => d.toISOString().replace('T', ' ').replace('Z', '')

let context: BrowserContext
let close: () => Promise<void>
let manager: Client

function hydrationWarnings(page: Page): string[] {
  const seen: string[] = []
  page.on('console', (m) => { if (/hydration/i.test(m.text())) seen.push(`${page.url()}: ${m.text()}`) })
  return seen
}

beforeAll(async () => {
  manager = await signedIn('manager@saltmarsh.test')
  ;({ context, close } = await openBrowser({ width: 1366, height: 1024 }, { timezoneId: BROWSER_ZONE }))
  const page = await context.newPage()
  await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
  await page.waitForURL('**/manage')
  await page.close()
})
afterAll(async () => close())

const addPour = addPourByName

describe('the flight builder', () => {
  it('asks before leaving unsaved pours, in the app and when the tab closes, and not once they are saved', async () => {
    const page = await context.newPage()
    await page.goto('/manage/flights/new')
    await page.getByLabel('Flight name').fill(`Unsaved flight ${Date.now()}`)
    await addPour(page, 'Tidewater Albariño')
    await page.getByText('Not saved yet').waitFor()

    const dialogs: string[] = []
    page.once('dialog', (d) => { dialogs.push(`${d.type()}: ${d.message()}`); void d.dismiss() })
    await page.getByRole('link', { name: '← All flights' }).click()
    await expect.poll(() => dialogs.length).toBe(1)
    expect(dialogs[0]).toMatch(/^confirm: This flight has changes that are not saved/)
    await page.waitForTimeout(300)
    expect(new URL(page.url()).pathname).toBe('/manage/flights/new')
    expect(await page.locator('ol > li').count()).toBe(1)

    page.once('dialog', (d) => { dialogs.push(d.type()); void d.dismiss() })
    await page.close({ runBeforeUnload: true })
    await expect.poll(() => dialogs.length).toBe(2)
    expect(dialogs[1]).toBe('beforeunload')
    await page.waitForTimeout(300)
    expect(page.isClosed()).toBe(false)
    await shot(page, 'manager-builder-unsaved')

    page.once('dialog', (d) => { dialogs.push(d.type()); void d.accept() })
    await page.getByRole('link', { name: '← All flights' }).click()
    await page.waitForURL(/\/manage\/flights$/)
    expect(dialogs).toHaveLength(3)

    // Saved: nothing to ask.
    await page.goto('/manage/flights/new')
    await page.getByLabel('Flight name').fill(`Saved flight ${Date.now()}`)
    for (const name of ['Orchard Gate Dry Cider', 'Tidewater Albariño', 'Marsh Samphire Gin']) await addPour(page, name)
    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.waitForURL(/\/manage\/flights\/\d+$/)
    await page.getByText('Saved.').waitFor()
    page.on('dialog', (d) => { dialogs.push(d.type()); void d.dismiss() })
    await page.getByRole('link', { name: '← All flights' }).click()
    await page.waitForURL(/\/manage\/flights$/)
    expect(dialogs).toHaveLength(3)
    await page.close()
  })

  it('writes pours as guests read them: fl oz to a tenth, whole °F (the demo venue\'s US units)', async () => {
    const page = await context.newPage()
    const warnings = hydrationWarnings(page)
    const id = await demoFlightId()
    await page.goto(`/manage/flights/${id}`, { waitUntil: 'networkidle' })
    // The demo flight's pours (server/demo/data.ts): 90, 60, 60, 60, 45, 15 mL at 8, 7, 10, 16, 16, 18 °C.
    // 1 US fl oz = 29.5735295625 mL (US customary units); °F = °C × 9/5 + 32.
    const volumes = await page.getByLabel('Pour (fl oz)').evaluateAll(els => els.map(e => (e as HTMLInputElement).value))
    const temps = await page.getByLabel('Serve at (°F)').evaluateAll(els => els.map(e => (e as HTMLInputElement).value))
    expect(volumes).toEqual(['3.0', '2.0', '2.0', '2.0', '1.5', '0.5']) // 3.04, 2.03, 2.03, 2.03, 1.52, 0.51
    expect(temps).toEqual(['46', '45', '50', '61', '61', '64']) // 46.4, 44.6, 50, 60.8, 60.8, 64.4
    await shot(page, 'manager-builder-figures')
    // An editable pour too: a still wine's default 60 mL at the product's 9 °C.
    await page.goto('/manage/flights/new')
    await addPour(page, 'Tidewater Albariño')
    expect(await page.getByLabel('Pour (fl oz)').inputValue()).toBe('2.0') // 60 mL = 2.03 US fl oz (1 fl oz = 29.5735295625 mL, US customary units), to a tenth
    expect(await page.getByLabel('Serve at (°F)').inputValue()).toBe('48') // 9 °C = 48.2 °F (°F = °C × 9/5 + 32), whole degrees
    await page.getByLabel('Pour (fl oz)').fill('2.5')
    await page.getByLabel('Pour (fl oz)').press('Tab')
    await page.getByText(/2\.5\sfl\soz/).waitFor() // the per-guest total follows the typed figure
    page.on('dialog', d => void d.accept()) // leaving the unsaved flight is asked about; yes
    await page.goto(`/flights/${id}`)
    await page.getByText(/3\.0\sfl\soz/).first().waitFor()
    expect(await page.getByText(/46\s°F/).count()).toBeGreaterThan(0)
    expect(warnings).toEqual([])
    await page.close()
  }, 90_000)
})

describe('sessions', () => {
  it('renders without a hydration warning; a double click on Schedule makes one session, listed even beyond eight weeks', async () => {
    const page = await context.newPage()
    const warnings = hydrationWarnings(page)
    await page.goto('/manage/sessions', { waitUntil: 'networkidle' })
    await page.getByText('Schedule sessions').waitFor()
    const start = DateTime.now().setZone(DEMO_VENUE.timeZone).plus({ weeks: 20 }).set({ hour: 11, minute: 10 + Math.floor(Math.random() * 50), second: 0, millisecond: 0 })
    // The demo's flight by value: other test files publish flights that may sort first.
    await page.getByLabel('Flight', { exact: true }).selectOption(String(await demoFlightId()))
    await page.getByLabel('First date').fill(start.toISODate()!)
    await page.getByLabel('Start time').fill(start.toFormat('HH:mm'))
    await page.getByLabel('Host').selectOption({ label: 'Teodor Vasko' })
    await page.getByRole('button', { name: 'Schedule session' }).dblclick()
    await page.getByText('Session scheduled:').waitFor()
    await page.waitForTimeout(500)
    const at = sqlTime(start.toUTC().toJSDate())
    expect(await countRows('tasting_sessions', 'flight_id = ? AND starts_at = ?', [await demoFlightId(), at])).toBe(1)
    expect(await page.getByRole('alert').count()).toBe(0)
    const just = page.getByRole('region', { name: 'Just scheduled' })
    expect(await just.getByRole('link').allInnerTexts()).toEqual([formatDay(start.toJSDate(), venueClock)])
    expect(await page.getByLabel('To', { exact: true }).inputValue()).toBe(start.toISODate())
    const [row] = await withDb(async c => (await c.query('SELECT host_id FROM tasting_sessions WHERE flight_id = ? AND starts_at = ?', [await demoFlightId(), at]))[0] as { host_id: number | null }[])
    expect(row!.host_id).not.toBeNull()
    await page.getByLabel('Find a session').fill(start.toUTC().toISO()!.slice(0, 16))
    await page.getByText('new', { exact: true }).waitFor()
    await page.getByLabel('Find a session').fill('')
    await page.evaluate(() => window.scrollTo(0, 0))
    await shot(page, 'manager-sessions')
    expect(warnings).toEqual([])
    await page.close()
  }, 90_000)
})

describe('the overview', () => {
  it('shows today\'s sessions with seats taken and left, the next seven days and the week\'s takings', async () => {
    const session = await newSession(manager, { hoursAhead: 24 * 4, seats: 6, priceMinor: 2800 })
    await bookAndPay(await newGuest('overview-browser'), session.id, 2)
    const today = DateTime.now().setZone(DEMO_VENUE.timeZone).startOf('day')
    const moved = today.plus({ minutes: 2, seconds: Math.floor(Math.random() * 59), milliseconds: Math.floor(Math.random() * 999) }).toUTC().toJSDate()
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [sqlTime(moved), session.id]))
    const ahead = await newSession(manager, { hoursAhead: 24 * 2, seats: 10, priceMinor: 2800 })
    await bookAndPay(await newGuest('overview-browser-2'), ahead.id, 4)
    const api = (await manager.get<ManagerOverview>('/api/reports/overview')).body

    const page = await context.newPage()
    const warnings = hydrationWarnings(page)
    await page.goto('/manage', { waitUntil: 'networkidle' })
    const todayPanel = page.getByRole('region', { name: /^Today/ })
    const mine = todayPanel.locator(`[data-session="${session.id}"]`)
    expect(await mine.innerText()).toContain(formatTime(moved, venueClock)) // the venue's time, not Tokyo's
    expect(await mine.innerText()).toContain('2 of 6 taken · 4 left')
    expect(await todayPanel.locator('[data-figure="today-totals"]').innerText()).toContain(`${api.today.seatsTaken} of ${api.today.seats} seats taken`)
    const week = page.getByRole('region', { name: /^The next seven days/ })
    expect(await week.locator('[data-figure="week-totals"]').innerText()).toContain(`${api.week.seatsTaken} of ${api.week.seats} seats taken`)
    const aheadDay = DateTime.fromISO(ahead.startsAt, { zone: DEMO_VENUE.timeZone }).toISODate()
    expect(await week.locator(`[data-day="${aheadDay}"]`).innerText()).toContain(`${formatTime(ahead.startsAt, venueClock)} Shoreline Flight · 4/10`)
    expect(await page.locator('[data-figure="takings-net"]').innerText()).toBe(formatMoney(api.takings.netMinor, 'USD'))
    expect(await page.getByText('The last 7 days,').count()).toBe(1)
    await shot(page, 'manager-overview')

    // The bookings view of the day ahead shows what a guest asked the venue to know.
    const noted = await newGuest('overview-notes')
    const res = await noted.client.post('/api/bookings', { ...bookingBody(ahead.id, noted, 1), notes: 'Gluten-free crackers, please' })
    expect((await payCheckout(checkoutIdOf(res.body.checkoutUrl))).status).toBe(200)
    await waitForState(res.body.booking.id, 'confirmed')
    await page.goto(`/manage/bookings?from=${aheadDay}&to=${aheadDay}`, { waitUntil: 'networkidle' })
    await page.getByText('Guest note: Gluten-free crackers, please').waitFor()
    await shot(page, 'manager-bookings-notes')
    expect(warnings).toEqual([])
    await page.close()
  }, 90_000)
})

describe('the bookings view of a long range', () => {
  it('pages its sessions by address: the totals cover the range, and a guest\'s booking on page 2 is there for the manager', async () => {
    // 22 weekly sessions four years ahead (no other test schedules there): two pages of 20.
    const first = DateTime.now().setZone(DEMO_VENUE.timeZone).plus({ years: 4 }).startOf('week').plus({ days: 3 })
    const made = await manager.post('/api/sessions', { flightId: await demoFlightId(), startDate: first.toISODate(), startTime: '11:40', durationMinutes: 60, seats: 5, priceMinor: 3100, bookingCutoffMinutes: 60, repeatWeeks: 22 })
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    const ids = (made.body as { id: number }[]).map(x => x.id)
    const guest = await newGuest('pager')
    const booked = await bookAndPay(guest, ids[20]!, 2)
    const page = await context.newPage()
    const warnings = hydrationWarnings(page)
    await page.goto(`/manage/bookings?from=${first.toISODate()}&to=${first.plus({ weeks: 21 }).toISODate()}`)
    const pager = page.getByRole('navigation', { name: 'Sessions: pages, below the list' })
    expect(await pager.innerText()).toContain('Sessions 1–20 of 22 · page 1 of 2')
    expect(await page.getByText('2 of 110 seats').count()).toBe(1) // the whole range's seats sold, though the party is on page 2
    expect(await page.getByText(booked.reference).count()).toBe(0)
    await pager.getByRole('link', { name: 'Next' }).click()
    await page.waitForURL(/[?&]page=2/)
    await page.getByText(booked.reference).first().waitFor()
    expect(await pager.innerText()).toContain('Sessions 21–22 of 22 · page 2 of 2')
    await shot(page, 'manager-bookings-page-2')
    await page.reload()
    await page.getByText(booked.reference).first().waitFor()
    await pager.getByRole('link', { name: 'Previous' }).click()
    await expect.poll(() => pager.innerText()).toContain('page 1 of 2')
    expect(warnings).toEqual([])
    await page.close()
  }, 90_000)
})

describe('every manager page', () => {
  it('renders without a hydration warning in a browser in another zone, and the revisions list writes the venue\'s time', async () => {
    const products = (await allProducts(manager))
    const productId = products[0]!.id
    expect((await manager.request('PUT', `/api/content/product_note/${productId}`, { body: 'A note to keep a revision of.' })).status).toBe(200)
    const revisions = (await manager.get<{ createdAt: string }[]>(`/api/content/product_note/${productId}/revisions`)).body
    const page = await context.newPage()
    const warnings = hydrationWarnings(page)
    for (const path of ['/manage', '/manage/sessions', '/manage/bookings', '/manage/flights', `/manage/flights/${await demoFlightId()}`, '/manage/flights/new',
      '/manage/products', `/manage/products/${productId}`, '/manage/products/new', '/manage/glasses', '/manage/staff', '/manage/venue', '/manage/content',
      `/manage/content/product_note/${productId}`]) {
      await page.goto(path, { waitUntil: 'load' })
      await page.waitForTimeout(300)
    }
    await page.getByText(formatDayTime(revisions[0]!.createdAt, venueClock)).first().waitFor()
    expect(warnings).toEqual([])
    await page.close()
  }, 90_000)
})
