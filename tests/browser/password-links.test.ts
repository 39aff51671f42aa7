import { describe, expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { openBrowser, shot, signInThroughForm } from '../support/browser'
import { Client, uniqueEmail } from '../support/http'
import { linkUrl, waitForMail } from '../support/mail'
import { newGuest } from '../support/booking'
import { DEMO_PASSWORD } from '../../server/demo/data'

/**
 * The two pages that set a password from a one-time e-mail link, completed in the browser: a
 * staff invitation (/welcome) and a password reset (/reset-password).
 */

/** What the server says about the browser's own session, asked from inside the page. */
async function accountSeenBy(page: Page): Promise<{ status: number, body: { email?: string, name?: string, role?: string } }> {
  return page.evaluate(async () => {
    const res = await fetch('/api/account')
    return { status: res.status, body: await res.json() }
  })
}

describe('choosing a password from an e-mailed link', () => {
  it('a manager invites a host from the staff page; the link sets the password and signs the browser in as that host', async () => {
    const name = 'Ansel Marrow'
    const email = uniqueEmail('welcome-host')
    const manager = await openBrowser()
    const newcomer = await openBrowser()
    const latecomer = await openBrowser()
    try {
      const staffPage = await manager.context.newPage()
      await signInThroughForm(staffPage, 'manager@saltmarsh.test', DEMO_PASSWORD)
      await staffPage.waitForURL('**/manage')
      await staffPage.goto('/manage/staff')
      const invite = staffPage.locator('form', { has: staffPage.getByRole('button', { name: 'Send invitation' }) })
      await invite.getByLabel('Name').fill(name)
      await invite.getByLabel('E-mail').fill(email)
      await invite.getByLabel('Role').selectOption('host')
      await invite.getByRole('button', { name: 'Send invitation' }).click()
      await staffPage.getByText(`Invitation sent to ${email}`).waitFor()

      const link = linkUrl(await waitForMail(email, /invited/), '/welcome')
      expect(new URL(link).origin, 'the link points at this app').toBe(new URL(inject('appUrl')).origin)

      const page = await newcomer.context.newPage()
      await page.goto(link)
      const password = page.getByLabel('New password')
      await password.waitFor()
      expect(await password.getAttribute('type')).toBe('password')
      const submit = page.getByRole('button', { name: 'Set my password' })
      await submit.waitFor()
      await shot(page, 'welcome-form')
      expect((await accountSeenBy(page)).status, 'not signed in before the password is set').toBe(401)
      await password.fill('host-password-from-link')
      await submit.click()

      await page.waitForURL(u => u.pathname === '/host')
      const nav = page.getByRole('navigation', { name: 'Main' })
      await nav.getByRole('link', { name: new RegExp(name) }).waitFor()
      await nav.getByRole('link', { name: 'The day', exact: true }).waitFor()
      expect(await nav.getByRole('link', { name: 'Staff', exact: true }).count(), 'a host has no staff page link').toBe(0)
      await shot(page, 'welcome-signed-in-host')
      const account = await accountSeenBy(page)
      expect(account.status).toBe(200)
      expect(account.body).toMatchObject({ email, name, role: 'host' })

      // The link works once: a second browser with the same link is told so and stays signed out.
      const again = await latecomer.context.newPage()
      await again.goto(link)
      await again.getByLabel('New password').fill('another-password-here')
      await again.getByRole('button', { name: 'Set my password' }).click()
      await again.getByRole('alert').filter({ hasText: /already been used/ }).waitFor()
      expect(new URL(again.url()).pathname).toBe('/welcome')
      expect((await accountSeenBy(again)).status).toBe(401)
    }
    finally {
      await manager.close()
      await newcomer.close()
      await latecomer.close()
    }
  })

  it('a guest asks for a reset on /forgot-password; the e-mailed link sets a new password and signs the browser in', async () => {
    const guest = await newGuest('reset-in-browser')
    const oldPassword = 'guest-password-1' // what newGuest signs up with (tests/support/booking.ts)
    const newPassword = 'a-new-password-from-link'
    expect((await new Client().signIn(guest.email, oldPassword)).status, 'the old password works before').toBe(200)
    const asking = await openBrowser()
    const resetting = await openBrowser()
    try {
      const page = await asking.context.newPage()
      await page.goto('/forgot-password')
      await page.getByLabel('E-mail').fill(guest.email)
      await page.getByRole('button', { name: 'Send me a link' }).click()
      await page.getByRole('status').filter({ hasText: /If an account exists/ }).waitFor()

      const link = linkUrl(await waitForMail(guest.email, /Reset your/), '/reset-password')
      const reset = await resetting.context.newPage()
      await reset.goto(link)
      expect(new URL(reset.url()).pathname).toBe('/reset-password')
      const password = reset.getByLabel('New password')
      await password.waitFor()
      expect(await password.getAttribute('type')).toBe('password')
      await shot(reset, 'reset-password-form')
      await password.fill(newPassword)
      await reset.getByRole('button', { name: 'Save my new password' }).click()

      await reset.waitForURL(u => u.pathname === '/account')
      await reset.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: new RegExp(guest.name) }).waitFor()
      await shot(reset, 'reset-password-signed-in')
      const account = await accountSeenBy(reset)
      expect(account.status).toBe(200)
      expect(account.body).toMatchObject({ email: guest.email, role: 'guest' })
    }
    finally {
      await asking.close()
      await resetting.close()
    }
    expect((await new Client().signIn(guest.email, oldPassword)).status, 'the old password no longer works').toBe(401)
    expect((await new Client().signIn(guest.email, newPassword)).status, 'the new password works').toBe(200)
  })

  it.each([
    ['/welcome', 'Set my password'],
    ['/reset-password', 'Save my new password'],
  ])('the server-rendered %s holds the password form', async (path, submitLabel) => {
    const res = await new Client().raw(`${path}?token=x`)
    expect(res.status).toBe(200)
    const html = await res.text()
    expect(html).toContain('type="password"')
    expect(html).toContain(submitLabel)
  })
})
