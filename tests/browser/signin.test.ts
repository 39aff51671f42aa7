import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { BrowserContext } from 'playwright-core'
import { openBrowser, shot, signInThroughForm } from '../support/browser'
import { DEMO_PASSWORD } from '../../server/demo/data'

describe('signing in through the browser', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  beforeAll(async () => ({ context, close } = await openBrowser()))
  afterAll(async () => close())

  it('shows the venue on the start page', async () => {
    const page = await context.newPage()
    await page.goto('/')
    expect(await page.locator('h1').innerText()).toContain('Saltmarsh & Vine')
    await shot(page, 'home')
    await page.close()
  })

  it('shows field messages on a bad sign-up', async () => {
    const page = await context.newPage()
    await page.goto('/signup')
    await page.getByLabel('E-mail').fill('not-an-address')
    await page.getByLabel('Password').fill('short')
    await page.getByRole('button', { name: 'Create my account' }).click()
    await page.getByText('Use at least 10 characters').waitFor()
    expect(await page.getByText('Enter a valid e-mail address').count()).toBe(1)
    await shot(page, 'signup-errors')
    await page.close()
  })

  it('a manager lands on the overview and can open the staff and venue pages', async () => {
    const page = await context.newPage()
    await signInThroughForm(page, 'manager@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage')
    await page.getByText('Active products').waitFor()
    await shot(page, 'manager-overview')
    await page.getByRole('link', { name: 'Staff', exact: true }).click()
    await page.waitForURL('**/manage/staff')
    await page.getByText('host@saltmarsh.test').waitFor()
    await shot(page, 'manager-staff')
    await page.getByRole('link', { name: 'Venue', exact: true }).click()
    await page.getByLabel('Legal drinking age').waitFor()
    expect(await page.getByLabel('Legal drinking age').inputValue()).toBe('21')
    await shot(page, 'manager-venue')
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL('**/signin')
    await page.close()
  })

  it('a wrong password shows the message; a guest then lands on their account and is kept out of staff pages', async () => {
    const page = await context.newPage()
    await signInThroughForm(page, 'guest@saltmarsh.test', 'wrong-password')
    await page.getByText('do not match an account').waitFor()
    await shot(page, 'signin-wrong-password')
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL('**/account')
    await page.getByText('Maren Achterberg').first().waitFor()
    await shot(page, 'guest-account')
    await page.goto('/manage/staff')
    await page.getByText('Not for your role').waitFor()
    await shot(page, 'guest-refused-staff-page')
    await page.close()
  })

  it('anonymous visitors are sent to sign in from a staff page', async () => {
    const page = await context.newPage()
    await page.context().clearCookies()
    await page.goto('/manage')
    await page.waitForURL('**/signin?redirect=/manage')
    await page.close()
  })

  it('reads well on a phone', async () => {
    const phone = await openBrowser({ width: 390, height: 844 })
    const page = await phone.context.newPage()
    await page.goto('/signin')
    await shot(page, 'phone-signin')
    await phone.close()
  })
})
