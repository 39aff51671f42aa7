import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'

/**
 * The secrets of a local stack (the demo or the tests): made at random the first time a data folder
 * is used and kept in .data/secrets-<name>.json (git-ignored, readable by its owner only) so that a
 * restart keeps its sessions and its webhook signatures; a fresh data folder gets new ones. No
 * secret is a constant in the repository: whoever reads the code cannot seal a session cookie or
 * sign a payment event for anyone's demo.
 */
export interface LocalSecrets {
  /** Seals the session cookie (NUXT_SESSION_PASSWORD). */
  sessionPassword: string
  /** The local Stripe fake takes any sk_test_ key; this one is ours. */
  stripeSecretKey: string
  /** The fake signs its webhooks with this, the app checks them with it. */
  stripeWebhookSecret: string
}

const dataDir = resolve(import.meta.dirname, '../../.data')

export function localSecrets(name: string): LocalSecrets {
  const file = resolve(dataDir, `secrets-${name}.json`)
  if (existsSync(file)) return JSON.parse(readFileSync(file, 'utf8')) as LocalSecrets
  mkdirSync(dataDir, { recursive: true })
  const secrets: LocalSecrets = {
    sessionPassword: randomBytes(32).toString('base64url'),
    // Hex: the fake (like Stripe) takes sk_test_ and word characters only, and base64url has '-'.
    stripeSecretKey: `sk_test_${randomBytes(24).toString('hex')}`,
    stripeWebhookSecret: `whsec_${randomBytes(32).toString('base64url')}`,
  }
  writeFileSync(file, JSON.stringify(secrets, null, 2), { mode: 0o600 })
  return secrets
}
