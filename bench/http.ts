/** What the benches share: the server's settings, a JSON client, autocannon's answer counts, a memory sampler. */
import { readFileSync } from 'node:fs'
import type autocannon from 'autocannon'
import { localSecrets } from '../scripts/lib/secrets'

/** What every browser sends with a page request (Fetch standard; common practice, no source). */
export const BROWSER = { 'accept-encoding': 'gzip, deflate, br', 'accept': 'text/html' }

export interface BenchCall { method?: string, body?: unknown, cookie?: string, ip?: string }

/**
 * A client for the server at `base`: JSON in and out, the cookies it sets joined for the next call,
 * each request from `ip` (the server trusts one proxy hop in the benches) or 10.9.0.1.
 */
export function benchClient(base: string) {
  return async function call(path: string, init: BenchCall = {}) {
    const res = await fetch(`${base}${path}`, {
      method: init.method ?? 'GET',
      headers: { 'content-type': 'application/json', ...(init.cookie ? { cookie: init.cookie } : {}), 'x-forwarded-for': init.ip ?? '10.9.0.1' },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
    })
    const cookie = res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    const text = await res.text()
    let body: any = text
    try { body = JSON.parse(text) }
    catch { /* not JSON */ }
    return { status: res.status, body, cookie, bytes: text.length }
  }
}

/** "200×3748, 409×12": the answers of an autocannon run by status. */
export function answerCounts(result: autocannon.Result): string {
  return Object.entries((result as unknown as { statusCodeStats?: Record<string, { count: number }> }).statusCodeStats ?? {})
    .map(([code, s]) => `${code}×${s.count}`).join(', ')
}

/** The built server's settings in a bench: demo data, one trusted proxy hop, the e-mail and Stripe fakes on `ports`. */
export function benchAppEnv(base: string, databaseUrl: string, ports: { smtp: number, stripe: number }): Record<string, string> {
  const secrets = localSecrets('bench')
  return {
    NUXT_APP_URL: base, NUXT_DEMO_SEED: 'true', NUXT_TRUSTED_PROXY_HOPS: '1',
    NUXT_SESSION_PASSWORD: secrets.sessionPassword,
    NUXT_DATABASE_URL: databaseUrl, NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: String(ports.smtp),
    NUXT_STRIPE_SECRET_KEY: secrets.stripeSecretKey, NUXT_STRIPE_WEBHOOK_SECRET: secrets.stripeWebhookSecret,
    NUXT_STRIPE_API_HOST: '127.0.0.1', NUXT_STRIPE_API_PORT: String(ports.stripe), NUXT_STRIPE_API_PROTOCOL: 'http',
    NUXT_STRIPE_CHECKOUT_ORIGIN: `http://127.0.0.1:${ports.stripe}`,
  }
}

/** A process's resident memory, MB, sampled every 200 ms from /proc (Linux); NaN once it has ended. */
export function memorySampler(pid: number) {
  const rss = () => {
    try { return Number(/VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? Number.NaN) / 1024 }
    catch { return Number.NaN }
  }
  let peak = 0
  const timer = setInterval(() => { peak = Math.max(peak, rss() || 0) }, 200)
  return { rss, peak: () => Math.max(peak, rss() || 0), stop: () => clearInterval(timer) }
}
