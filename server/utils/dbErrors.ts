/** True when a query failed on a unique index (MySQL/MariaDB ER_DUP_ENTRY, errno 1062). */
export function isDuplicateKey(err: unknown): boolean {
  const e = err as { errno?: number, code?: string, cause?: { errno?: number, code?: string } }
  return e.errno === 1062 || e.code === 'ER_DUP_ENTRY' || e.cause?.errno === 1062 || e.cause?.code === 'ER_DUP_ENTRY'
}
