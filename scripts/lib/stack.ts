import { mkdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { DEV_DB, TEST_DB, databaseUrl, resetDatabase, startDb, type DbInstance } from './mariadb'
import { startMailFake, type MailFake } from '../fakes/mail'
import { startApp, type RunningApp } from './app'

/**
 * Everything the app needs on one machine: MariaDB, the e-mail fake and the built server, for the
 * demo (`npm start`) or for the tests (`npm test`), on separate ports and databases.
 */
export interface StackProfile {
  name: 'demo' | 'test'
  db: DbInstance
  appPort: number
  smtpPort: number
  mailHttpPort: number
  env: Record<string, string>
}

export const DEMO_PROFILE: StackProfile = {
  name: 'demo',
  db: DEV_DB,
  appPort: 3000,
  smtpPort: 2525,
  mailHttpPort: 1080,
  env: {
    NUXT_APP_URL: 'http://localhost:3000',
    NUXT_DEMO_SEED: 'true',
    NUXT_SESSION_PASSWORD: 'demo-only-session-password-change-me-in-production',
  },
}

/** LARMOIR_PORT_OFFSET shifts every test port, so two checkouts can run their tests side by side. */
const offset = Number(process.env.LARMOIR_PORT_OFFSET ?? 0) || 0

export const TEST_PROFILE: StackProfile = {
  name: 'test',
  db: { ...TEST_DB, port: TEST_DB.port + offset },
  appPort: 3100 + offset,
  smtpPort: 2526 + offset,
  mailHttpPort: 1081 + offset,
  env: {
    NUXT_APP_URL: `http://127.0.0.1:${3100 + offset}`,
    NUXT_DEMO_SEED: 'true',
    NUXT_TRUST_PROXY: 'true',
    NUXT_OUTBOX_INTERVAL_SECONDS: '1',
    NUXT_SESSION_PASSWORD: 'test-only-session-password-at-least-32-characters',
  },
}

export interface RunningStack { app: RunningApp, mail: MailFake, mailUrl: string, profile: StackProfile, stop: () => Promise<void> }

export async function startStack(profile: StackProfile, opts: { freshDatabase?: boolean } = {}): Promise<RunningStack> {
  const dataDir = resolve(import.meta.dirname, '../../.data')
  mkdirSync(dataDir, { recursive: true })
  await startDb(profile.db)
  if (opts.freshDatabase) resetDatabase(profile.db)
  const mail = await startMailFake({ smtpPort: profile.smtpPort, httpPort: profile.mailHttpPort, dir: resolve(dataDir, `mail-${profile.name}`) })
  let app: RunningApp
  try {
    app = await startApp({
      port: profile.appPort,
      logFile: resolve(dataDir, `app-${profile.name}.log`),
      env: {
        ...profile.env,
        NUXT_DATABASE_URL: databaseUrl(profile.db),
        NUXT_SMTP_HOST: '127.0.0.1',
        NUXT_SMTP_PORT: String(profile.smtpPort),
      },
    })
  }
  catch (err) {
    await mail.close()
    throw err
  }
  return {
    app,
    mail,
    mailUrl: `http://127.0.0.1:${profile.mailHttpPort}`,
    profile,
    stop: async () => {
      await app.stop()
      await mail.close()
    },
  }
}
