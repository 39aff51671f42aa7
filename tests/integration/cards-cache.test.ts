import { beforeAll, describe, expect, it } from 'vitest'
import type { Client } from '../support/http'
import { signedIn } from '../support/people'
import { inspectPdf } from '../support/pdf'
import { flightWithContent, type ContentFlight } from '../support/content'

/**
 * Card PDFs are kept by their content key (server/cards/pdfCache.ts): the same card asked for again
 * is the kept PDF, and a change to anything printed on it (a note, a venue setting) makes the next
 * PDF anew, with the change in its text.
 */
let flight: ContentFlight
let manager: Client
let marketing: Client

const cardPdf = async () => {
  const res = await manager.raw(`/cards/flights/${flight.flightId}/card.pdf`)
  expect(res.status).toBe(200)
  return Buffer.from(await res.arrayBuffer())
}
/** The card's words with the line breaks and hyphen-free wraps joined (pdftotext). */
const words = (pdf: Buffer) => inspectPdf(pdf).raw.replace(/\s+/g, ' ')

beforeAll(async () => {
  flight = await flightWithContent('card-cache')
  manager = await signedIn('manager')
  marketing = await signedIn('marketing')
})

describe('card PDFs kept by their content', () => {
  it('the same card again is the kept PDF, byte for byte, though made in another second', async () => {
    const first = await cardPdf()
    await new Promise(r => setTimeout(r, 1100)) // a new PDF would carry a later creation date (PDF dates count seconds)
    expect((await cardPdf()).equals(first)).toBe(true)
  })

  it('a changed note is in the next PDF\'s text', async () => {
    const before = words(await cardPdf())
    const marker = `salt-marsh-${Date.now().toString(36)}`
    const path = `/api/content/product_note/${flight.productIds[1]}`
    expect((await marketing.request('PUT', path, { body: `Brioche and a ${marker} finish.` })).status).toBe(200)
    expect((await marketing.post(`${path}/publish`)).status).toBe(200)
    const after = words(await cardPdf())
    expect(before).not.toContain(marker)
    expect(after).toContain(`Brioche and a ${marker} finish.`)
    expect(after).not.toContain('Fine bubbles over toasted almond.') // the note it replaced (tests/support/content.ts)
  })

  it('a changed venue setting is in the next PDF\'s text', async () => {
    const { id: _id, ...settings } = (await manager.get('/api/venue')).body
    expect(settings.volumeUnit).toBe('floz') // the demo venue pours in US fl oz
    const before = words(await cardPdf())
    expect(before).toMatch(/\d fl oz/)
    try {
      expect((await manager.patch('/api/venue', { ...settings, volumeUnit: 'ml' })).status).toBe(200)
      const after = words(await cardPdf())
      expect(after).toMatch(/\d+ mL/)
      expect(after).not.toMatch(/\d fl oz/)
    }
    finally {
      expect((await manager.patch('/api/venue', settings)).status).toBe(200)
    }
    expect(words(await cardPdf())).toBe(before)
  })
})
