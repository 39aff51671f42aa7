import { send, setResponseHeader, setResponseStatus, type H3Event } from 'h3'
import { DATABASE_DOWN_MESSAGE, isDatabaseDown } from '../utils/dbErrors'

/**
 * Runs before Nuxt's own error handler: a query that failed because the database is down or went
 * away answers 503 with a short JSON message (and Retry-After) instead of a 500, on every route.
 * Any other error goes on to the next handler unchanged.
 */
export default function databaseErrorHandler(error: unknown, event: H3Event) {
  if (!isDatabaseDown(error)) return
  console.error(`[larmoir] database unavailable on ${event.method} ${event.path}:`, (error as Error).message)
  setResponseStatus(event, 503, 'Service unavailable')
  setResponseHeader(event, 'retry-after', 5)
  setResponseHeader(event, 'content-type', 'application/json')
  setResponseHeader(event, 'cache-control', 'no-store')
  return send(event, JSON.stringify({ statusCode: 503, statusMessage: 'Service unavailable', message: DATABASE_DOWN_MESSAGE }))
}
