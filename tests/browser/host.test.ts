import { describe, expect, it } from 'vitest'
import QRCode from 'qrcode'
import type { ConsoleMessage, Page } from 'playwright-core'
import type { Client } from '../support/http'
import { signedIn } from '../support/people'
import { withDb } from '../support/db'
import { bookAndPay, newGuest, newSession, startTodayIn } from '../support/booking'
import { openBrowser, shot, signInThroughForm } from '../support/browser'
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/demo/data'

describe('the host\'s day on a tablet', () => {
  it('checks a party in by ticking each ID, seats walk-ins and prints the cards', async () => {
    const manager: Client = await signedIn('manager')
    const host = await signedIn('host')
    const { id: sessionId } = await newSession(manager, { hoursAhead: 24 * 4, seats: 10 })
    await manager.patch(`/api/sessions/${sessionId}`, { hostId: (await host.get('/api/account')).body.id })
    const guest = await newGuest('tablet')
    await bookAndPay(guest, sessionId, 3)
    await bookAndPay(await newGuest('second'), sessionId, 2)
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [startTodayIn(15), sessionId]))

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

/** Console errors, script errors and content security policy violations on a page, as they come. */
async function watchForTrouble(page: Page): Promise<string[]> {
  const trouble: string[] = []
  page.on('console', (m: ConsoleMessage) => { if (m.type() === 'error') trouble.push(`console: ${m.text()}`) })
  page.on('pageerror', e => trouble.push(`script error: ${e.message}`))
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', e => console.error(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || 'inline'}`))
  })
  return trouble
}

