import { createHash } from 'node:crypto'
import { afterAll, describe, expect, inject, it } from 'vitest'
import { resolve } from 'node:path'
import { Client } from '../support/http'
import { startApp, type RunningApp } from '../../scripts/lib/app'
import { TEST_PROFILE } from '../../scripts/lib/stack'
import { DEMO_PASSWORD } from '../../server/demo/data'

const sessionCookie = (res: { headers: Headers }) => res.headers.getSetCookie().find(c => /^nuxt-session=/.test(c)) ?? ''

describe('the session cookie', () => {
  let secureApp: RunningApp | undefined
  afterAll(async () => { await secureApp?.stop() })

  it('is HttpOnly and SameSite=Lax, and not Secure on plain-HTTP test server', async () => {
    const res = await new Client().signIn('guest@saltmarsh.test', DEMO_PASSWORD)
    expect(res.status).toBe(200)
    const cookie = sessionCookie(res)
    expect(cookie).toMatch(/;\s*HttpOnly/i) // RFC 6265 §4.1.2.6: not readable from scripts
    expect(cookie).toMatch(/;\s*SameSite=Lax/i) // RFC 6265bis SameSite: not sent on cross-site subrequests
    expect(cookie).not.toMatch(/;\s*Secure/i)
  })

  it('is Secure when NUXT_SESSION_COOKIE_SECURE=true', async () => {
    const port = TEST_PROFILE.appPort + 5
    secureApp = await startApp({
      port,
      logFile: resolve(import.meta.dirname, '../../.data/app-test-secure.log'),
      env: { ...TEST_PROFILE.env, NUXT_DATABASE_URL: inject('databaseUrl'), NUXT_SESSION_COOKIE_SECURE: 'true', NUXT_APP_URL: `http://127.0.0.1:${port}` },
    })
    const res = await fetch(`${secureApp.url}/api/auth/signin`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'guest@saltmarsh.test', password: DEMO_PASSWORD }),
    })
    expect(res.status).toBe(200)
    expect(sessionCookie(res)).toMatch(/;\s*Secure/i) // RFC 6265 §4.1.2.5: sent over HTTPS only
    expect(sessionCookie(res)).toMatch(/;\s*HttpOnly/i)
  })
})

describe('security headers', () => {
  const common = {
    'x-content-type-options': 'nosniff', // Fetch standard, X-Content-Type-Options
    'x-frame-options': 'DENY', // RFC 7034
    'referrer-policy': 'strict-origin-when-cross-origin', // W3C Referrer Policy
  }

  it.each(['/api/ping', '/api/flights/published', '/', '/flights', '/signin'])('%s carries them', async (path) => {
    const res = await new Client().send('GET', path)
    expect(res.status).toBe(200)
    for (const [name, value] of Object.entries(common)) expect(res.headers.get(name), name).toBe(value)
    expect(res.headers.get('permissions-policy')).toMatch(/camera=\(\)/)
    expect(res.headers.get('content-security-policy')).toMatch(/frame-ancestors 'none'/) // CSP Level 3
  })

  it('pages allow only their own inline scripts, each by its SHA-256; nothing inline runs without a matching hash', async () => {
    for (let i = 0; i < 3; i++) {
      const res = await new Client().send('GET', '/flights')
      const csp = res.headers.get('content-security-policy')!
      expect(csp).not.toMatch(/script-src[^;]*'unsafe-(inline|eval)'/)
      expect(csp).not.toMatch(/'nonce-/)
      expect(csp).toMatch(/form-action 'self' http:\/\/127\.0\.0\.1:\d+/) // the Stripe fake's origin in tests
      const allowed = new Set(/script-src ([^;]*)/.exec(csp)![1]!.match(/'sha256-[^']+'/g) ?? [])
      const html = await res.text()
      const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/g)]
      expect(scripts.length).toBeGreaterThan(0)
      for (const [tag, attrs, text] of scripts) {
        // Scripts with src come from our origin ('self'); data blocks are never run; every other one needs its hash (CSP Level 3 hash-source).
        if (/\ssrc=/.test(` ${attrs}`)) expect(tag).toMatch(/src="\/_nuxt\//)
        else if (!/\stype="application\/(?:ld\+)?json"/.test(` ${attrs}`)) expect(allowed.has(`'sha256-${createHash('sha256').update(text!).digest('base64')}'`), tag.slice(0, 80)).toBe(true)
      }
      expect(html).not.toMatch(/\son[a-z]+="/) // no inline event handlers
    }
  })

  it('API answers cannot be framed nor run anything', async () => {
    const res = await new Client().send('GET', '/api/venue')
    expect(res.headers.get('content-security-policy')).toMatch(/default-src 'none'/)
  })
})

describe('cross-site requests', () => {
  it('a malformed Origin is refused as cross-site, not a server error', async () => {
    const res = await new Client().request('POST', '/api/auth/signin', { email: 'guest@saltmarsh.test', password: 'x' }, { origin: 'not a url' })
    expect(res.status).toBe(403)
  })
})
