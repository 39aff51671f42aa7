import { mkdirSync } from 'node:fs'
import { resolve } from 'node:path'
import { DEV_DB, TEST_DB, databaseUrl, resetDatabase, startDb, type DbInstance } from './mariadb'
import { startMailFake, type MailFake } from '../fakes/mail'
import { startStripeFake, type StripeFake } from '../fakes/stripe'
import { startApp, type RunningApp } from './app'
import { localSecrets } from './secrets'

/**
 * Everything the app needs on one machine: MariaDB, the e-mail fake, the Stripe fake and the built
 * server, for the demo (`npm start`) or for the tests (`npm test`), on separate ports and databases.
 */
export interface StackProfile {
  name: 'demo' | 'test'
  db: DbInstance
  appPort: number
  smtpPort: number
  mailHttpPort: number
  stripePort: number
  /** Address of the Stripe fake as the browser reaches it (its hosted payment page links). */
  stripePublicUrl: string
  env: Record<string, string>
}

export const DEMO_PROFILE: StackProfile = {
  name: 'demo',
  db: DEV_DB,
  appPort: 3000,
  smtpPort: 2525,
  mailHttpPort: 1080,
  stripePort: 12111,
  stripePublicUrl: 'http://localhost:12111',
  env: {
    NUXT_APP_URL: 'http://localhost:3000',
    NUXT_DEMO_SEED: 'true',
    NUXT_SESSION_PASSWORD: localSecrets('demo').sessionPassword,
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
  stripePort: 12112 + offset,
  stripePublicUrl: `http://127.0.0.1:${12112 + offset}`,
  env: {
    NUXT_APP_URL: `http://127.0.0.1:${3100 + offset}`,
    NUXT_DEMO_SEED: 'true',
    // Each test client claims its own address in X-Forwarded-For, as if one proxy of ours passed it on.
    NUXT_TRUSTED_PROXY_HOPS: '1',
    NUXT_OUTBOX_INTERVAL_SECONDS: '1',
    NUXT_BOOKING_SWEEP_SECONDS: '1',
    NUXT_SESSION_PASSWORD: localSecrets('test').sessionPassword,
    // A small bound on resized images, so the attack suite can fill it (tests/integration/attacks-http.test.ts).
    NUXT_IMAGES_CACHE_MAX_FILES: '40',
  },
}

export interface RunningStack { app: RunningApp, mail: MailFake, mailUrl: string, stripe: StripeFake, stripeUrl: string, profile: StackProfile, stop: () => Promise<void> }

export async function startStack(profile: StackProfile, opts: { freshDatabase?: boolean } = {}): Promise<RunningStack> {
  const dataDir = resolve(import.meta.dirname, '../../.data')
  mkdirSync(dataDir, { recursive: true })
  await startDb(profile.db)
  if (opts.freshDatabase) resetDatabase(profile.db)
  const secrets = localSecrets(profile.name)
  const mail = await startMailFake({ smtpPort: profile.smtpPort, httpPort: profile.mailHttpPort, dir: resolve(dataDir, `mail-${profile.name}`) })
  let stripe: StripeFake
  try {
    stripe = await startStripeFake({
      port: profile.stripePort,
      webhookUrl: `http://127.0.0.1:${profile.appPort}/webhooks/stripe`,
      webhookSecret: secrets.stripeWebhookSecret,
      publicUrl: profile.stripePublicUrl,
    })
  }
  catch (err) {
    await mail.close()
    throw err
  }
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
        NUXT_STRIPE_SECRET_KEY: secrets.stripeSecretKey,
        NUXT_STRIPE_WEBHOOK_SECRET: secrets.stripeWebhookSecret,
        NUXT_STRIPE_API_HOST: '127.0.0.1',
        NUXT_STRIPE_API_PORT: String(profile.stripePort),
        NUXT_STRIPE_API_PROTOCOL: 'http',
        NUXT_STRIPE_CHECKOUT_ORIGIN: new URL(profile.stripePublicUrl).origin,
      },
    })
  }
  catch (err) {
    await stripe.close()
    await mail.close()
    throw err
  }
  return {
    app,
    mail,
    mailUrl: `http://127.0.0.1:${profile.mailHttpPort}`,
    stripe,
    stripeUrl: stripe.url,
    profile,
    stop: async () => {
      await app.stop()
      await stripe.close()
      await mail.close()
    },
  }
}
