import { beforeAll, describe, expect, it } from 'vitest'
import sharp from 'sharp'
import { allProducts, Client } from '../support/http'
import { countRows } from '../support/db'
import { signedIn } from '../support/people'

let manager: Client
let marketing: Client
let productId: number
let flightId: number

beforeAll(async () => {
  manager = await signedIn('manager')
  marketing = await signedIn('marketing')
  productId = ((await allProducts(manager)) as { id: number, code: string }[]).find(p => p.code === 'SV-ALB-24')!.id
  flightId = ((await manager.get('/api/flights')).body as { id: number, name: string }[]).find(f => f.name === 'Shoreline Flight')!.id
})

const HOSTILE = [
  '# Salt and stone',
  '<script>document.title="owned"</script>',
  '<img src=x onerror="alert(1)">',
  '[tap here](javascript:alert(1))',
  '<a href="https://example.com" onclick="steal()">raw link</a>',
  'Pear, **quince** and a [map](https://example.com/map).',
].join('\n\n')

describe('tasting notes', () => {
  it('a draft never reaches guests; publishing does; hostile Markdown renders inert', async () => {
    const saved = await marketing.request('PUT', `/api/content/product_note/${productId}`, { body: HOSTILE })
    expect(saved.status).toBe(200)
    // Saving writes the draft only; what was published before (the demo's note) stays published.
    expect(saved.body.draftBody).toBe(HOSTILE)
    expect(saved.body.publishedBody).not.toBe(HOSTILE)
    const before = (await new Client().get(`/api/flights/${flightId}`)).body
    expect(before.pours.find((p: { productId: number }) => p.productId === productId).tastingNote.text).not.toContain('Salt and stone')
    expect((await manager.get(`/api/flights/${flightId}/card`)).body.pours.find((p: { name: string }) => p.name === 'Tidewater Albariño').tastingNote.text).not.toContain('Salt and stone')

    expect((await marketing.post(`/api/content/product_note/${productId}/publish`)).body.status).toBe('published')
    const pour = (await new Client().get(`/api/flights/${flightId}`)).body.pours.find((p: { productId: number }) => p.productId === productId)
    const html: string = pour.tastingNote.html
    expect(html).toContain('<h1>Salt and stone</h1>')
    expect(html).toContain('<a href="https://example.com/map" rel="noopener noreferrer nofollow" target="_blank">map</a>')
    expect(html).not.toMatch(/<(script|img|iframe)\b/i) // no active element
    expect(html).not.toMatch(/<[^>]+\son\w+\s*=/i) // no event-handler attribute inside a tag
    expect(html).not.toMatch(/href\s*=\s*["']?\s*javascript:/i) // no javascript: link
    expect(html).toContain('&lt;script&gt;')
    const card = (await manager.get(`/api/flights/${flightId}/card`)).body
    // The card carries the same rendering as the guest pages (HTML for the print page, blocks for the PDF).
    const cardNote = card.pours.find((p: { name: string }) => p.name === 'Tidewater Albariño').tastingNote
    expect(cardNote.html).toBe(html)
    expect(cardNote.text).toMatch(/^Salt and stone\n[\s\S]*quince/)

    // A later draft does not replace what guests see until it is published.
    await marketing.request('PUT', `/api/content/product_note/${productId}`, { body: 'Unreleased words' })
    const still = (await new Client().get(`/api/flights/${flightId}`)).body.pours.find((p: { productId: number }) => p.productId === productId)
    expect(still.tastingNote.text).not.toContain('Unreleased')
  })

  it('keeps every save as a revision with who and when, and restores one', async () => {
    const target = `/api/content/flight_intro/${flightId}`
    await marketing.request('PUT', target, { body: 'First intro' })
    await marketing.request('PUT', target, { body: 'Second intro' })
    await manager.request('PUT', target, { body: 'Third intro' })
    const revs = (await marketing.get(`${target}/revisions`)).body as { id: number, body: string, author: string, action: string }[]
    expect(revs.slice(0, 3).map(r => r.body)).toEqual(['Third intro', 'Second intro', 'First intro'])
    expect(revs[0]!.author).toBe('Odile Brannock')
    expect(revs[1]!.author).toBe('Priya Lindqvist')
    const restored = await marketing.post(`${target}/restore`, { revisionId: revs[2]!.id })
    expect(restored.body.draftBody).toBe('First intro')
    expect(((await marketing.get(`${target}/revisions`)).body as { action: string }[])[0]!.action).toBe('restore')
    expect((await marketing.post(`${target}/restore`, { revisionId: 99999999 })).status).toBe(404)
    await marketing.post(`${target}/publish`)
    expect((await new Client().get(`/api/flights/${flightId}`)).body.intro.text).toBe('First intro')
  })

  it('articles: the shipped default is public, edits stay drafts until published, unpublish hides it', async () => {
    const anon = new Client()
    const list = (await anon.get('/api/articles')).body as { slug: string }[]
    expect(list.map(a => a.slug)).toContain('why-wine-climbs-the-glass')
    const original = (await anon.get('/api/articles/why-wine-climbs-the-glass')).body
    expect(original.html).toContain('Marangoni')
    await marketing.request('PUT', '/api/content/article/why-wine-climbs-the-glass', { title: 'Why wine climbs (edited)', body: 'Edited text' })
    expect((await anon.get('/api/articles/why-wine-climbs-the-glass')).body.html).toContain('Marangoni')
    await marketing.post('/api/content/article/why-wine-climbs-the-glass/publish')
    const edited = (await anon.get('/api/articles/why-wine-climbs-the-glass')).body
    expect(edited.title).toBe('Why wine climbs (edited)')
    expect(edited.html).toContain('Edited text')
    await marketing.post('/api/content/article/why-wine-climbs-the-glass/unpublish')
    expect((await anon.get('/api/articles/why-wine-climbs-the-glass')).status).toBe(404)
    expect(((await anon.get('/api/articles')).body as { slug: string }[]).map(a => a.slug)).not.toContain('why-wine-climbs-the-glass')
    expect((await anon.get('/api/articles/no-such-article')).status).toBe(404)
    expect((await anon.get('/api/articles/..%2F..%2Fetc')).status).toBe(400)
  })

  it('roles: guests and hosts cannot write notes; marketing cannot change prices or ABV', async () => {
    const guest = await signedIn('guest')
    const host = await signedIn('host')
    for (const c of [guest, host]) {
      expect((await c.request('PUT', `/api/content/product_note/${productId}`, { body: 'x' })).status).toBe(403)
      expect((await c.post(`/api/content/product_note/${productId}/publish`)).status).toBe(403)
    }
    expect((await new Client().request('PUT', `/api/content/product_note/${productId}`, { body: 'x' })).status).toBe(401)
    expect((await marketing.patch(`/api/products/${productId}`, { costPerBottleMinor: 1 })).status).toBe(403)
    expect((await marketing.post(`/api/products/${productId}/measurements`, { abvPctVol: 20, residualSugarGL: 1, lab: 'x', method: 'x', measuredOn: '2026-01-01' })).status).toBe(403)
    expect((await marketing.patch(`/api/sessions/1`, { priceMinor: 1 })).status).toBe(403)
    expect((await marketing.request('PUT', '/api/content/recipe/1', { body: 'x' })).status).toBe(400)
    expect((await marketing.request('PUT', '/api/content/product_note/999999', { body: 'x' })).status).toBe(404)
  })
})

async function upload(c: Client, file: Blob, filename: string, fields: Record<string, string> = {}) {
  const form = new FormData()
  form.append('file', file, filename)
  form.append('productId', String(fields.productId ?? productId))
  form.append('role', fields.role ?? 'photo')
  form.append('altText', fields.altText ?? 'A bottle')
  return c.request('POST', '/api/images', form)
}

describe('image uploads', () => {
  const png = () => sharp({ create: { width: 64, height: 48, channels: 3, background: '#c98a2b' } }).png().toBuffer()

  it('takes a PNG even when it is named .exe (the bytes decide), re-encodes it, and serves it resized', async () => {
    const res = await upload(marketing, new Blob([new Uint8Array(await png())]), 'bottle.exe')
    expect(res.status).toBe(201)
    expect(res.body.mimeType).toBe('image/png')
    expect(res.body.src).toMatch(/^[0-9a-f-]{36}\.png$/)
    const media = await new Client().raw(`/media/${res.body.src}?w=64&f=webp`)
    expect(media.headers.get('content-type')).toBe('image/webp')
    expect((await sharp(Buffer.from(await media.arrayBuffer())).metadata()).width).toBe(64) // the image is 64 px wide and 64 is an allowed width
  })

  it('refuses a text file named .jpg and an oversize file, writing nothing', async () => {
    const before = await countRows('images')
    const text = await upload(marketing, new Blob(['just some words, not a picture']), 'photo.jpg')
    expect(text.status).toBe(415)
    expect(text.body.message).toMatch(/JPEG, PNG or WebP/)
    const big = await upload(marketing, new Blob([new Uint8Array(9 * 1024 * 1024).fill(1)]), 'huge.png')
    expect(big.status).toBe(413)
    expect(big.body.message).toMatch(/at most 8 MB/)
    expect(await countRows('images')).toBe(before)
  })

  it('stores a file named with ../ under a generated name', async () => {
    const res = await upload(marketing, new Blob([new Uint8Array(await png())]), '../../../etc/passwd.png')
    expect(res.status).toBe(201)
    expect(res.body.src).not.toContain('..')
    expect(res.body.src).not.toContain('passwd')
    expect((await new Client().raw('/media/..%2F..%2Fetc%2Fpasswd')).status).toBe(404)
  })

  it('strips GPS and other metadata', async () => {
    const withGps = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#25665f' } })
      .jpeg()
      .withExif({ IFD0: { Copyright: 'Test camera owner', Make: 'TestCam' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '43/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '70/1 15/1 0/1' } })
      .toBuffer()
    expect((await sharp(withGps).metadata()).exif).toBeDefined()
    const res = await upload(marketing, new Blob([new Uint8Array(withGps)]), 'with-gps.jpg')
    expect(res.status).toBe(201)
    const stored = Buffer.from(await (await new Client().raw(`/media/${res.body.src}`)).arrayBuffer())
    const meta = await sharp(stored).metadata()
    expect(meta.exif).toBeUndefined()
    expect(stored.includes(Buffer.from('TestCam'))).toBe(false)
    expect(stored.includes(Buffer.from('GPS'))).toBe(false)
  })

  it('deleting an image removes its file; guests and hosts cannot upload', async () => {
    const res = await upload(manager, new Blob([new Uint8Array(await png())]), 'label.png', { role: 'label' })
    expect((await new Client().raw(`/media/${res.body.src}`)).status).toBe(200)
    expect((await manager.request('DELETE', `/api/images/${res.body.id}`)).status).toBe(200)
    expect((await new Client().raw(`/media/${res.body.src}`)).status).toBe(404)
    expect((await upload(await signedIn('guest'), new Blob([new Uint8Array(await png())]), 'x.png')).status).toBe(403)
    expect((await upload(await signedIn('host'), new Blob([new Uint8Array(await png())]), 'x.png')).status).toBe(403)
  })
})
