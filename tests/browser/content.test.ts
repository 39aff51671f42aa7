import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import sharp from 'sharp'
import type { BrowserContext } from 'playwright-core'
import { openBrowser, shot, signInThroughForm } from '../support/browser'
import { DEMO_PASSWORD } from '../../server/demo/data'

describe('the marketing editor', () => {
  let context: BrowserContext
  let close: () => Promise<void>
  beforeAll(async () => ({ context, close } = await openBrowser({ width: 1366, height: 1000 })))
  afterAll(async () => close())

  it('writes a tasting note with live preview, saves, publishes, compares revisions and adds a photo', async () => {
    const page = await context.newPage()
    await signInThroughForm(page, 'marketing@saltmarsh.test', DEMO_PASSWORD)
    await page.waitForURL('**/manage/content')
    await shot(page, 'content-index')
    await page.getByRole('link', { name: /Heron Quay Brut/ }).click()
    await page.getByLabel('Text (Markdown)').fill('## Nose\n\nGreen apple and **brioche**.\n\n<script>alert(1)</script>')
    const preview = page.locator('.prose-larmoir')
    await preview.locator('strong', { hasText: 'brioche' }).waitFor()
    expect(await preview.locator('script').count()).toBe(0)
    expect(await preview.innerText()).toContain('<script>alert(1)</script>')
    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.getByText('Draft saved.').waitFor()
    await page.getByRole('button', { name: 'Publish', exact: true }).click() // the demo's note is published, so Unpublish is there too
    await page.getByText('Published: guests').waitFor()
    await page.getByLabel('Text (Markdown)').fill('## Nose\n\nGreen apple, **brioche** and a little sea salt.')
    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.getByText('Draft saved.').waitFor()
    await page.getByRole('button', { name: 'Compare' }).nth(1).click()
    await page.getByText('What changed since then').waitFor()

    const png = await sharp({ create: { width: 600, height: 800, channels: 3, background: '#e9dcc0' } }).png().toBuffer()
    await page.getByLabel(/^Image \(JPEG, PNG or WebP/).setInputFiles({ name: 'brut-bottle.png', mimeType: 'image/png', buffer: png })
    await page.getByLabel('Describe it (for screen readers)').fill('The Heron Quay Brut bottle')
    await page.getByRole('button', { name: 'Upload' }).click()
    await page.getByText('Uploaded.').waitFor()
    await page.getByRole('img', { name: 'The Heron Quay Brut bottle' }).waitFor()
    const src = await page.getByRole('img', { name: 'The Heron Quay Brut bottle' }).getAttribute('src')
    expect(src).toMatch(/^\/media\/[0-9a-f-]{36}\.png\?w=\d+&f=webp/)
    await shot(page, 'content-editor')
    await page.close()
  })
})
