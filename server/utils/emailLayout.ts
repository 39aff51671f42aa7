import type { Venue } from '../db/schema/venues'
import { telHref, websiteLabel } from '../../shared/venueContact'

/**
 * One e-mail, written once as blocks and rendered twice: as plain text and as simple HTML (the
 * two parts of a multipart/alternative message). Every string is text: the HTML escapes all of
 * it, so nothing a guest typed can become markup. Inline styles only, since mail programs drop
 * style sheets; one column, 560 px at most, readable on a phone.
 */
export type EmailBlock
  = | { kind: 'text', text: string }
  /** Label and value rows: reference, flight, when, where. */
    | { kind: 'facts', rows: [string, string][] }
    | { kind: 'list', title: string, items: string[] }
  /** A sentence that must not be missed (the cancellation cut-off). */
    | { kind: 'notice', text: string }
    | { kind: 'action', label: string, href: string }
  /** The booking reference in large type, with its QR code when the message carries one (`cid`). */
    | { kind: 'code', reference: string, qrCid?: string, caption: string }

export interface EmailContent {
  venue: Pick<Venue, 'name' | 'address' | 'phone' | 'email' | 'website'>
  subject: string
  heading: string
  greeting: string
  blocks: EmailBlock[]
}

// Larmoir's palette (tailwind.config.ts): paper, ink, lagoon for actions, amber for what to mind.
const C = { paper: '#faf7f1', ink: '#1e2326', soft: '#4a5459', faint: '#58636a', line: '#e3ddd2', lagoon: '#25665f', lagoonBg: '#eef6f5', lagoonLine: '#d5eae7', amberBg: '#fbefd9', amberLine: '#efc27a' }
const SANS = 'ui-sans-serif,system-ui,-apple-system,\'Segoe UI\',Roboto,\'Helvetica Neue\',Arial,sans-serif'
const SERIF = 'Lora,Georgia,\'Times New Roman\',serif'

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)
}

/** Only links the app makes itself: web pages, mail and phone. Anything else is not a link. */
function safeHref(href: string): string | null {
  return /^(https?:\/\/|mailto:|tel:)/i.test(href) ? href : null
}

function footerLines(v: EmailContent['venue']): { label: string, text: string, href: string | null }[] {
  return [
    { label: '', text: v.address, href: null },
    ...(v.phone ? [{ label: 'Phone', text: v.phone, href: telHref(v.phone) }] : []),
    ...(v.email ? [{ label: 'E-mail', text: v.email, href: `mailto:${v.email}` }] : []),
    ...(v.website ? [{ label: 'Web', text: websiteLabel(v.website), href: safeHref(v.website) }] : []),
  ]
}

function textOf(c: EmailContent): string {
  const out: string[] = [c.heading, '', c.greeting, '']
  for (const b of c.blocks) {
    if (b.kind === 'text' || b.kind === 'notice') out.push(b.text)
    else if (b.kind === 'facts') out.push(...b.rows.map(([k, v]) => `${k}: ${v}`))
    else if (b.kind === 'list') out.push(`${b.title}:`, ...b.items.map(i => `- ${i}`))
    else if (b.kind === 'action') out.push(`${b.label}: ${b.href}`)
    else out.push(`Your reference: ${b.reference}`, b.caption)
    out.push('')
  }
  out.push('--', c.venue.name, ...footerLines(c.venue).map(l => (l.label ? `${l.label}: ${l.text}` : l.text)))
  return out.join('\n')
}

const p = (inner: string, style = '') => `<p style="margin:0 0 16px;${style}">${inner}</p>`

