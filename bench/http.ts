/** What the benches share: a JSON client for the server under test and autocannon's answer counts. */
import type autocannon from 'autocannon'

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
