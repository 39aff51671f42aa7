import { describe, expect, it } from 'vitest'
import { markdownToText, renderMarkdown } from '../../shared/markdown'

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

  it('gives plain text for cards', () => {
    expect(markdownToText('# Nose\n\nPear & **quince**, <b>no tags</b>')).toBe('Nose Pear & quince, <b>no tags</b>')
  })
})
