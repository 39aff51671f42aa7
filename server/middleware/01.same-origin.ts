/**
 * State-changing requests from another site are refused: a browser sends Origin (and
 * Sec-Fetch-Site) on every cross-site POST, PUT, PATCH and DELETE, so a page elsewhere cannot make a
 * signed-in person's browser book, cancel or edit here. Requests without those headers (the
 * payment provider's webhook, scripts, tests) are not from a browser page and pass; the webhook
 * proves itself by its signature. An Origin that is not a URL at all counts as another site.
 */
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

function hostOf(origin: string): string | null {
  try { return new URL(origin).host }
  catch { return null }
}

export default defineEventHandler((event) => {
  if (SAFE.has(event.method)) return
  const site = getRequestHeader(event, 'sec-fetch-site')
  const origin = getRequestHeader(event, 'origin')
  const host = getRequestHeader(event, 'x-forwarded-host') ?? getRequestHeader(event, 'host')
  const crossSite = site === 'cross-site' || (origin !== undefined && hostOf(origin) !== host)
  if (crossSite) {
    throw createError({ status: 403, statusText: 'Cross-site request', message: 'This request came from another site and was refused.' })
  }
})
