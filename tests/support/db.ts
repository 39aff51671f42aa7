import mysql from 'mysql2/promise'
import { inject } from 'vitest'

/** Direct access to the test database, for setting up time (expired links) and checking rows. */
export async function withDb<T>(fn: (conn: mysql.Connection) => Promise<T>): Promise<T> {
  const conn = await mysql.createConnection({ uri: inject('databaseUrl'), timezone: 'Z' })
  try { return await fn(conn) }
  finally { await conn.end() }
}

export async function countRows(table: string, where = '1=1', params: unknown[] = []): Promise<number> {
  return withDb(async (c) => {
    const [rows] = await c.query(`SELECT COUNT(*) AS n FROM \`${table}\` WHERE ${where}`, params)
    return Number((rows as { n: number }[])[0]?.n ?? 0)
  })
}
