import { randomBytes } from 'node:crypto'

/**
 * The content security policy of every page, with a fresh nonce per response: Nuxt's inline
 * start-up script (its runtime config) carries the nonce, every other script comes from /_nuxt.
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
    const nonce = randomBytes(16).toString('base64')
    const tag = (s: string) => s.replace(/<script(?![^>]*\snonce=)/g, `<script nonce="${nonce}"`)
    for (const part of ['head', 'bodyPrepend', 'body', 'bodyAppend'] as const) html[part] = html[part].map(tag)
    setResponseHeader(event, 'content-security-policy', pagePolicy(nonce))
  })
})

export function pagePolicy(nonce: string): string {
  const checkout = useRuntimeConfig().stripe.checkoutOrigin
  return [
    `default-src 'self'`,
    `script-src 'self' 'nonce-${nonce}'`,
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
