/**
 * Secrets the server refuses to run with in production: the placeholders of .env.example, values
 * that once were constants in this repository (anyone who has read it knows them), and anything
 * short. tests/unit/secrets.test.ts checks that every secret placeholder of .env.example is here.
 */
const KNOWN_SECRETS = new Set([
  'change-me-to-a-long-random-string-of-32-or-more',
  'sk_live_or_sk_test_from_the_dashboard',
  'whsec_from_the_webhook_endpoint',
  'demo-only-session-password-change-me-in-production',
  'test-only-session-password-at-least-32-characters',
  'bench-only-session-password-at-least-32-characters',
  'sk_test_larmoir_local_fake',
  'whsec_larmoir_local_fake',
])
/** Words that mark a value someone meant to replace. */
const PLACEHOLDER = /change[-_ ]?me|example|placeholder|from[-_ ]the[-_ ]|your[-_ ]secret/i
/** Shortest secret accepted, characters: 32 random characters are about 190 bits (common practice, no source). */
const SECRET_MIN_LENGTH = 32

export interface SecretSettings {
  sessionPassword: string
  stripeSecretKey: string
  stripeWebhookSecret: string
  smtpPass: string
}

function problem(name: string, value: string, required: boolean): string | null {
  if (!value) return required ? `${name} is not set.` : null
  if (KNOWN_SECRETS.has(value) || PLACEHOLDER.test(value)) return `${name} is a placeholder or a published value; set a secret of your own.`
  return null
}

/** What is wrong with the secrets, one sentence each naming its environment variable; empty when all is well. */
export function secretProblems(s: SecretSettings): string[] {
  const out = [
    problem('NUXT_SESSION_PASSWORD', s.sessionPassword, true),
    problem('NUXT_STRIPE_SECRET_KEY', s.stripeSecretKey, false),
    problem('NUXT_STRIPE_WEBHOOK_SECRET', s.stripeWebhookSecret, Boolean(s.stripeSecretKey)),
    problem('NUXT_SMTP_PASS', s.smtpPass, false),
  ].filter((p): p is string => p !== null)
  if (s.sessionPassword && s.sessionPassword.length < SECRET_MIN_LENGTH) out.push(`NUXT_SESSION_PASSWORD has ${s.sessionPassword.length} characters; at least ${SECRET_MIN_LENGTH}.`)
  if (s.stripeWebhookSecret && s.stripeWebhookSecret.length < SECRET_MIN_LENGTH) out.push(`NUXT_STRIPE_WEBHOOK_SECRET has ${s.stripeWebhookSecret.length} characters; at least ${SECRET_MIN_LENGTH}.`)
  return out
}
