import { mkdtempSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { resolve } from 'node:path'
import mysql from 'mysql2/promise'
import { afterAll, describe, expect, it } from 'vitest'
import { databaseUrl, dumpDatabase, resetDatabase, restoreDatabase, startDb, stopDb, type DbInstance } from '../../scripts/lib/mariadb'
import { TEST_PROFILE } from '../../scripts/lib/stack'
import { signedIn } from '../support/people'
import { bookAndPay, newGuest, newSession } from '../support/booking'

const offset = Number(process.env.LARMOIR_PORT_OFFSET ?? 0) || 0
const RESTORE_DB: DbInstance = { ...TEST_PROFILE.db, name: 'restore-db', port: 3420 + offset }

async function rows(i: DbInstance, sql: string): Promise<unknown[]> {
  const conn = await mysql.createConnection({ uri: databaseUrl(i), timezone: 'Z' })
  try { return (await conn.query(sql))[0] as unknown[] }
  finally { await conn.end() }
}

describe('backup and restore', () => {
  const dir = mkdtempSync(resolve(tmpdir(), 'larmoir-backup-'))
  afterAll(async () => {
    await stopDb(RESTORE_DB)
    rmSync(dir, { recursive: true, force: true })
  })

  it('a dump of the test database restores into a fresh instance with the same bookings', { timeout: 60_000 }, async () => {
    const manager = await signedIn('manager')
    const session = await newSession(manager, { seats: 6 })
    const paid = await bookAndPay(await newGuest('backup'), session.id, 2)

    // Other test files keep writing while this one runs (and the sweep expires holds), so the dump is
    // compared with the rows that stood still: those last changed before the dump began.
    const tables = ['bookings', 'users', 'tasting_sessions', 'payment_events', 'products', 'outbox']
    const { cutoff } = (await rows(TEST_PROFILE.db, 'SELECT UTC_TIMESTAMP(3) AS cutoff') as { cutoff: Date }[])[0]!
    const maxIds = new Map<string, number>()
    for (const table of tables) maxIds.set(table, Number(((await rows(TEST_PROFILE.db, `SELECT COALESCE(MAX(id), 0) AS m FROM \`${table}\``)) as { m: number }[])[0]!.m))

    const file = resolve(dir, 'test.sql.gz')
    dumpDatabase(TEST_PROFILE.db, file)
    expect(statSync(file).size).toBeGreaterThan(1000)

    await startDb(RESTORE_DB)
    resetDatabase(RESTORE_DB)
    restoreDatabase(RESTORE_DB, file)
    const all = 'SELECT * FROM bookings ORDER BY id'
    const restored = await rows(RESTORE_DB, all) as { id: number, reference: string }[]
    const still = (await rows(TEST_PROFILE.db, all) as { id: number, updated_at: Date }[]).filter(r => r.updated_at < cutoff)
    expect(still.length).toBeGreaterThan(0)
    const restoredById = new Map(restored.map(r => [r.id, r]))
    expect(still.map(r => restoredById.get(r.id))).toEqual(still)
    expect(restored.some(r => r.reference === paid.reference)).toBe(true)
    for (const table of tables) {
      const count = `SELECT COUNT(*) AS n FROM \`${table}\` WHERE id <= ${maxIds.get(table)}`
      expect(await rows(RESTORE_DB, count), table).toEqual(await rows(TEST_PROFILE.db, count))
    }

    expect(() => restoreDatabase(RESTORE_DB, file), 'refuses to overwrite').toThrow(/--force/)
    restoreDatabase(RESTORE_DB, file, { force: true })
    expect(await rows(RESTORE_DB, all)).toEqual(restored)
  })
})