function blockHtml(b: EmailBlock): string {
  switch (b.kind) {
    case 'text':
      return p(escapeHtml(b.text))
    case 'notice':
      return `<div style="margin:0 0 16px;padding:12px 14px;background:${C.amberBg};border:1px solid ${C.amberLine};border-radius:6px;">${escapeHtml(b.text)}</div>`
    case 'facts':
      return `<table role="presentation" cellpadding="0" cellspacing="0" style="width:100%;margin:0 0 16px;border-collapse:collapse;">${b.rows.map(([k, v]) =>
        `<tr><th scope="row" align="left" valign="top" style="padding:6px 12px 6px 0;width:7.5em;font-weight:600;color:${C.soft};border-top:1px solid ${C.line};">${escapeHtml(k)}</th>`
        + `<td valign="top" style="padding:6px 0;border-top:1px solid ${C.line};">${escapeHtml(v)}</td></tr>`).join('')}</table>`
    case 'list':
      return `<h2 style="margin:0 0 8px;font-family:${SERIF};font-size:17px;">${escapeHtml(b.title)}</h2>`
        + `<ul style="margin:0 0 16px;padding-left:20px;color:${C.soft};">${b.items.map(i => `<li style="margin:0 0 4px;">${escapeHtml(i)}</li>`).join('')}</ul>`
    case 'action': {
      const href = safeHref(b.href)
      return href
        ? p(`<a href="${escapeHtml(href)}" style="display:inline-block;padding:12px 20px;background:${C.lagoon};color:#ffffff;border-radius:6px;font-weight:600;text-decoration:none;">${escapeHtml(b.label)}</a>`)
        : p(escapeHtml(`${b.label}: ${b.href}`))
    }
    case 'code':
      return `<div style="margin:0 0 16px;padding:16px;text-align:center;background:${C.lagoonBg};border:1px solid ${C.lagoonLine};border-radius:8px;">`
        + (b.qrCid ? `<img src="cid:${escapeHtml(b.qrCid)}" width="160" height="160" alt="QR code of booking reference ${escapeHtml(b.reference)}" style="display:block;margin:0 auto 8px;width:160px;height:160px;background:#ffffff;">` : '')
        + `<p style="margin:0;font-family:ui-monospace,Menlo,Consolas,monospace;font-size:24px;font-weight:600;letter-spacing:0.15em;">${escapeHtml(b.reference)}</p>`
        + `<p style="margin:4px 0 0;font-size:14px;color:${C.soft};">${escapeHtml(b.caption)}</p></div>`
  }
}

function htmlOf(c: EmailContent): string {
  const first = c.blocks.find(b => b.kind === 'text')
  const footer = footerLines(c.venue).map((l) => {
    const text = escapeHtml(l.text)
    const shown = l.href ? `<a href="${escapeHtml(l.href)}" style="color:${C.lagoon};">${text}</a>` : text
    return `<div>${l.label ? `${escapeHtml(l.label)}: ` : ''}${shown}</div>`
  }).join('')
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="color-scheme" content="light">
<title>${escapeHtml(c.subject)}</title>
</head>
<body style="margin:0;padding:0;background:${C.paper};color:${C.ink};font-family:${SANS};font-size:16px;line-height:1.5;">
${first && first.kind === 'text' ? `<div style="display:none;max-height:0;overflow:hidden;">${escapeHtml(first.text)}</div>` : ''}
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:${C.paper};"><tr><td align="center" style="padding:24px 12px;">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="max-width:560px;background:#ffffff;border:1px solid ${C.line};border-radius:8px;">
<tr><td style="padding:20px 24px 0;font-family:${SERIF};font-size:15px;font-weight:600;color:${C.soft};">${escapeHtml(c.venue.name)}</td></tr>
<tr><td style="padding:8px 24px 8px;">
<h1 style="margin:0 0 16px;font-family:${SERIF};font-size:26px;line-height:1.25;font-weight:600;">${escapeHtml(c.heading)}</h1>
${p(escapeHtml(c.greeting))}
${c.blocks.map(blockHtml).join('\n')}
</td></tr>
<tr><td style="padding:16px 24px 20px;border-top:1px solid ${C.line};font-size:14px;color:${C.faint};">
<div style="font-weight:600;color:${C.soft};">${escapeHtml(c.venue.name)}</div>
${footer}
</td></tr>
</table>
</td></tr></table>
</body>
</html>
`
}

/** The message's text and HTML parts, from the same blocks. */
export function renderEmail(c: EmailContent): { text: string, html: string } {
  return { text: textOf(c), html: htmlOf(c) }
}
