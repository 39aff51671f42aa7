import type { TestProject } from 'vitest/node'
import { ensureDebianPackage } from '../../scripts/lib/apt'
import { databaseUrl, stopDb } from '../../scripts/lib/mariadb'
import { TEST_PROFILE, startStack } from '../../scripts/lib/stack'

declare module 'vitest' {
  export interface ProvidedContext {
    appUrl: string
    mailUrl: string
    stripeUrl: string
    databaseUrl: string
  }
}

/** Starts a fresh test database, the e-mail and Stripe fakes and the built server; stops them afterwards. */
export default async function setup(project: TestProject) {
  ensureDebianPackage('/usr/bin/chromium', ['chromium'], 'the browser tests')
  ensureDebianPackage('/usr/bin/pdftotext', ['poppler-utils'], 'reading the card PDFs in tests')
  const started = Date.now()
  const stack = await startStack(TEST_PROFILE, { freshDatabase: true })
  console.log(`[tests] MariaDB, e-mail and Stripe fakes and app up in ${Date.now() - started} ms`)
  project.provide('appUrl', stack.app.url)
  project.provide('mailUrl', stack.mailUrl)
  project.provide('stripeUrl', stack.stripeUrl)
  project.provide('databaseUrl', databaseUrl(TEST_PROFILE.db))
  return async () => {
    await stack.stop()
    await stopDb(TEST_PROFILE.db)
  }
}
