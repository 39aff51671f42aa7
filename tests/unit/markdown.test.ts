import { describe, expect, it } from 'vitest'
import { renderMarkdown, renderNote } from '../../shared/markdown'

describe('the Markdown renderer', () => {
  it('renders Markdown', () => {
    expect(renderMarkdown('**Salt** and _stone_')).toBe('<p><strong>Salt</strong> and <em>stone</em></p>\n')
  })

  it.each([
    ['a script tag', '<script>alert(1)</script>'],
    ['an event-handler attribute', '<img src=x onerror="alert(1)">'],
    ['raw HTML', '<div style="position:fixed">overlay</div><iframe src="https://example.com"></iframe>'],
    ['an SVG with script', '<svg onload=alert(1)><script>alert(2)</script></svg>'],
  ])('shows %s as text, never as markup', (_label, source) => {
    const html = renderMarkdown(source)
    expect(html).not.toMatch(/<(script|img|div|iframe|svg)\b/i)
    expect(html).toContain('&lt;')
  })

  it.each([
    ['javascript:', '[click](javascript:alert(1))'],
    ['JavaScript: in mixed case with spaces', '[click]( JaVaScRiPt:alert(1) )'],
    ['data:', '[x](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)'],
    ['vbscript:', '[x](vbscript:msgbox(1))'],
    ['protocol-relative', '[x](//evil.example/)'],
    ['an encoded javascript:', '[x](&#106;avascript:alert(1))'],
  ])('refuses %s links', (_label, source) => {
    const html = renderMarkdown(source)
    expect(html).not.toMatch(/href=/i)
  })

  it('keeps web, mail and own-site links, and protects outside ones', () => {
    const html = renderMarkdown('[a](https://example.com) [b](mailto:x@example.com) [c](/glass) [d](#top)')
    expect(html).toContain('href="https://example.com" rel="noopener noreferrer nofollow" target="_blank"')
    expect(html).toContain('href="mailto:x@example.com"')
    expect(html).toContain('href="/glass"')
    expect(html).toContain('href="#top"')
  })

  it('drops Markdown images (notes use uploaded photos)', () => {
    expect(renderMarkdown('![x](https://example.com/x.png)')).not.toMatch(/<img/)
  })

  it('renders a note once: the same HTML as the preview, its structure for the PDF, its text', () => {
    const source = '# Nose\n\nPear & **quince**, <b>no tags</b>\n\n- lemon _zest_\n- a **_saline_** finish\n  - long\n\n3. swirl\n4. [wait](https://example.com)\n\n> quoted  \n> line'
    const note = renderNote(source)
    expect(note.html).toBe(renderMarkdown(source))
    expect(note.blocks).toEqual([
      { kind: 'heading', depth: 0, runs: [{ text: 'Nose', bold: true }] },
      { kind: 'paragraph', depth: 0, runs: [{ text: 'Pear & ' }, { text: 'quince', bold: true }, { text: ', <b>no tags</b>' }] },
      { kind: 'item', depth: 1, marker: '•', runs: [{ text: 'lemon ' }, { text: 'zest', italic: true }] },
      { kind: 'item', depth: 1, marker: '•', runs: [{ text: 'a ' }, { text: 'saline', bold: true, italic: true }, { text: ' finish' }] },
      { kind: 'item', depth: 2, marker: '•', runs: [{ text: 'long' }] },
      { kind: 'item', depth: 1, marker: '3.', runs: [{ text: 'swirl' }] },
      { kind: 'item', depth: 1, marker: '4.', runs: [{ text: 'wait', href: 'https://example.com' }] },
      { kind: 'paragraph', depth: 0, quote: true, runs: [{ text: 'quoted\nline' }] },
    ])
    expect(note.text).toBe('Nose\nPear & quince, <b>no tags</b>\n• lemon zest\n• a saline finish\n• long\n3. swirl\n4. wait\nquoted\nline')
  })

  it('gives refused links no target in the structure either', () => {
    expect(renderNote('[x](javascript:alert(1))').blocks[0]!.runs.some(r => r.href)).toBe(false)
  })
})
