/**
 * robots.txt (RFC 9309): the public pages are open to crawlers; staff pages, a guest's own pages
 * and the printed cards are not listed for them; the sitemap is named by its absolute address, as
 * the sitemaps.org protocol asks.
 */
const PRIVATE_PATHS = ['/manage', '/host', '/cards/', '/book/', '/bookings', '/account', '/welcome', '/reset-password', '/reports/']

export default defineEventHandler((event) => {
  setResponseHeader(event, 'content-type', 'text/plain; charset=utf-8')
  return ['User-agent: *', 'Allow: /', ...PRIVATE_PATHS.map(p => `Disallow: ${p}`), '', `Sitemap: ${appLink('/sitemap.xml')}`, ''].join('\n')
})
