/**
 * npm run db -- start|stop|status [--test]
 * Manages the private MariaDB instance (dev by default, the test instance with --test).
 */
import { DEV_DB, TEST_DB, startDb, stopDb, dbStatus, databaseUrl } from './lib/mariadb'

const [command = 'status', ...flags] = process.argv.slice(2)
const instance = flags.includes('--test') ? TEST_DB : DEV_DB

try {
  if (command === 'start') {
    await startDb(instance)
    console.log(`MariaDB ${dbStatus(instance)}\n  ${databaseUrl(instance)}`)
  }
  else if (command === 'stop') {
    console.log(await stopDb(instance) ? 'MariaDB stopped.' : 'MariaDB was not running.')
  }
  else if (command === 'status') {
    console.log(`MariaDB ${dbStatus(instance)}`)
  }
  else {
    console.error('usage: npm run db -- start|stop|status [--test]')
    process.exitCode = 2
  }
}
catch (err) {
  console.error(`[db] ${(err as Error).message}`)
  process.exitCode = 1
}
