/**
 * npm run db:backup [-- --test]
 * Dumps the dev database (the test instance with --test) into .data/backups/<UTC timestamp>.sql.gz.
 */
import { mkdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { DEV_DB, TEST_DB, dbStatus, dumpDatabase } from './lib/mariadb'

const instance = process.argv.includes('--test') ? TEST_DB : DEV_DB
const dir = resolve(import.meta.dirname, '../.data/backups')

try {
  if (dbStatus(instance) === 'stopped') throw new Error(`MariaDB on port ${instance.port} is not running: npm run db -- start${instance === TEST_DB ? ' --test' : ''}`)
  mkdirSync(dir, { recursive: true })
  const file = resolve(dir, `${new Date().toISOString().replace(/[:.]/g, '-')}.sql.gz`)
  dumpDatabase(instance, file)
  console.log(`Backed up ${instance.database} to ${file}`)
}
catch (err) {
  console.error(`[db:backup] ${(err as Error).message}`)
  process.exitCode = 1
}
