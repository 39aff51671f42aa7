import { describe, expect, it } from 'vitest'
import type { Client } from '../support/http'
import { signedIn } from '../support/people'
import { withDb } from '../support/db'
import { bookAndPay, newGuest, newSession } from '../support/booking'
import { openBrowser, shot, signInThroughForm } from '../support/browser'
import { DEMO_PASSWORD } from '../../server/demo/data'

describe('the host\'s day on a tablet', () => {
  it('checks a party in by ticking each ID, seats walk-ins and prints the cards', async () => {
    const manager: Client = await signedIn('manager')
    const host = await signedIn('host')
    const { id: sessionId } = await newSession(manager, { hoursAhead: 24 * 4, seats: 10 })
    await manager.patch(`/api/sessions/${sessionId}`, { hostId: (await host.get('/api/account')).body.id })
    const guest = await newGuest('tablet')
    await bookAndPay(guest, sessionId, 3)
    await bookAndPay(await newGuest('second'), sessionId, 2)
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = UTC_TIMESTAMP(3) + INTERVAL 15 MINUTE WHERE id = ?', [sessionId]))

    const { context, close } = await openBrowser({ width: 1024, height: 1366 }) // a tablet held upright (common practice, no source)
    const page = await context.newPage()
    await signInThroughForm(page, 'host@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/host')
    const panel = page.locator('section.panel', { hasText: guest.name })
    await panel.waitFor()
    await shot(page, 'host-day')
    const row = panel.locator('li', { hasText: guest.name })
    await row.getByRole('button', { name: 'Arrived' }).click()
    for (let i = 1; i <= 3; i++) await row.getByLabel(`Guest ${i}`).check()
    await shot(page, 'host-check-in')
    await row.getByRole('button', { name: 'Seat 3 guests' }).click()
    await row.getByText('Seated 3 of 3').waitFor()
    await panel.getByText(/Seat walk-ins/).click()
    await panel.getByLabel('Name', { exact: true }).fill('Walk-in couple')
    await panel.getByLabel('Guests', { exact: true }).fill('2')
    await panel.getByLabel('Guest 1').last().check()
    await panel.getByLabel('Guest 2').last().check()
    await panel.getByRole('button', { name: 'Seat 2 walk-in guests' }).click()
    await panel.getByText('Walk-in couple').waitFor()
    await panel.getByRole('button', { name: 'Print all cards' }).click()
    // Seven cards are made in the background; on a loaded machine that takes more than the default wait.
    await panel.getByRole('link', { name: /Download 7 cards/ }).waitFor({ timeout: 45_000 })
    expect(await panel.getByText('Seated', { exact: true }).count()).toBe(1)
    await shot(page, 'host-day-after')
    await page.goto(`/cards/sessions/${sessionId}`)
    await page.getByText('7 cards').waitFor()
    await shot(page, 'host-session-cards')
    await close()
  })
})
