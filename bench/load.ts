/**
 * Load benchmark (not a test): `npm run bench:load`, after `npx nuxt build`. Starts its own
 * MariaDB instance with the demo data, the e-mail and Stripe fakes and the built server, all on
 * 127.0.0.1 ports of its own (shifted by LARMOIR_PORT_OFFSET), and runs autocannon against: a bare
 * JSON route (the ceiling), every public page anonymously, the flight APIs, and the booking POST
 * (signed-in guests, 50 connections) on its refusal path (409, a full session) and its hold path
 * (201, every request a new hold); then times the card PDF. It samples the server's resident memory
 * all along. Each target runs for BENCH_SECONDS (default 6). Prints one Markdown table, each figure
 * with its ratio to the ceiling of the same run, and the goals of issue 17 it checks; then each
 * guest page's weight and, unless BENCH_LIGHTHOUSE=0, Lighthouse on each (median of three).
 */
import { execSync } from 'node:child_process'
import { mkdirSync } from 'node:fs'
import { cpus, loadavg } from 'node:os'
import { resolve } from 'node:path'
import autocannon from 'autocannon'
import { BROWSER, answerCounts, benchAppEnv, benchClient, memorySampler } from './http'
import { DateTime } from 'luxon'
import mysql from 'mysql2/promise'
import { databaseUrl, resetDatabase, startDb, stopDb, type DbInstance } from '../scripts/lib/mariadb'
import { startApp } from '../scripts/lib/app'
import { startMailFake } from '../scripts/fakes/mail'
import { startStripeFake } from '../scripts/fakes/stripe'
import { localSecrets } from '../scripts/lib/secrets'
import { DEMO_PASSWORD, DEMO_VENUE } from '../server/demo/data'
import { measurePageWeight, pageWeightTable } from './pageWeight'
import { lighthouseTable, runLighthouse } from './lighthouse'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 6)
/** BENCH_ONLY=booking runs the ceiling and the booking POST only (for profiling that route). */
const ONLY_BOOKING = process.env.BENCH_ONLY === 'booking'
/** LARMOIR_PORT_OFFSET shifts every port, as it does for the tests, so two checkouts can bench side by side. */
const OFFSET = Number(process.env.LARMOIR_PORT_OFFSET ?? 0) || 0
const BENCH_DB: DbInstance = { name: 'bench-db', port: 3419 + OFFSET, database: 'larmoir_bench', user: 'larmoir', password: 'larmoir' }
const PORTS = { app: 3199 + OFFSET, smtp: 2599 + OFFSET, mailHttp: 1099 + OFFSET, stripe: 12199 + OFFSET }
/** Guests of the booking runs; each may keep 3 unpaid holds, so the hold run makes 3 × GUESTS requests. */
const GUESTS = 400
const HOLDS_PER_GUEST = 3
const BOOKING_SESSIONS = 12
const root = resolve(import.meta.dirname, '..')
const base = `http://127.0.0.1:${PORTS.app}`

const call = benchClient(base)

interface Row { name: string, rps: number, p50: number, p99: number, codes: string, goal?: 'page' | 'booking' }

