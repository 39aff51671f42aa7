import MarkdownIt from 'markdown-it'

/** Link targets allowed in notes and articles: web, mail, and the site's own paths and anchors. */
const SAFE_LINK = /^(https?:\/\/|mailto:|\/(?!\/)|#)/i

/**
 * The one Markdown renderer, used by the editor's live preview and by every public page, so the
 * preview is exactly what guests see. Raw HTML is off (tags are shown as text), links are limited
 * to safe schemes, and links open without handing the opener to the target.
 */
const md = new MarkdownIt({ html: false, linkify: true, typographer: true, breaks: false })

md.validateLink = (url: string) => SAFE_LINK.test(url.trim())

const defaultLinkOpen = md.renderer.rules.link_open ?? ((tokens, idx, options, _env, self) => self.renderToken(tokens, idx, options))
md.renderer.rules.link_open = (tokens, idx, options, env, self) => {
  const token = tokens[idx]!
  const href = String(token.attrGet('href') ?? '')
  if (/^https?:\/\//i.test(href)) {
    token.attrSet('rel', 'noopener noreferrer nofollow')
    token.attrSet('target', '_blank')
  }
  return defaultLinkOpen(tokens, idx, options, env, self)
}
// Images in notes would load from anywhere: notes use uploaded photos instead.
md.disable('image')

export function renderMarkdown(source: string): string {
  return md.render(source)
}

/** Plain text of a note (for the PDF card and summaries): Markdown rendered, tags stripped. */
export function markdownToText(source: string): string {
  return md.render(source).replace(/<\/?(p|h\d|li|ul|ol|blockquote|pre|br|hr|table|tr|td|th)\b[^>]*>/g, ' ').replace(/<[^>]+>/g, '').replace(/&amp;/g, '&').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;/g, '\'').replace(/\s+/g, ' ').trim()
}
