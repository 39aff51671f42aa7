/**
 * npm run db:restore -- <file.sql.gz> [--database NAME] [--test] [--force]
 * Restores a backup into the dev instance's database (the test instance with --test), or into a
 * new database NAME beside it. A database that already has tables is left alone unless --force.
 */
import { resolve } from 'node:path'
import { DEV_DB, TEST_DB, databaseUrl, restoreDatabase, startDb } from './lib/mariadb'

const args = process.argv.slice(2)
const file = args.find(a => !a.startsWith('--') && args[args.indexOf(a) - 1] !== '--database')
const named = args.includes('--database') ? args[args.indexOf('--database') + 1] : undefined
const base = args.includes('--test') ? TEST_DB : DEV_DB

try {
  if (!file) throw new Error('usage: npm run db:restore -- <file.sql.gz> [--database NAME] [--test] [--force]')
  if (named !== undefined && !/^\w{1,64}$/.test(named)) throw new Error('--database takes a name of letters, digits and underscores')
  const instance = { ...base, database: named ?? base.database }
  await startDb(instance) // creates the database and the app's grant on it if they are new
  restoreDatabase(instance, resolve(file), { force: args.includes('--force') })
  console.log(`Restored ${file} into ${databaseUrl(instance)}`)
}
catch (err) {
  console.error(`[db:restore] ${(err as Error).message}`)
  process.exitCode = 1
}
