import { createHash } from 'node:crypto'

/**
 * The content security policy of every page. Scripts run only from our own origin, plus the inline
 * scripts Nuxt itself writes around the page (its runtime config, an import map), each allowed by
 * the SHA-256 of its text (CSP Level 3, "hash-source"). Those are found only in the parts of the
 * document the renderer writes (head and the end of body), never in the app's own HTML, where a
 * venue's or a guest's words appear: a script that got in there has no hash and does not run.
 * Hashes, unlike a per-response nonce, let one rendered page be served to many visitors
 * (server/plugins/pageCache.ts): the policy is a function of the page alone. Data blocks (the
 * hydration payload, the schema.org JSON-LD) are never run and need no hash.
 * Styles allow 'unsafe-inline' — Vue's `:style` bindings (meters, progress bars) and the card print
 * page's `@page` rule are inline styles; scripts never are. Payment opens Stripe Checkout by
 * navigation, and form-action names its origin too (`stripe.checkoutOrigin`).
 * The other security headers are route rules in nuxt.config.ts and server/middleware/02.response-headers.ts;
 * the renderer's X-Powered-By is removed (it tells a stranger what to try first).
 */
export default defineNitroPlugin((nitro) => {
  if (import.meta.dev) return
  nitro.hooks.hook('render:response', (response) => {
    if (response.headers) delete response.headers['x-powered-by']
  })
  nitro.hooks.hook('render:html', (html, { event }) => {
    const hashes = new Set<string>()
    for (const part of [html.head, html.bodyAppend]) for (const chunk of part) for (const text of inlineScripts(chunk)) hashes.add(scriptHash(text))
    setResponseHeader(event, 'content-security-policy', pagePolicy([...hashes]))
  })
})

/** Script types a browser runs (HTML's "classic", "module" and "importmap"); other types are data blocks. */
const RUNS = new Set(['', 'text/javascript', 'application/javascript', 'module', 'importmap'])
const SCRIPT = /<script\b([^>]*)>([\s\S]*?)<\/script>/gi

/** The text of each inline script the browser would run in this piece of HTML. */
function inlineScripts(html: string): string[] {
  const out: string[] = []
  for (const [, attrs = '', text = ''] of html.matchAll(SCRIPT)) {
    if (/\ssrc\s*=/i.test(` ${attrs}`)) continue
    const type = /\stype\s*=\s*["']?([^"'\s>]*)/i.exec(` ${attrs}`)?.[1]?.toLowerCase() ?? ''
    if (RUNS.has(type)) out.push(text)
  }
  return out
}

function scriptHash(text: string): string {
  return `'sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}'`
}

function pagePolicy(scriptHashes: string[]): string {
  const checkout = useRuntimeConfig().stripe.checkoutOrigin
  return [
    `default-src 'self'`,
    `script-src 'self'${scriptHashes.map(h => ` ${h}`).join('')}`,
    `style-src 'self' 'unsafe-inline'`,
    `img-src 'self' data: blob:`,
    `font-src 'self' data:`,
    `connect-src 'self'`,
    `form-action 'self' ${checkout}`,
    `frame-ancestors 'none'`,
    `base-uri 'self'`,
    `object-src 'none'`,
  ].join('; ')
}
