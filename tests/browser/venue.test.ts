import { resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { SHOTS_DIR, openBrowser, shot, signInThroughForm } from '../support/browser'
import { signedIn } from '../support/people'
import type { Client } from '../support/http'
import { DEMO_PASSWORD } from '../../server/demo/data'

/**
 * The manager's venue settings on a phone: contact details, opening hours, a locale, and a
 * currency and a zone found by typing part of their names; saved, reloaded, and then seen by a
 * guest at the foot of the home page.
 */
const PHONE = { width: 390, height: 844 } // a common phone viewport (common practice, no source)
// 02 5550 xxxx is set aside for fiction in Australia by ACMA (from memory); .test is reserved (RFC 2606).
const CONTACT = { phone: '+61 2 5550 1234', email: 'cellar-door@saltmarsh.test', website: 'https://saltmarsh.test/visit' }

describe('venue settings in the browser', () => {
  let manager: Client
  let original: Record<string, unknown>
  let staff: { context: BrowserContext, close: () => Promise<void> }
  let guest: { context: BrowserContext, close: () => Promise<void> }

  beforeAll(async () => {
    manager = await signedIn('manager')
    const { id: _id, ...settings } = (await manager.get('/api/venue')).body
    original = settings
    staff = await openBrowser(PHONE)
    guest = await openBrowser(PHONE)
  })

  // Other tests read the demo venue's settings: put them back.
  afterAll(async () => {
    expect((await manager.patch('/api/venue', original)).status).toBe(200)
    await staff?.close()
    await guest?.close()
  })

  const day = (page: Page, name: string) => page.getByRole('group', { name, exact: true })

  it('a manager sets them, they are kept after a reload, and a guest sees them in the footer', async () => {
    const page = await staff.context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
    await page.goto('/manage/venue')
    await page.getByRole('button', { name: 'Save settings' }).waitFor()

    await page.getByLabel('Phone').fill(CONTACT.phone)
    await page.getByLabel('Contact e-mail').fill(CONTACT.email)
    await page.getByLabel('Web site').fill('saltmarsh.test/visit')
    await page.getByLabel('Language and region').selectOption('en-AU')

    // Monday opens from nothing; Sunday closes; Friday gains a late opening.
    await day(page, 'Monday').getByText('Closed').waitFor()
    await page.getByRole('button', { name: 'Add hours for Monday' }).click()
    await day(page, 'Monday').getByLabel('Opens').fill('10:30')
    await day(page, 'Monday').getByLabel('Closes').fill('16:00')
    await page.getByRole('button', { name: /^Remove Sunday/ }).click()
    await day(page, 'Sunday').getByText('Closed').waitFor()
    await page.getByRole('button', { name: 'Add more hours for Friday' }).click()
    await day(page, 'Friday').getByLabel('Opens').nth(1).fill('21:30')
    await day(page, 'Friday').getByLabel('Closes').nth(1).fill('23:30')

    // The currency by part of its name, chosen with a click.
    const currency = page.getByRole('combobox', { name: 'Currency' })
    await currency.click()
    await currency.fill('australian')
    await page.getByRole('option', { name: 'AUD — Australian Dollar' }).click()
    expect(await currency.inputValue()).toBe('AUD — Australian Dollar')
    // The zone by part of its city's name, chosen with the keyboard.
    const zone = page.getByRole('combobox', { name: 'Time zone' })
    await zone.click()
    await zone.fill('sydn')
    await page.getByRole('option', { name: /^Australia\/Sydney/ }).waitFor()
    expect(await page.getByRole('listbox', { name: 'Time zones' }).getByRole('option').count()).toBe(1)
    await shot(page, 'venue-zone-search-phone')
    await zone.press('Enter')
    expect(await zone.inputValue()).toBe('Australia/Sydney')
    expect(await zone.getAttribute('aria-expanded')).toBe('false')
    // Its offset now: UTC+10:00 in the southern winter, UTC+11:00 in summer (IANA tz database, from memory).
    expect(await page.getByText(/^Now UTC\+1[01]:00 · Australian Eastern (Standard|Daylight) Time\./).count()).toBe(1)

    // The bad web site is caught beside its field, and the field points to the message.
    await page.getByRole('button', { name: 'Save settings' }).click()
    const website = page.getByLabel('Web site')
    const message = page.getByText('Enter the full address, starting with https://')
    await message.waitFor()
    expect(await website.getAttribute('aria-invalid')).toBe('true')
    expect(await website.getAttribute('aria-describedby')).toContain(await message.getAttribute('id'))
    await shot(page, 'venue-settings-error-phone')
    await website.fill(CONTACT.website)
    // Every answer about the venue from here on, so a failed save says what the server answered.
    const answers: string[] = []
    page.on('response', (r) => { if (new URL(r.url()).pathname === '/api/venue') answers.push(`${r.request().method()} ${r.status()}`) })
    const patched = page.waitForResponse(r => new URL(r.url()).pathname === '/api/venue' && r.request().method() === 'PATCH', { timeout: 30_000 })
    await page.getByRole('button', { name: 'Save settings' }).click()
    expect((await patched).status()).toBe(200)
    // On a busy machine a save can take longer than one step; if it fails, say what the page said and what was answered.
    await page.getByText('Venue settings saved.').waitFor({ timeout: 30_000 }).catch(async (e: Error) => {
      await shot(page, 'venue-save-failed')
      throw new Error(`not saved; the page says: ${(await page.locator('.notice-bad, .field-error').allInnerTexts()).join(' | ') || 'nothing'}; answers: ${answers.join(', ') || 'none'} (${e.message.split('\n')[0]})`)
    })
    // The save needs no second read: the PATCH's answer is what the page and its footer show.
    expect(answers).toEqual(['PATCH 200'])
    await page.getByRole('contentinfo').getByText(CONTACT.phone).waitFor()

    await page.reload()
    await page.getByRole('button', { name: 'Save settings' }).waitFor()
    expect(await page.getByLabel('Phone').inputValue()).toBe(CONTACT.phone)
    expect(await page.getByLabel('Contact e-mail').inputValue()).toBe(CONTACT.email)
    expect(await page.getByLabel('Web site').inputValue()).toBe(CONTACT.website)
    expect(await page.getByLabel('Language and region').inputValue()).toBe('en-AU')
    expect(await page.getByRole('combobox', { name: 'Currency' }).inputValue()).toBe('AUD — Australian Dollar')
    expect(await page.getByRole('combobox', { name: 'Time zone' }).inputValue()).toBe('Australia/Sydney')
    expect(await day(page, 'Monday').getByLabel('Opens').inputValue()).toBe('10:30')
    expect(await day(page, 'Monday').getByLabel('Closes').inputValue()).toBe('16:00')
    expect(await day(page, 'Friday').getByLabel('Closes').nth(1).inputValue()).toBe('23:30')
    await day(page, 'Sunday').getByText('Closed').waitFor()
    // The whole form fits the phone's width: no part of it is reached by scrolling sideways.
    const wide = await page.evaluate(() => [...document.querySelectorAll('body *')]
      .filter(el => el.getBoundingClientRect().right > document.documentElement.clientWidth + 0.5)
      .map(el => `${el.tagName.toLowerCase()}.${[...el.classList].join('.')} ${Math.round(el.getBoundingClientRect().right)}`))
    expect(wide, 'elements past the right edge').toEqual([])
    await shot(page, 'venue-settings-phone')
    // What the manager sees on the phone's screen, the save button kept in reach.
    await page.getByRole('combobox', { name: 'Currency' }).scrollIntoViewIfNeeded()
    await page.screenshot({ path: resolve(SHOTS_DIR, 'venue-settings-screen-phone.png') })
    await page.close()

    const home = await guest.context.newPage()
    await home.goto('/')
    const footer = home.getByRole('contentinfo')
    await footer.scrollIntoViewIfNeeded()
    const text = await footer.innerText()
    expect(text).toContain(CONTACT.phone)
    expect(text).toContain(CONTACT.email)
    expect(text).toContain('saltmarsh.test/visit')
    // en-AU writes a 12-hour clock with a lower-case "am"/"pm" (common practice, no source).
    expect(text).toMatch(/Mon\s+10:30\sam – 4:00\spm/)
    expect(text).toMatch(/Fri\s+12:00\spm – 9:00\spm, 9:30\spm – 11:30\spm/)
    expect(text).not.toMatch(/\bSun\b/)
    expect(await footer.getByRole('link', { name: CONTACT.phone }).getAttribute('href')).toBe('tel:+61255501234')
    await footer.screenshot({ path: resolve(SHOTS_DIR, 'venue-footer-phone.png') })
    await home.close()
  }, 90_000)
})
