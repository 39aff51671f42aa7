import { resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/people'
import type { Client } from '../support/http'
import { withDb } from '../support/db'
import { bookAndPay, demoFlightId, newGuest, newSession, startTodayIn } from '../support/booking'
import { SHOTS_DIR, openBrowser, shot, signInThroughForm } from '../support/browser'
import { inspectPdf } from '../support/pdf'
import { DEMO_PASSWORD } from '../../server/demo/data'

/**
 * The room's air in the browser: the host reads the room on the day's screen, and the session's
 * print page and PDF say so; the manager sets the venue's usual reading, and a flight's own card
 * says that. The demo venue reads °F.
 */
describe('the room\'s air', () => {
  let manager: Client
  let original: Record<string, unknown>
  let sessionId: number
  let guestName: string

  beforeAll(async () => {
    manager = await signedIn('manager')
    const { id: _id, ...settings } = (await manager.get('/api/venue')).body
    original = settings
    const host = await signedIn('host')
    sessionId = (await newSession(manager, { hoursAhead: 24 * 4, seats: 6 })).id
    expect((await manager.patch(`/api/sessions/${sessionId}`, { hostId: (await host.get('/api/account')).body.id })).status).toBe(200)
    const guest = await newGuest('room-browser')
    guestName = guest.name
    await bookAndPay(guest, sessionId, 2)
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [startTodayIn(30), sessionId]))
  })

  afterAll(async () => {
    expect((await manager.patch('/api/venue', original)).status).toBe(200)
  })

  it('the host reads the room; the session\'s card page and its PDF state that reading', async () => {
    const { context, close } = await openBrowser({ width: 1024, height: 1366 }) // a tablet held upright (common practice, no source)
    try {
      const page = await context.newPage()
      await signInThroughForm(page, 'host@saltmarsh.test', DEMO_PASSWORD)
      await page.waitForURL('**/host')
      const panel = page.locator('section.panel', { hasText: guestName })
      await panel.getByText(/Not read yet: cards assume the room's usual/).waitFor()

      // A humidity no hygrometer shows is refused beside its box, before anything is sent.
      await panel.getByLabel('Humidity (% RH)').fill('120')
      await panel.getByLabel('Air (°F)').fill('73')
      await panel.getByRole('button', { name: 'Save room reading' }).click()
      await panel.getByText('Relative humidity must be a whole number from 0 to 100 %.').waitFor()
      expect(await withDb(async c => ((await c.query('SELECT room_humidity_pct AS rh FROM tasting_sessions WHERE id = ?', [sessionId]))[0] as { rh: number | null }[])[0]!.rh)).toBeNull()

      await panel.getByLabel('Humidity (% RH)').fill('64')
      await panel.getByRole('button', { name: 'Save room reading' }).click()
      await panel.getByText(/Room read: 73\s°F, 64 % RH\. Cards printed from now on assume it\./).waitFor()
      await panel.getByText(/Read at .+ by Teodor Vasko: 73\s°F, 64 % RH\./).waitFor()
      await shot(page, 'room-host-day')

      await panel.getByRole('button', { name: 'Print all cards' }).click()
      const link = panel.getByRole('link', { name: /Download 2 cards/ })
      await link.waitFor({ timeout: 45_000 })
      const pdfRes = await page.request.get((await link.getAttribute('href'))!)
      expect(pdfRes.status()).toBe(200)
      const pdf = inspectPdf(Buffer.from(await pdfRes.body()), 'room-session-cards-pdf')
      expect(pdf.raw.replace(/\s+/g, ' ').match(/Room: 73 °F, 64 % RH — read for this session/g)).toHaveLength(2)

      await page.goto(`/cards/sessions/${sessionId}`)
      await page.getByText('2 cards').waitFor()
      const lines = page.locator('[data-room]')
      await expect.poll(() => lines.count()).toBe(2)
      expect((await lines.allTextContents()).map(t => t.replace(/\u00a0/g, ' '))).toEqual(Array(2).fill('Room: 73 °F, 64 % RH — read for this session'))
      await page.locator('[data-fitted-for]').first().waitFor()
      await shot(page, 'room-session-card-page')
    }
    finally {
      await close()
    }
  })

  it('the manager sets the venue\'s usual reading; a flight\'s own card states it, the session keeps its own', async () => {
    const { context, close } = await openBrowser()
    try {
      const page = await context.newPage()
      await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
      await page.waitForURL('**/manage')
      await page.goto('/manage/venue')
      await page.getByRole('button', { name: 'Save settings' }).waitFor()
      await page.getByLabel('Air temperature (°F)').fill('140')
      await page.getByRole('button', { name: 'Save settings' }).click()
      await page.getByText('The air temperature must be between 32 and 104 °F.').waitFor()
      await page.getByLabel('Relative humidity (%)').fill('47')
      await page.getByLabel('Air temperature (°F)').fill('75')
      await page.getByRole('button', { name: 'Save settings' }).click()
      await page.getByText('Venue settings saved.').waitFor()
      const saved = (await manager.get('/api/venue')).body
      expect({ rh: saved.roomHumidityPct, air: saved.roomAirTempC }).toEqual({ rh: 47, air: 23.9 }) // 75 °F = 23.89 °C, kept to a tenth
      // The full page, and the fieldset alone: on the full page the sticky save bar sits over it.
      await shot(page, 'room-venue-settings')
      const roomFields = page.getByRole('group', { name: 'The room\'s air' })
      await roomFields.evaluate(el => el.scrollIntoView({ block: 'center' }))
      await roomFields.screenshot({ path: resolve(SHOTS_DIR, 'room-venue-settings-fields.png') })

      await page.goto(`/cards/flights/${await demoFlightId()}`)
      await page.locator('[data-fitted-for]').waitFor()
      expect((await page.locator('[data-room]').textContent())?.replace(/\u00a0/g, ' ')).toBe('Room: 75 °F, 47 % RH — the room\'s usual air')
      await shot(page, 'room-flight-card-page')
      // The session's cards keep the host's reading.
      expect((await manager.get(`/api/sessions/${sessionId}/cards`)).body.cards[0].room.text).toBe('Room: 73\u00a0°F, 64 % RH — read for this session')
    }
    finally {
      await close()
    }
  })
})
