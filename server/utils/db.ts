import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2'
import mysql from 'mysql2/promise'
import * as schema from '../db/schema'

export const tables = schema
export type Db = MySql2Database<typeof schema>
/** The transaction handle drizzle passes to `db.transaction(async tx => …)`. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]

let pool: mysql.Pool | undefined
let db: Db | undefined

/** The one database entry point: a single mysql2 pool and a drizzle instance over it. */
export function useDb(): Db {
  if (!db) {
    pool = mysql.createPool({
      uri: useRuntimeConfig().databaseUrl,
      connectionLimit: 20,
      timezone: 'Z',
      dateStrings: false,
      enableKeepAlive: true,
      connectTimeout: 5000,
    })
    // Instants are UTC on every connection, whatever the server's own default.
    pool.on('connection', (conn) => { conn.query('SET time_zone = \'+00:00\'') })
    db = drizzle(pool, { schema, mode: 'default' })
  }
  return db
}

export async function closeDb(): Promise<void> {
  await pool?.end()
  pool = undefined
  db = undefined
}
