/**
 * Load benchmark (not a test): `npm run bench:load`, after `npx nuxt build`. Starts its own
 * MariaDB instance with the demo data, the e-mail and Stripe fakes and the built server, all on
 * 127.0.0.1 ports of its own, and runs autocannon against: a bare JSON route (the ceiling), the
 * public flights page, the flight API, and the booking POST (signed-in guests, 50 connections);
 * then times the card PDF. Each target runs for BENCH_SECONDS (default 10). Prints a Markdown table.
 */
import { execSync } from 'node:child_process'
import { mkdirSync } from 'node:fs'
import { cpus } from 'node:os'
import { resolve } from 'node:path'
import autocannon from 'autocannon'
import { DateTime } from 'luxon'
import { databaseUrl, resetDatabase, startDb, stopDb, type DbInstance } from '../scripts/lib/mariadb'
import { startApp } from '../scripts/lib/app'
import { startMailFake } from '../scripts/fakes/mail'
import { startStripeFake } from '../scripts/fakes/stripe'
import { localSecrets } from '../scripts/lib/secrets'
import { DEMO_PASSWORD, DEMO_VENUE } from '../server/demo/data'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10)
const BENCH_DB: DbInstance = { name: 'bench-db', port: 3419, database: 'larmoir_bench', user: 'larmoir', password: 'larmoir' }
const PORTS = { app: 3199, smtp: 2599, mailHttp: 1099, stripe: 12199 }
const GUESTS = 400
const root = resolve(import.meta.dirname, '..')
const base = `http://127.0.0.1:${PORTS.app}`

async function call(path: string, init: { method?: string, body?: unknown, cookie?: string, ip?: string } = {}) {
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
  return { status: res.status, body, cookie }
}

interface Row { name: string, rps: number, p50: number, p99: number, codes: string }

async function run(name: string, opts: autocannon.Options): Promise<Row> {
  const result = await autocannon({ duration: SECONDS, connections: 10, ...opts, url: opts.url ?? base })
  const codes = Object.entries((result as unknown as { statusCodeStats?: Record<string, { count: number }> }).statusCodeStats ?? {})
    .map(([code, s]) => `${code}×${s.count}`).join(', ')
  const row = { name, rps: result.requests.average, p50: result.latency.p50, p99: result.latency.p99, codes }
  console.log(`[bench] ${name}: ${row.rps.toFixed(0)} req/s, p50 ${row.p50} ms, p99 ${row.p99} ms (${codes}; errors ${result.errors}, timeouts ${result.timeouts})`)
  return row
}

