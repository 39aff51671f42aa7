import { afterAll, describe, expect, it } from 'vitest'
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { openBrowser, shot, signInThroughForm, SHOTS_DIR } from '../support/browser'
import { withDb } from '../support/db'
import { demoFlightId } from '../support/booking'
import { DEMO_PASSWORD } from '../../server/demo/data'

/**
 * The manager's predicted-against-observed page on a phone and a desktop: both charts, the
 * calibration panel, the CSV; and a reading that came from the guest side shows up on it.
 */
const closers: (() => Promise<void>)[] = []
afterAll(async () => { for (const c of closers) await c() })

/** A guest's reading of the demo flight's gin, written as the guest side writes it (the pour page's form joins this chain on merge). */
async function guestReading(bandMm: number): Promise<number> {
  const flightId = await demoFlightId()
  return withDb(async (c) => {
    const [[pour]] = await c.query(`SELECT fp.id, fp.product_id AS productId, fp.glass_id AS glassId, fp.serving_temp_c AS temp, pm.id AS measurementId, pm.abv_pct_vol AS abv, pm.residual_sugar_g_l AS sugar, v.id AS venueId, v.room_humidity_pct AS rh, v.room_air_temp_c AS air
      FROM flight_pours fp JOIN product_measurements pm ON pm.product_id = fp.product_id JOIN flights f ON f.id = fp.flight_id JOIN venues v ON v.id = f.venue_id
      WHERE fp.flight_id = ? AND fp.position = 6 ORDER BY pm.id DESC LIMIT 1`, [flightId]) as any
    const [res] = await c.query(
      `INSERT INTO observations (venue_id, flight_id, flight_pour_id, product_id, measurement_id, glass_id, source, device_key, abv_pct_vol, residual_sugar_g_l, serving_temp_c,
        band_height_mm, no_clear_band, tears_formed, minutes_since, since, room_humidity_pct, room_air_temp_c, room_source, flags, demo, recorded_at)
       VALUES (?, ?, ?, ?, ?, ?, 'guest', ?, ?, ?, ?, ?, 0, 'yes', 4, 'swirl', ?, ?, 'venue', '[]', 0, UTC_TIMESTAMP(3))`,
      [pour.venueId, flightId, pour.id, pour.productId, pour.measurementId, pour.glassId, 'e'.repeat(64), pour.abv, pour.sugar, pour.temp, bandMm, pour.rh, pour.air],
    ) as any
    return res.insertId as number
  })
}

describe.each([
  ['desktop', { width: 1366, height: 1000 }],
  ['phone', { width: 390, height: 844 }],
])('the manager on a %s', (name, viewport) => {
  it('sees both charts, the calibration panel and the demo note, and downloads the CSV', async () => {
    const { context, close } = await openBrowser(viewport)
    closers.push(close)
    const page = await context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
    await page.goto('/manage/observations')
    await expect.poll(() => page.locator('[data-chart="band"] canvas').count()).toBe(1)
    await expect.poll(() => page.locator('[data-chart="speed"] canvas').count()).toBe(1)
    expect(await page.locator('[data-demo-note]').innerText()).toMatch(/^Includes \d+ invented demo observations\.$/)
    const panel = page.locator('[data-calibration-panel]')
    expect(await panel.locator('[data-glass="Tulip wine glass"]').count()).toBeGreaterThan(0)
    expect(await panel.locator('[data-calibration-switch]').isChecked()).toBe(true)
    const box = await page.locator('[data-chart="band"] canvas').boundingBox()
    expect(box!.width).toBeGreaterThan(300) // readable on a phone, and beside the other chart on a desktop
    // Nothing wider than the screen on a phone.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(viewport.width)
    await shot(page, `observations-manager-${name}`)
    await page.locator('[data-chart="band"]').screenshot({ path: resolve(SHOTS_DIR, `observations-chart-band-${name}.png`) })
    await page.locator('[data-chart="speed"]').screenshot({ path: resolve(SHOTS_DIR, `observations-chart-speed-${name}.png`) })
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download CSV' }).click()])
    const csv = readFileSync((await download.path())!, 'utf8')
    expect(csv.split('\r\n')[0]).toMatch(/^Observation,Recorded at,Source,Demo,Flight,/)
    expect(csv.split('\r\n').filter(Boolean).length).toBeGreaterThan(200)
    await page.close()
  })
})

describe('the hand-off', () => {
  it('shows the manager a reading that came from the guest side', async () => {
    const id = await guestReading(61) // far above any gin band the model predicts (a few mm, docs/science.md §6)
    const { context, close } = await openBrowser({ width: 1280, height: 900 })
    closers.push(close)
    const page = await context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
    await page.goto('/manage/observations?demo=exclude')
    const outlier = page.locator('[data-outlier]', { hasText: 'Band 61 mm' })
    await expect.poll(() => outlier.count()).toBeGreaterThan(0)
    expect(await outlier.first().innerText()).toMatch(/Marsh Samphire Gin · Nosing glass/)
    expect(await page.locator('[data-demo-note]').count()).toBe(0)
    await shot(page, 'observations-manager-handoff')

    // The product filter searches the catalogue on the server; the chosen product survives a reload by name.
    const product = page.getByLabel('Product', { exact: true })
    await product.fill('samphire')
    await page.getByRole('option', { name: /^Marsh Samphire Gin/ }).click()
    await page.getByRole('button', { name: 'Show' }).click()
    await page.waitForURL(/productId=\d+/)
    const byProduct = page.locator('table', { has: page.getByRole('columnheader', { name: 'Tears as expected' }) }).first()
    await expect.poll(() => byProduct.locator('tbody tr').allInnerTexts()).toEqual([expect.stringMatching(/^Marsh Samphire Gin/)])
    await page.reload()
    expect(await page.getByLabel('Product', { exact: true }).inputValue()).toBe('Marsh Samphire Gin')
    await withDb(c => c.query('DELETE FROM observations WHERE id = ?', [id]))
  })
})
