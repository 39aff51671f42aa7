import { randomBytes } from 'node:crypto'
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { secretProblems } from '../../server/utils/secretCheck'

const root = resolve(import.meta.dirname, '../..')
const example = readFileSync(resolve(root, '.env.example'), 'utf8')
const valueOf = (name: string) => new RegExp(`^${name}=(.*)$`, 'm').exec(example)?.[1] ?? ''
const random = () => randomBytes(32).toString('base64url')
const good = () => ({ sessionPassword: random(), stripeSecretKey: `sk_live_${random()}`, stripeWebhookSecret: `whsec_${random()}`, smtpPass: '' })

describe('secrets a production server refuses', () => {
  it('takes secrets of its own', () => {
    expect(secretProblems(good())).toEqual([])
  })

  it('refuses every secret placeholder of .env.example', () => {
    for (const [name, key] of [['NUXT_SESSION_PASSWORD', 'sessionPassword'], ['NUXT_STRIPE_SECRET_KEY', 'stripeSecretKey'], ['NUXT_STRIPE_WEBHOOK_SECRET', 'stripeWebhookSecret']] as const) {
      const placeholder = valueOf(name)
      expect(placeholder, name).not.toBe('')
      expect(secretProblems({ ...good(), [key]: placeholder }).join(' '), name).toContain(name)
    }
  })

  it('refuses a short session password or webhook secret, and a missing one', () => {
    expect(secretProblems({ ...good(), sessionPassword: random().slice(0, 20) })).toEqual(['NUXT_SESSION_PASSWORD has 20 characters; at least 32.'])
    expect(secretProblems({ ...good(), stripeWebhookSecret: 'whsec_abc' })[0]).toMatch(/NUXT_STRIPE_WEBHOOK_SECRET has 9 characters/)
    expect(secretProblems({ ...good(), sessionPassword: '' })).toEqual(['NUXT_SESSION_PASSWORD is not set.'])
    expect(secretProblems({ ...good(), stripeWebhookSecret: '' })).toEqual(['NUXT_STRIPE_WEBHOOK_SECRET is not set.'])
  })

  it('refuses the values that were once constants of the demo and the tests', () => {
    expect(secretProblems({ ...good(), sessionPassword: 'demo-only-session-password-change-me-in-production' })).toHaveLength(1)
    expect(secretProblems({ ...good(), stripeWebhookSecret: 'whsec_larmoir_local_fake' })).toHaveLength(2) // published, and short
  })
})
