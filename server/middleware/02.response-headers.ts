/**
 * Headers that depend on the request: answers of the API and private downloads (booking calendar
 * files and QR codes, the bookings CSV, card PDFs) are never stored by a browser or a shared cache
 * (`no-store`; a route may still say otherwise, as the public flights list does), and a site served
 * over HTTPS tells browsers to use nothing else for a year (HSTS, RFC 6797).
 */
const PRIVATE = /^\/(?:api|reports|cards|bookings)\//

/** One year (common practice, no source). */
const HSTS_MAX_AGE_S = 365 * 24 * 60 * 60

export default defineEventHandler((event) => {
  if (PRIVATE.test(event.path)) setResponseHeader(event, 'cache-control', 'no-store')
  if (servedOverHttps(event) || useRuntimeConfig().appUrl.startsWith('https://')) {
    setResponseHeader(event, 'strict-transport-security', `max-age=${HSTS_MAX_AGE_S}`)
  }
})
