/**
 * State-changing requests from another site are refused: a browser sends Origin (and
 * Sec-Fetch-Site) on every cross-site POST, PUT, PATCH and DELETE, so a page elsewhere cannot make a
 * signed-in person's browser book, cancel or edit here. The full origin (scheme, host and port) of
 * Origin, else of Referer, must be the configured site URL's (NUXT_APP_URL); the request's own Host
 * and X-Forwarded-Host are not consulted, since whoever sends the request writes them.
 * Requests with none of these headers (the payment provider's webhook, scripts, tests) are not from
 * a browser page and pass; the webhook proves itself by its signature. An Origin or Referer that is
 * not a URL at all (Origin: null from a sandboxed frame) counts as another site.
 */
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

function originOf(url: string): string | null {
  try {
    const origin = new URL(url).origin
    return origin === 'null' ? null : origin
  }
  catch { return null }
}

export default defineEventHandler((event) => {
  if (SAFE.has(event.method)) return
  const site = getRequestHeader(event, 'sec-fetch-site')
  const claimed = getRequestHeader(event, 'origin') ?? getRequestHeader(event, 'referer')
  const ours = originOf(useRuntimeConfig().appUrl)
  const crossSite = site === 'cross-site' || (claimed !== undefined && originOf(claimed) !== ours)
  if (crossSite) {
    throw createError({ status: 403, statusText: 'Cross-site request', message: 'This request came from another site and was refused.' })
  }
})