async function run(name: string, opts: autocannon.Options, goal?: Row['goal']): Promise<Row> {
  const result = await autocannon({ duration: SECONDS, connections: 10, ...opts, url: opts.url ?? base })
  const codes = answerCounts(result)
  const row = { name, rps: result.requests.average, p50: result.latency.p50, p99: result.latency.p99, codes, goal }
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
    env: benchAppEnv(base, databaseUrl(BENCH_DB), PORTS),
  })
  const db = await mysql.createConnection({ uri: databaseUrl(BENCH_DB), timezone: 'Z' })
  const memory = memorySampler(app.child.pid!)
  try {
    const manager = await call('/api/auth/signin', { method: 'POST', body: { email: 'manager@saltmarsh.test', password: DEMO_PASSWORD } })
    if (manager.status !== 200) throw new Error(`manager sign-in failed: ${manager.status}`)
    const flightId = (await call('/api/flights/published')).body[0].id as number

    // Seats for the hold run: sessions of 200 seats, far enough ahead to stay bookable; and one
    // session of a single seat, taken, for the refusal run.
    const newSession = async (day: number, seats: number) => {
      const start = DateTime.now().setZone(DEMO_VENUE.timeZone).plus({ days: day })
      const res = await call('/api/sessions', { method: 'POST', cookie: manager.cookie, body: { flightId, startDate: start.toISODate(), startTime: '18:00', durationMinutes: 60, seats, priceMinor: 3000 } })
      if (res.status !== 201) throw new Error(`session failed: ${res.status} ${JSON.stringify(res.body)}`)
      return res.body[0].id as number
    }
    const sessions: number[] = []
    for (let i = 0; i < BOOKING_SESSIONS; i++) sessions.push(await newSession(20 + i, 200))
    const fullSession = await newSession(40, 1)

    // Confirmed guests with the demo password (its hash copied from the demo guest), each signed in
    // from its own address.
    const [[demoGuest]] = await db.query('SELECT password_hash AS hash FROM users WHERE email = ?', ['guest@saltmarsh.test']) as unknown as [[{ hash: string }]]
    const tag = Date.now().toString(36)
    const emails = Array.from({ length: GUESTS + 1 }, (_, i) => `bench-${i}-${tag}@example.test`)
    await db.query('INSERT INTO users (email, name, password_hash, role, date_of_birth, email_verified_at) VALUES ?', [emails.map((e, i) => [e, `Bench Guest ${i}`, demoGuest.hash, 'guest', '1990-05-14', new Date()])])
    const guests: { cookie: string, email: string, ip: string }[] = []
    for (let i = 0; i < emails.length; i += 4) {
      guests.push(...await Promise.all(emails.slice(i, i + 4).map(async (email, j) => {
        const n = i + j
        const ip = `10.8.${Math.floor(n / 250)}.${(n % 250) + 1}`
        const res = await call('/api/auth/signin', { method: 'POST', ip, body: { email, password: DEMO_PASSWORD } })
        if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`)
        return { cookie: res.cookie, email, ip }
      })))
    }
    // The last guest takes the one seat of the full session.
    const taker = guests.pop()!
    const booking = (g: typeof taker, sessionId: number) => ({ sessionId, partySize: 1, contactName: 'Bench Guest', contactEmail: g.email, contactPhone: '+1 207 555 0100', dateOfBirth: '1990-05-14', ageConfirmed: true })
    const took = await call('/api/bookings', { method: 'POST', cookie: taker.cookie, ip: taker.ip, body: booking(taker, fullSession) })
    if (took.status !== 201) throw new Error(`the full session's seat: ${took.status} ${JSON.stringify(took.body)}`)

    const pour = await call(`/api/flights/${flightId}/pours/1`)
    if (pour.status !== 200) throw new Error(`pour 1 of flight ${flightId}: ${pour.status}`)
    const pages: [string, string][] = [['/', 'home'], ['/flights', 'flights'], [`/flights/${flightId}`, 'a flight'], ['/glass', 'the glass page'], [`/pour/${flightId}/1`, 'a pour page']]
    // One request of each first, so that start-up work (the first render, the model's memo) is not counted.
    for (const [path] of pages) await call(path)
    await new Promise(r => setTimeout(r, 1000))
    const idleMb = memory.rss()

    // The ceiling is measured before and after the reads; the higher of the two is the one every
    // ratio divides by (on a shared machine a neighbour's build can halve a single run).
    const rows: Row[] = []
    const ceilingBefore = await run('GET /api/ping (ceiling, no database), before', { url: `${base}/api/ping` })
    // Pages are asked for as a browser asks: accepting gzip (a cached page is sent gzipped).
    if (!ONLY_BOOKING) {
      for (const [path, what] of pages) rows.push(await run(`GET ${path} (${what}, anonymous)`, { url: `${base}${path}`, headers: BROWSER }, 'page'))
      rows.push(await run(`GET /api/flights/${flightId}`, { url: `${base}/api/flights/${flightId}` }))
      rows.push(await run('GET /api/flights/published', { url: `${base}/api/flights/published` }))
    }
    const ceilingAfter = await run('GET /api/ping (ceiling, no database), after', { url: `${base}/api/ping` })
    const ceiling = ceilingAfter.rps > ceilingBefore.rps ? ceilingAfter : ceilingBefore
    rows.unshift(ceilingBefore, ceilingAfter)

    // Refusals: every guest asks for the full session's seat.
    let n = 0
    rows.push(await run('POST /api/bookings, a full session (409 path, 50 connections)', {
      url: `${base}/api/bookings`,
      connections: 50,
      requests: [{
        method: 'POST',
        setupRequest: (req: autocannon.Request) => {
          const g = guests[n++ % guests.length]!
          return { ...req, headers: { 'content-type': 'application/json', 'cookie': g.cookie, 'x-forwarded-for': g.ip }, body: JSON.stringify(booking(g, fullSession)) }
        },
      }],
    }, 'booking'))
    // Holds: each guest's k-th request goes to a session of its own quarter of the k-th third, so
    // every request is a new hold (no guest holds twice in a session nor more than 3 at once) and
    // the 50 requests in flight share 4 sessions.
    n = 0
    rows.push(await run(`POST /api/bookings, new holds (201 path, 50 connections, ${guests.length * HOLDS_PER_GUEST} requests)`, {
      url: `${base}/api/bookings`,
      connections: 50,
      amount: guests.length * HOLDS_PER_GUEST,
      requests: [{
        method: 'POST',
        setupRequest: (req: autocannon.Request) => {
          const g = guests[n % guests.length]!
          const k = Math.floor(n / guests.length)
          const sessionId = sessions[(k * 4 + (n % guests.length) % 4) % sessions.length]!
          n++
          return { ...req, headers: { 'content-type': 'application/json', 'cookie': g.cookie, 'x-forwarded-for': g.ip }, body: JSON.stringify(booking(g, sessionId)) }
        },
      }],
    }, 'booking'))
    // No overbooking: the seats taken in each session never pass its seats.
    const [taken] = await db.query(`SELECT s.id, s.seats, COALESCE(SUM(b.party_size), 0) AS taken FROM tasting_sessions s LEFT JOIN bookings b ON b.session_id = s.id AND b.state IN ('held', 'confirmed', 'checked_in') WHERE s.id IN (?) GROUP BY s.id, s.seats`, [[...sessions, fullSession]]) as unknown as [{ id: number, seats: number, taken: number }[]]
    const overbooked = taken.filter(s => Number(s.taken) > s.seats)

    // The card PDF, one at a time: the first (nothing cached) and the median of 20.
    const pdfTime = async () => {
      const t = performance.now()
      const res = await fetch(`${base}/cards/flights/${flightId}/card.pdf`, { headers: { cookie: manager.cookie } })
      await res.arrayBuffer()
      if (res.status !== 200) throw new Error(`PDF answered ${res.status}`)
      return performance.now() - t
    }
    const pdfFirst = await pdfTime()
    const times: number[] = []
    for (let i = 0; i < 20; i++) times.push(await pdfTime())
    times.sort((a, b) => a - b)
    const pdfMedian = (times[9]! + times[10]!) / 2

    const peakMb = memory.peak()
    await new Promise(r => setTimeout(r, 10_000))
    const afterMb = memory.rss()

    // Goal 2: what each guest page weighs, and Lighthouse on each (BENCH_LIGHTHOUSE=0 leaves it out).
    const weights = await measurePageWeight(base, root, flightId)
    const lighthouseRows = process.env.BENCH_LIGHTHOUSE === '0' || ONLY_BOOKING ? null : await runLighthouse(base, flightId)

    const pct = (x: number) => `${(x * 100).toFixed(1)} %`
    console.log(`\n${execSync('date -u').toString().trim()} · ${cpus().length} cores (nproc ${execSync('nproc').toString().trim()}) · load average ${loadavg().map(l => l.toFixed(1)).join(' ')} · ${SECONDS} s per target · Node ${process.version}\n`)
    console.log(`Ratios are to the higher ceiling: ${ceiling.rps.toFixed(0)} req/s, p99 ${ceiling.p99} ms.\n`)
    console.log('| target | req/s | of ceiling | p50 ms | p99 ms | p99 ÷ ceiling\'s | answers | goal |')
    console.log('|---|---:|---:|---:|---:|---:|---|---|')
    for (const r of rows) {
      const share = r.rps / ceiling.rps
      const p99x = r.p99 / Math.max(1, ceiling.p99)
      const goal = r.goal === 'page'
        ? `1: ≥ 50 %, ≤ 10× — ${share >= 0.5 && p99x <= 10 ? 'met' : 'not met'}`
        : r.goal === 'booking' ? `4: p99 ≤ 250 ms — ${r.p99 <= 250 ? 'met' : 'not met'}` : ''
      console.log(`| ${r.name} | ${r.rps.toFixed(0)} | ${pct(share)} | ${r.p50} | ${r.p99} | ${p99x.toFixed(1)}× | ${r.codes} | ${goal} |`)
    }
    console.log(`\nSeats: ${overbooked.length ? `OVERBOOKED ${JSON.stringify(overbooked)}` : `no session over its seats (${taken.length} sessions, ${taken.reduce((s, r) => s + Number(r.taken), 0)} seats taken)`}`)
    console.log(`Card PDF (A5, one copy) over HTTP: first ${pdfFirst.toFixed(1)} ms, then median of 20 sequential requests ${pdfMedian.toFixed(1)} ms (goal 3's figures come from \`npm run bench\`)`)
    console.log(`Server resident memory: idle ${idleMb.toFixed(0)} MB, peak ${peakMb.toFixed(0)} MB, 10 s after the load ${afterMb.toFixed(0)} MB (${pct(afterMb / idleMb - 1)} over idle; goal 6: peak < 400 MB — ${peakMb < 400 ? 'met' : 'not met'}, after within 20 % of idle — ${afterMb <= idleMb * 1.2 ? 'met' : 'not met'})`)
    console.log(`\nGuest pages' weight (HTML as sent to a browser that accepts gzip, measured unzipped and gzipped; payload = the __NUXT_DATA__ script):\n\n${pageWeightTable(weights)}`)
    console.log(lighthouseRows ? `\nLighthouse 12.2.3, mobile, simulated throttling, median of 3 runs each:\n\n${lighthouseTable(lighthouseRows)}` : '\nLighthouse: left out (BENCH_LIGHTHOUSE=0).')
    if (overbooked.length) process.exitCode = 1
  }
  finally {
    memory.stop()
    await db.end()
    await app.stop()
    await stripe.close()
    await mail.close()
    await stopDb(BENCH_DB)
  }
}

main().catch((err) => { console.error(err); process.exit(1) })