async function main() {
  mkdirSync(resolve(root, '.data'), { recursive: true })
  await startDb(BENCH_DB)
  resetDatabase(BENCH_DB)
  const mail = await startMailFake({ smtpPort: PORTS.smtp, httpPort: PORTS.mailHttp, dir: resolve(root, '.data/mail-bench') })
  const stripe = await startStripeFake({ port: PORTS.stripe, webhookUrl: `${base}/webhooks/stripe`, webhookSecret: localSecrets('bench').stripeWebhookSecret, publicUrl: `http://127.0.0.1:${PORTS.stripe}` })
  const app = await startApp({
    port: PORTS.app,
    logFile: resolve(root, '.data/app-bench.log'),
    env: {
      NUXT_APP_URL: base, NUXT_DEMO_SEED: 'true', NUXT_TRUSTED_PROXY_HOPS: '1',
      NUXT_SESSION_PASSWORD: localSecrets('bench').sessionPassword,
      NUXT_DATABASE_URL: databaseUrl(BENCH_DB), NUXT_SMTP_HOST: '127.0.0.1', NUXT_SMTP_PORT: String(PORTS.smtp),
      NUXT_STRIPE_SECRET_KEY: localSecrets('bench').stripeSecretKey, NUXT_STRIPE_WEBHOOK_SECRET: localSecrets('bench').stripeWebhookSecret,
      NUXT_STRIPE_API_HOST: '127.0.0.1', NUXT_STRIPE_API_PORT: String(PORTS.stripe), NUXT_STRIPE_API_PROTOCOL: 'http',
      NUXT_STRIPE_CHECKOUT_ORIGIN: `http://127.0.0.1:${PORTS.stripe}`,
    },
  })
  try {
    const manager = await call('/api/auth/signin', { method: 'POST', body: { email: 'manager@saltmarsh.test', password: DEMO_PASSWORD } })
    const flightId = (await call('/api/flights/published')).body[0].id as number

    // Seats for the booking run: 12 sessions of 200 seats, far enough ahead to stay bookable.
    const sessions: number[] = []
    for (let i = 0; i < 12; i++) {
      const start = DateTime.now().setZone(DEMO_VENUE.timeZone).plus({ days: 20 + i })
      const res = await call('/api/sessions', { method: 'POST', cookie: manager.cookie, body: { flightId, startDate: start.toISODate(), startTime: '18:00', durationMinutes: 60, seats: 200, priceMinor: 3000 } })
      sessions.push(res.body[0].id)
    }
    // Signed-in guests (each may hold 3 unpaid bookings at once), each with its own address.
    const guests: { cookie: string, email: string, ip: string }[] = []
    for (let i = 0; i < GUESTS; i++) {
      const email = `bench-${i}-${Date.now().toString(36)}@example.test`
      const ip = `10.8.${Math.floor(i / 250)}.${(i % 250) + 1}`
      const res = await call('/api/auth/signup', { method: 'POST', ip, body: { name: `Bench Guest ${i}`, email, password: 'bench-guest-pass-1', dateOfBirth: '1990-05-14' } })
      if (res.status !== 201) throw new Error(`sign-up failed: ${res.status} ${JSON.stringify(res.body)}`)
      guests.push({ cookie: res.cookie, email, ip })
    }

    const rows: Row[] = []
    rows.push(await run('GET /api/ping (ceiling, no database)', { url: `${base}/api/ping` }))
    rows.push(await run('GET /flights (server-rendered page)', { url: `${base}/flights` }))
    rows.push(await run(`GET /api/flights/${flightId}`, { url: `${base}/api/flights/${flightId}` }))
    rows.push(await run('GET /api/flights/published', { url: `${base}/api/flights/published` }))
    let n = 0
    rows.push(await run('POST /api/bookings (50 connections)', {
      url: `${base}/api/bookings`,
      connections: 50,
      requests: [{
        method: 'POST',
        setupRequest: (req: autocannon.Request) => {
          const g = guests[n % guests.length]!
          const sessionId = sessions[Math.floor(n / guests.length) % sessions.length]!
          n++
          return {
            ...req,
            headers: { 'content-type': 'application/json', 'cookie': g.cookie, 'x-forwarded-for': g.ip },
            body: JSON.stringify({ sessionId, partySize: 1, contactName: 'Bench Guest', contactEmail: g.email, contactPhone: '+1 207 555 0100', dateOfBirth: '1990-05-14', ageConfirmed: true }),
          }
        },
      }],
    }))

    // The card PDF, one at a time: the median of 20.
    const times: number[] = []
    for (let i = 0; i < 20; i++) {
      const t = performance.now()
      const res = await fetch(`${base}/cards/flights/${flightId}/card.pdf`, { headers: { cookie: manager.cookie } })
      await res.arrayBuffer()
      if (res.status !== 200) throw new Error(`PDF answered ${res.status}`)
      times.push(performance.now() - t)
    }
    times.sort((a, b) => a - b)
    const pdfMedian = (times[9]! + times[10]!) / 2

    const ceiling = rows[0]!.rps
    console.log(`\n${execSync('date -u').toString().trim()} · ${cpus().length} cores (nproc ${execSync('nproc').toString().trim()}) · ${SECONDS} s per target · Node ${process.version}\n`)
    console.log('| target | req/s | p50 ms | p99 ms | of ceiling | answers |')
    console.log('|---|---:|---:|---:|---:|---|')
    for (const r of rows) console.log(`| ${r.name} | ${r.rps.toFixed(0)} | ${r.p50} | ${r.p99} | ${(r.rps / ceiling * 100).toFixed(1)} % | ${r.codes} |`)
    console.log(`\nCard PDF (A5, one copy), median of 20 sequential requests: ${pdfMedian.toFixed(1)} ms`)
  }
  finally {
    await app.stop()
    await stripe.close()
    await mail.close()
    await stopDb(BENCH_DB)
  }
}

main().catch((err) => { console.error(err); process.exit(1) })