describe('the host\'s door on a tablet held sideways', () => {
  it('finds a party by its typed reference and by its QR code, marks "did not come" with a second step, undoes it and seats the late party', async () => {
    const manager: Client = await signedIn('manager')
    const host = await signedIn('host')
    const { id: sessionId } = await newSession(manager, { hoursAhead: 24 * 4, seats: 14 })
    await manager.patch(`/api/sessions/${sessionId}`, { hostId: (await host.get('/api/account')).body.id })
    const late = await newGuest('door-late')
    const lateBooking = await bookAndPay(late, sessionId, 2)
    const scanned = await newGuest('door-scan')
    const scannedBooking = await bookAndPay(scanned, sessionId, 3)
    const partly = await bookAndPay(await newGuest('door-partly'), sessionId, 2)
    const away = await bookAndPay(await newGuest('door-away'), sessionId, 1)
    // Started 5 minutes ago: "did not come" is offered, and the session runs for another 70 minutes.
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [startTodayIn(-5), sessionId]))
    expect((await host.post(`/api/bookings/${partly.id}/check-in`, { seated: 1, idsSeen: 1, reason: 'One guest is parking' })).status).toBe(200)
    expect((await host.post(`/api/bookings/${away.id}/turn-away`, { reason: 'No photo ID' })).status).toBe(200)
    expect((await host.post(`/api/sessions/${sessionId}/walk-ins`, { contactName: 'Walk-in pair', partySize: 2, idsSeen: 2 })).status).toBe(201)

    const { context, close } = await openBrowser({ width: 1024, height: 768 }) // a tablet held sideways (common practice, no source)
    const page = await context.newPage()
    const trouble = await watchForTrouble(page)
    await signInThroughForm(page, 'host@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/host')
    // Only the host's page may use the camera. Reached from the sign-in page inside the app, the
    // document is still the sign-in page's, whose policy refuses it: scanning reloads the host's page first.
    const cameraAllowed = () => page.evaluate(() => (document as unknown as { featurePolicy: { allowsFeature: (f: string) => boolean } }).featurePolicy.allowsFeature('camera'))
    expect(await cameraAllowed()).toBe(false)
    await page.getByRole('button', { name: 'Scan the QR code' }).click()
    // No camera on this machine: the door says so and points to typing.
    await page.getByRole('alert').filter({ hasText: 'Type the reference instead' }).waitFor()
    expect(await cameraAllowed()).toBe(true)
    expect(new URL(page.url()).hash).toBe('')
    const hostPage = (await page.request.get('/host')).headers()
    expect(hostPage['permissions-policy']).toContain('camera=(self)')
    expect(hostPage['content-security-policy']).toMatch(/script-src 'self' 'sha256-[^']+'/)
    expect((await page.request.get('/flights')).headers()['permissions-policy']).toContain('camera=()')
    const panel = page.locator(`section[aria-labelledby="s-${sessionId}"]`)
    await panel.waitFor()

    // The tiles: 2 + 3 to come, 1 + 2 seated, 1 not seated yet, 1 turned away = 8 booked online + 2 walk-ins.
    const tile = (label: string) => panel.locator('dl div', { has: page.getByText(label, { exact: true }) }).locator('dd').first()
    expect(await tile('To come').textContent()).toBe('5')
    expect(await tile('Seated').textContent()).toBe('3')
    expect(await tile('Not seated yet').textContent()).toBe('1')
    expect(await tile('Did not come').textContent()).toBe('0')
    expect(await tile('Turned away').textContent()).toBe('1')
    expect(await panel.locator('[data-tiles-sum]').textContent()).toMatch(/Together 10 guests: 8 booked online \+ 2 walk-ins\./)
    await shot(page, 'host-door-tiles')

    // Typed as a host might: lower case, with a dash.
    const typed = `${lateBooking.reference.slice(0, 5)}-${lateBooking.reference.slice(5)}`.toLowerCase()
    await page.getByLabel('Booking reference').fill(typed)
    await page.getByRole('button', { name: 'Find', exact: true }).click()
    const lateRow = panel.locator('li[data-found]', { hasText: late.name })
    await lateRow.waitFor()
    expect(await lateRow.evaluate(el => el === document.activeElement)).toBe(true)
    await page.getByRole('status').filter({ hasText: `booking ${lateBooking.reference}` }).waitFor()
    await shot(page, 'host-door-found-typed')

    // The QR code the confirmation e-mail attaches (server/utils/bookingEmails.ts draws it the same way), read from a photo.
    const png = await QRCode.toBuffer(scannedBooking.reference, { type: 'png', width: 320, margin: 2, errorCorrectionLevel: 'M' })
    await page.getByLabel('Read a QR code from a photo').setInputFiles({ name: 'booking-qr.png', mimeType: 'image/png', buffer: png })
    const scannedRow = panel.locator('li[data-found]', { hasText: scanned.name })
    await scannedRow.waitFor()
    expect(await page.getByLabel('Booking reference').inputValue()).toBe(scannedBooking.reference)
    expect(await panel.locator('li[data-found]').count()).toBe(1)

    // "Did not come" asks first; "Go back" changes nothing.
    const row = panel.locator('li', { hasText: late.name })
    await row.getByRole('button', { name: 'Did not come' }).click()
    const confirm = row.getByRole('group', { name: 'Confirm did not come' })
    await confirm.waitFor()
    await shot(page, 'host-door-confirm-no-show')
    await confirm.getByRole('button', { name: 'Go back' }).click()
    expect(await confirm.count()).toBe(0)
    await row.getByRole('button', { name: 'Did not come' }).click()
    await confirm.getByRole('button', { name: 'Yes, they did not come' }).click()
    await row.getByRole('button', { name: 'Undo' }).waitFor()
    expect(await tile('Did not come').textContent()).toBe('2')

    // They arrive late: undo, then seat them.
    await row.getByRole('button', { name: 'Undo' }).click()
    await row.getByLabel('Why (optional)').fill('Arrived late')
    await row.getByRole('button', { name: 'Yes, back to come' }).click()
    await row.getByRole('button', { name: 'Arrived' }).waitFor()
    expect(await tile('Did not come').textContent()).toBe('0')
    await row.getByRole('button', { name: 'Arrived' }).click()
    await row.getByLabel('Guest 1').check()
    await row.getByLabel('Guest 2').check()
    await row.getByRole('button', { name: 'Seat 2 guests' }).click()
    await row.getByText('Seated 2 of 2').waitFor()
    expect(await tile('Seated').textContent()).toBe('5')

    // The row's history: who, when, what and why.
    await row.locator('summary').click()
    const by = DEMO_USERS.find(u => u.email === 'host@saltmarsh.test')!.name
    const history = (await row.locator('details ol li').allTextContents()).map(t => t.replace(/\s+/g, ' ').trim())
    expect(history).toEqual([
      expect.stringMatching(new RegExp(`^\\d.* Marked as did not come · by ${by}$`)),
      expect.stringMatching(new RegExp(`^\\d.* Put back on the list to come · by ${by} ?Why: Arrived late$`)),
      expect.stringMatching(new RegExp(`^\\d.* Seated · by ${by}$`)),
    ])
    await row.scrollIntoViewIfNeeded()
    await shot(page, 'host-door-history')
    expect(trouble).toEqual([])
    await close()
  })
})
