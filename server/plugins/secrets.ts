import { secretProblems } from '../utils/secretCheck'

/**
 * A production server does not start with a secret anyone could know (see server/utils/secretCheck.ts):
 * a sealed session cookie or a signed payment event would otherwise be forgeable by whoever read the
 * repository. The demo and the tests make their own secrets (scripts/lib/secrets.ts).
 */
export default defineNitroPlugin(() => {
  if (import.meta.dev) return
  const config = useRuntimeConfig()
  const problems = secretProblems({
    sessionPassword: String(config.session.password ?? ''),
    stripeSecretKey: String(config.stripe.secretKey ?? ''),
    stripeWebhookSecret: String(config.stripe.webhookSecret ?? ''),
    smtpPass: String(config.smtp.pass ?? ''),
  })
  if (problems.length) {
    console.error(`[larmoir] refusing to start:\n  ${problems.join('\n  ')}`)
    throw new Error(`Refusing to start with known or weak secrets: ${problems.join(' ')}`)
  }
})
