/** `npm start`: MariaDB, the e-mail fake and the built app with demo data, until Ctrl-C. */
import { DEMO_PROFILE, startStack } from './lib/stack'
import { stopDb } from './lib/mariadb'
import { DEMO_PASSWORD, DEMO_USERS } from '../server/demo/data'

const stack = await startStack(DEMO_PROFILE)
const url = `http://localhost:${DEMO_PROFILE.appPort}`
console.log(`
Larmoir is running at ${url}
  Outgoing e-mail (caught locally): ${stack.mailUrl}
  Payments (local Stripe fake, test cards only): ${DEMO_PROFILE.stripePublicUrl}
    pay with 4242 4242 4242 4242, any future expiry, any CVC; 4000 0000 0000 0002 is declined
  Database: MariaDB on 127.0.0.1:${DEMO_PROFILE.db.port} (data in .data/${DEMO_PROFILE.db.name})

Demo sign-ins (password for all: ${DEMO_PASSWORD})
${DEMO_USERS.map(u => `  ${u.role.padEnd(10)} ${u.email}`).join('\n')}

Press Ctrl-C to stop everything.
`)

let stopping = false
async function shutdown() {
  if (stopping) return
  stopping = true
  console.log('\nStopping the app, the e-mail and payment fakes and MariaDB…')
  await stack.stop()
  await stopDb(DEMO_PROFILE.db)
  process.exit(0)
}
process.on('SIGINT', shutdown)
process.on('SIGTERM', shutdown)
stack.app.child.on('exit', (code) => {
  if (!stopping) {
    console.error(`The app stopped unexpectedly (code ${code}); see .data/app-demo.log`)
    void shutdown()
  }
})
