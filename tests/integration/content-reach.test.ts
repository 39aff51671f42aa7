import { beforeAll, describe, expect, it } from 'vitest'
import { renderMarkdown } from '../../shared/markdown'
import { Client } from '../support/http'
import { signedIn } from '../support/people'
import { inspectPdf, pdfRuns } from '../support/pdf'
import { CONTENT, flightWithContent, type ContentFlight } from '../support/content'

/**
 * What marketing publishes reaches guests and the printed card with its structure: the flight page,
 * the pour pages, the card print page and the card PDF, each showing the one rendering of the note.
 */
let flight: ContentFlight
const page = async (c: Client, path: string) => {
  const res = await c.raw(path)
  expect(res.status, path).toBe(200)
  return res.text()
}
const introHtml = renderMarkdown(CONTENT.intro)
const listNoteHtml = renderMarkdown(CONTENT.notes[0]!)
const orderedNoteHtml = renderMarkdown(CONTENT.notes[4]!)

beforeAll(async () => {
  flight = await flightWithContent('reach')
})

describe('published content on guest pages', () => {
  it('the flight page shows the introduction, each note as rendered Markdown and the photo through the image route', async () => {
    const html = await page(new Client(), `/flights/${flight.flightId}`)
    // The very HTML the editor's preview renders (shared/markdown.ts), not a copy of its text.
    expect(introHtml).toContain('<strong>tide line</strong>')
    expect(html).toContain(introHtml)
    expect(listNoteHtml).toMatch(/<li>lemon zest<\/li>\n<li>a <strong>chalky<\/strong> finish<\/li>/)
    expect(html).toContain(listNoteHtml)
    expect(html).toContain(orderedNoteHtml)
    for (const note of CONTENT.notes) expect(html).toContain(renderMarkdown(note))
    // The introduction sits near the top: before the first pour.
    expect(html.indexOf(introHtml)).toBeLessThan(html.indexOf(flight.names[0]!))

    const img = html.match(new RegExp(`<img[^>]*${flight.photo.src.replace('.', '\\.')}[^>]*>`))?.[0]
    expect(img, 'an <img> of the uploaded photo').toBeDefined()
    expect(img).toContain(`alt="${CONTENT.photoAlt}"`)
    expect(img).toContain(`width="${flight.photo.width}"`)
    expect(img).toContain(`height="${flight.photo.height}"`)
    expect(img).toMatch(/srcset="\/media\/[^"]+\?w=\d+&amp;f=webp/)
    // The page's own policy runs no inline script, so no tag may carry an inline handler.
    expect(html).not.toMatch(/<[^>]+\son[a-z]+\s*=/i)
    const src = img!.match(/ src="([^"]+)"/)![1]!.replace(/&amp;/g, '&')
    const media = await new Client().raw(src)
    expect(media.status).toBe(200)
    expect(media.headers.get('content-type')).toBe('image/webp')
  })

  it('the pour pages show the note, the photo and the flight\'s introduction', async () => {
    const anon = new Client()
    const one = await page(anon, `/pour/${flight.flightId}/1`)
    expect(one).toContain(listNoteHtml)
    expect(one).toContain(introHtml)
    expect(one).toMatch(new RegExp(`<img[^>]*alt="${CONTENT.photoAlt}"[^>]*>`))
    expect(one).not.toMatch(/<[^>]+\son[a-z]+\s*=/i)
    const api = (await anon.get(`/api/flights/${flight.flightId}/pours/1`)).body
    expect(api.photo.src).toBe(flight.photo.src)
    expect(api.intro.html).toBe(introHtml)

    const all = await page(anon, `/pour/${flight.flightId}`)
    expect(all).toContain(introHtml)
    expect(all).toContain(listNoteHtml)
    expect(all).toContain(orderedNoteHtml)
    expect(all).toContain(`alt="${CONTENT.photoAlt}"`)
  })

  it('the card print page shows the same HTML for the introduction and every note', async () => {
    const html = await page(await signedIn('host'), `/cards/flights/${flight.flightId}`)
    expect(html).toContain(introHtml)
    for (const note of CONTENT.notes) expect(html).toContain(renderMarkdown(note))
    const card = (await (await signedIn('host')).get(`/api/flights/${flight.flightId}/card`)).body
    expect(card.intro.html).toBe(introHtml)
    expect(card.pours[0].tastingNote.html).toBe(listNoteHtml)
    expect(card.pours[0].tastingNote.blocks.map((b: { kind: string }) => b.kind)).toEqual(['paragraph', 'item', 'item'])
  })
})

describe('published content on the card PDF', () => {
  it.each(['a5', 'half-letter'])('%s: one page, the introduction and every note, lists with their markers and bold in the bold face', async (paper) => {
    const res = await (await signedIn('host')).raw(`/cards/flights/${flight.flightId}/card.pdf?paper=${paper}`)
    expect(res.status).toBe(200)
    const bytes = Buffer.from(await res.arrayBuffer())
    const pdf = inspectPdf(bytes, `card-content-${paper}`)
    expect(pdf.pages).toBe(1)
    const flat = pdf.raw.replace(/\s+/g, ' ')
    expect(flat).toContain('A walk along the tide line, from orchard fruit to the still.')
    expect(flat).toContain('Take each pour slowly and watch the glass.')
    expect(flat).toMatch(/•\s*lemon zest/)
    expect(flat).toMatch(/•\s*a chalky finish/)
    expect(flat).toMatch(/1\.\s*Dark cherry/)
    expect(flat).toMatch(/2\.\s*Cocoa and dried fig/)
    for (const word of ['sea salt', 'toasted', 'honeyed', 'warm', 'clean']) expect(flat).toContain(word)

    const runs = pdfRuns(bytes)
    const face = (text: string) => runs.find(r => r.text.includes(text))
    // Bold runs are set in Lora SemiBold; the words around them are not.
    for (const bold of ['tide', 'salt', 'chalky', 'Cocoa', 'toasted']) expect(face(bold)?.family, bold).toBe('Lora-SemiBold')
    for (const plain of ['Quince and', 'lemon zest', 'Dark cherry', 'A walk along']) expect(face(plain)?.family, plain).toBe('Lora')
    // Readable: the note is set at 8.5 pt or more (pdftohtml reads 8.5 pt as 8.67: tests/support/pdf.ts), in the ink of the pour's own lines.
    const pourLine = runs.find(r => /ABV/.test(r.text))!
    expect(face('lemon zest')!.size).toBeGreaterThanOrEqual(8.5)
    expect(face('lemon zest')!.color).toBe(pourLine.color)
  })
})
