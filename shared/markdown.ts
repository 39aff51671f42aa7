import MarkdownIt, { type Token } from 'markdown-it'
import type { RenderedText, TextBlock, TextRun } from './types/content'

/** Link targets allowed in notes and articles: web, mail, and the site's own paths and anchors. */
const SAFE_LINK = /^(https?:\/\/|mailto:|\/(?!\/)|#)/i

/**
 * The one Markdown renderer, used by the editor's live preview and by every public page, so the
 * preview is exactly what guests see. Raw HTML is off (tags are shown as text), links are limited
 * to safe schemes, and links open without handing the opener to the target. This configuration is
 * the only sanitiser: nothing else cleans or rewrites the HTML it makes.
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

/** The HTML guests see (and the editor previews) for a piece of Markdown. */
export function renderMarkdown(source: string): string {
  return md.render(source)
}

/**
 * A note rendered once for every reader: the HTML pages show, its structure for the card PDF
 * (paragraphs, list items, bold and italic runs, walked from the same tokens the HTML comes from),
 * and its plain text.
 */
export function renderNote(source: string): RenderedText {
  const env = {}
  const tokens = md.parse(source, env)
  const blocks = blocksOf(tokens)
  return { html: md.renderer.render(tokens, md.options, env), text: blocksToText(blocks), blocks }
}

function blocksToText(blocks: TextBlock[]): string {
  return blocks.map(b => `${b.marker ? `${b.marker} ` : ''}${b.runs.map(r => r.text).join('')}`.replace(/[ \t]+/g, ' ').trim()).filter(Boolean).join('\n')
}

/** Walks markdown-it's block tokens into blocks a non-HTML renderer can lay out. */
function blocksOf(tokens: Token[]): TextBlock[] {
  const out: TextBlock[] = []
  const lists: { ordered: boolean, next: number }[] = []
  let quote = 0
  let heading = false
  let marker: string | undefined
  let row: TextRun[] | null = null
  let headerCell = false
  const push = (runs: TextRun[], kind: TextBlock['kind'] = heading ? 'heading' : 'paragraph') => {
    const block: TextBlock = { kind: marker ? 'item' : kind, runs, depth: lists.length }
    if (marker) block.marker = marker
    if (quote) block.quote = true
    out.push(block)
    marker = undefined
  }
  for (const t of tokens) {
    switch (t.type) {
      case 'bullet_list_open': lists.push({ ordered: false, next: 1 }); break
      case 'ordered_list_open': lists.push({ ordered: true, next: Number(t.attrGet('start') ?? 1) }); break
      case 'bullet_list_close':
      case 'ordered_list_close': lists.pop(); break
      case 'list_item_open': {
        const list = lists.at(-1)
        marker = list?.ordered ? `${list.next++}.` : '•'
        break
      }
      // An empty item still shows its marker.
      case 'list_item_close': if (marker) push([]); break
      case 'blockquote_open': quote++; break
      case 'blockquote_close': quote--; break
      case 'heading_open': heading = true; break
      case 'heading_close': heading = false; break
      case 'tr_open': row = []; break
      case 'th_open': headerCell = true; break
      case 'th_close': headerCell = false; break
      case 'tr_close':
        if (row?.length) push(mergeRuns(row))
        row = null
        break
      case 'code_block':
      case 'fence': push([{ text: t.content.replace(/\n$/, ''), code: true }]); break
      case 'inline': {
        const runs = inlineRuns(t.children ?? [], heading || headerCell)
        if (row) {
          if (row.length) row.push({ text: ' · ' })
          row.push(...runs)
        }
        else push(runs)
        break
      }
    }
  }
  return out
}

function inlineRuns(children: Token[], bold: boolean): TextRun[] {
  const runs: TextRun[] = []
  let strong = bold ? 1 : 0
  let em = 0
  let href: string | undefined
  const add = (text: string, code = false) => {
    if (!text) return
    const run: TextRun = { text }
    if (strong) run.bold = true
    if (em) run.italic = true
    if (code) run.code = true
    if (href) run.href = href
    runs.push(run)
  }
  for (const c of children) {
    switch (c.type) {
      case 'text':
      case 'text_special': add(c.content); break
      case 'code_inline': add(c.content, true); break
      case 'softbreak': add(' '); break
      case 'hardbreak': add('\n'); break
      case 'strong_open': strong++; break
      case 'strong_close': strong--; break
      case 'em_open': em++; break
      case 'em_close': em--; break
      case 'link_open': href = String(c.attrGet('href') ?? '') || undefined; break
      case 'link_close': href = undefined; break
    }
  }
  return mergeRuns(runs)
}

/** Joins neighbouring runs of the same style, so a renderer draws as few pieces as it can. */
function mergeRuns(runs: TextRun[]): TextRun[] {
  const out: TextRun[] = []
  for (const r of runs) {
    const last = out.at(-1)
    if (last && last.bold === r.bold && last.italic === r.italic && last.code === r.code && last.href === r.href) last.text += r.text
    else out.push({ ...r })
  }
  return out
}
