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

/**
 * What a failed query means, for the few errors a route handles itself: MariaDB's error numbers
 * (1062 ER_DUP_ENTRY, 1213 ER_LOCK_DEADLOCK, 1205 ER_LOCK_WAIT_TIMEOUT; MariaDB knowledge base,
 * "MariaDB Error Codes"). Drizzle wraps the driver's error, so the chain of causes is searched.
 */
export type DbErrorKind = 'duplicate_key' | 'deadlock' | 'lock_wait_timeout'

const ERRNO_KINDS: Record<number, DbErrorKind> = { 1062: 'duplicate_key', 1213: 'deadlock', 1205: 'lock_wait_timeout' }
const CODE_KINDS: Record<string, DbErrorKind> = { ER_DUP_ENTRY: 'duplicate_key', ER_LOCK_DEADLOCK: 'deadlock', ER_LOCK_WAIT_TIMEOUT: 'lock_wait_timeout' }

function dbErrorKind(error: unknown): DbErrorKind | null {
  let e: unknown = error
  for (let depth = 0; e && typeof e === 'object' && depth < 6; depth++) {
    const { errno, code, cause } = e as { errno?: unknown, code?: unknown, cause?: unknown }
    const kind = (typeof errno === 'number' ? ERRNO_KINDS[errno] : undefined) ?? (typeof code === 'string' ? CODE_KINDS[code] : undefined)
    if (kind) return kind
    e = cause
  }
  return null
}

/** True when a query failed on a unique index. */
export const isDuplicateKey = (error: unknown): boolean => dbErrorKind(error) === 'duplicate_key'

/** True when the server chose this transaction as a deadlock's victim or its lock wait ran out: run it again. */
export const isRetryableLockError = (error: unknown): boolean => {
  const kind = dbErrorKind(error)
  return kind === 'deadlock' || kind === 'lock_wait_timeout'
}
