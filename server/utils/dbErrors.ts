/**
 * mysql2's codes for "the database is not there" (refused, lost, timed out, shutting down, full),
 * as opposed to an error in a query. Drizzle and h3 wrap the driver's error, so the chain of causes
 * is searched.
 */
const DOWN_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', 'EAI_AGAIN',
  'PROTOCOL_CONNECTION_LOST', 'PROTOCOL_SEQUENCE_TIMEOUT', 'PROTOCOL_ENQUEUE_AFTER_FATAL_ERROR',
  'ER_SERVER_SHUTDOWN', 'ER_CON_COUNT_ERROR', 'ER_CONNECTION_KILLED', 'ER_QUERY_INTERRUPTED', 'ER_CLIENT_INTERACTION_TIMEOUT',
])

export function isDatabaseDown(error: unknown): boolean {
  let e: unknown = error
  for (let depth = 0; e && typeof e === 'object' && depth < 6; depth++) {
    const { code, fatal, cause, message, statusCode } = e as { code?: unknown, fatal?: unknown, cause?: unknown, message?: unknown, statusCode?: unknown }
    if (typeof code === 'string' && DOWN_CODES.has(code)) return true
    // mysql2 marks errors that end the connection fatal, some without a code ("Can't add new
    // command when connection is in closed state"). Nuxt's own `fatal` page errors carry a status.
    if (fatal === true && statusCode === undefined && typeof message === 'string' && /connection/i.test(message)) return true
    if (e instanceof AggregateError && e.errors.some(isDatabaseDown)) return true
    e = cause
  }
  return false
}

export const DATABASE_DOWN_MESSAGE = 'The database is not answering. Please try again in a moment.'

/** True when a query failed on a unique index (MySQL/MariaDB ER_DUP_ENTRY, errno 1062). */
export function isDuplicateKey(err: unknown): boolean {
  const e = err as { errno?: number, code?: string, cause?: { errno?: number, code?: string } }
  return e.errno === 1062 || e.code === 'ER_DUP_ENTRY' || e.cause?.errno === 1062 || e.cause?.code === 'ER_DUP_ENTRY'
}
