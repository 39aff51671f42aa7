/**
 * Growth benchmark (not a test): `npm run bench:growth`, after `npx nuxt build`. Starts its own
 * MariaDB instance with the demo data, the e-mail and Stripe fakes and the built server (ports
 * shifted by LARMOIR_PORT_OFFSET), measures the same routes with autocannon (10 connections,
 * BENCH_SECONDS each, default 5) at demo size, fills the database with a busy venue's five years
 * (bench/busyVenue.ts), restarts the server so both runs start with cold caches, and measures again
 * with MariaDB's slow-query log on. Prints one Markdown table (p50/p99 at both sizes, the growth and
 * goal 5 of issue 17: p99 grows at most 2×), the slow log's top queries, and EXPLAIN of every
 * query each route ran (captured from the general log, one request each).
 */
import { spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs'
import { cpus, loadavg } from 'node:os'
import { resolve } from 'node:path'
import autocannon from 'autocannon'
import { BROWSER, answerCounts, benchAppEnv, benchClient, memorySampler } from './http'
import { DateTime } from 'luxon'
import mysql from 'mysql2/promise'
import { databaseUrl, resetDatabase, startDb, stopDb, type DbInstance } from '../scripts/lib/mariadb'
import { startApp, type RunningApp } from '../scripts/lib/app'
import { startMailFake } from '../scripts/fakes/mail'
import { startStripeFake } from '../scripts/fakes/stripe'
import { localSecrets } from '../scripts/lib/secrets'
import { DEMO_PASSWORD, DEMO_VENUE } from '../server/demo/data'
import { fillBusyVenue } from './busyVenue'

const SECONDS = Number(process.env.BENCH_SECONDS ?? 5)
const OFFSET = Number(process.env.LARMOIR_PORT_OFFSET ?? 0) || 0
const GROWTH_DB: DbInstance = { name: 'growth-db', port: 3421 + OFFSET, database: 'larmoir_growth', user: 'larmoir', password: 'larmoir' }
const PORTS = { app: 3201 + OFFSET, smtp: 2601 + OFFSET, mailHttp: 1101 + OFFSET, stripe: 12201 + OFFSET }
/** Guests of the booking run; each may keep 3 unpaid holds, so each run makes 3 × GUESTS requests. */
const GUESTS = 120
const HOLDS_PER_GUEST = 3
const root = resolve(import.meta.dirname, '..')
const base = `http://127.0.0.1:${PORTS.app}`
const SLOW_LOG = resolve(root, '.data/growth-slow.log')
const socket = resolve(root, '.data', GROWTH_DB.name, 'run', 'mysqld.sock')

/** A statement as the database's root (over its socket): the log settings need it. Tab-separated rows, newlines escaped. */
function asRoot(sql: string): string[][] {
  const r = spawnSync('mariadb', ['--no-defaults', `--socket=${socket}`, '-uroot', '-B', '-N', '-e', sql], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 })
  if (r.status !== 0) throw new Error(`mariadb: ${r.stderr}`)
  return r.stdout.split('\n').filter(Boolean).map(l => l.split('\t'))
}

const call = benchClient(base)

export interface GrowthRow { route: string, p50: number, p99: number, rps: number, codes: string, bytes: number, crashed?: string }
/** One route to measure: its name, its request, and (for EXPLAIN) one plain GET of it. */
export interface GrowthTarget { route: string, opts: autocannon.Options, probe?: { path: string, cookie?: string } }

/**
 * Waits until the server answers /api/ping within 20 ms three times running (at most 30 s):
 * autocannon stops at the end of its run with requests still in flight, and a slow route's last
 * answers would otherwise be timed as the next route's tail.
 */
async function settle(): Promise<void> {
  const until = Date.now() + 30_000
  let quick = 0
  while (quick < 3 && Date.now() < until) {
    const t0 = performance.now()
    await call('/api/ping')
    quick = performance.now() - t0 < 20 ? quick + 1 : 0
    await new Promise(r => setTimeout(r, 50))
  }
}

async function measure(t: GrowthTarget): Promise<GrowthRow> {
  await settle()
  const result = await autocannon({ duration: SECONDS, connections: 10, ...t.opts })
  const codes = answerCounts(result)
  const row = { route: t.route, p50: result.latency.p50, p99: result.latency.p99, rps: result.requests.average, codes, bytes: Math.round(result.throughput.total / Math.max(1, result.requests.total)) }
  console.log(`[growth] ${t.route}: ${row.rps.toFixed(0)} req/s, p50 ${row.p50} ms, p99 ${row.p99} ms (${codes}; ${row.bytes} B each; errors ${result.errors}, timeouts ${result.timeouts})`)
  return row
}

/**
 * The routes of goal 5 against a running server whose database holds the demo venue (and maybe a
 * busy venue's data): signs in the manager and GUESTS guests, makes the sessions the booking run
 * fills, and measures each route. `round` keeps the two rounds' new sessions on different days.
 */
export async function measureGrowthRoutes(db: mysql.Connection, round: number, afterEach: (row: GrowthRow) => Promise<void> = async () => {}): Promise<{ rows: GrowthRow[], targets: GrowthTarget[] }> {
  const manager = await call('/api/auth/signin', { method: 'POST', body: { email: 'manager@saltmarsh.test', password: DEMO_PASSWORD } })
  if (manager.status !== 200) throw new Error(`manager sign-in failed: ${manager.status}`)
  const published = await call('/api/flights/published')
  // The demo's own first flight, at both sizes, so that the pages and APIs show the same flight.
  const [[demoFlight]] = await db.query(`SELECT id FROM flights WHERE status = 'published' ORDER BY id LIMIT 1`) as unknown as [[{ id: number }]]
  const flightId = demoFlight.id
  if (!published.body.some((f: { id: number }) => f.id === flightId)) throw new Error(`flight ${flightId} is not on the public list`)

  // Four sessions of 200 seats for the holds, on days of this round only.
  const sessionIds: number[] = []
  for (let i = 0; i < 4; i++) {
    const start = DateTime.now().setZone(DEMO_VENUE.timeZone).plus({ days: 50 + round * 10 + i })
    const res = await call('/api/sessions', { method: 'POST', cookie: manager.cookie, body: { flightId, startDate: start.toISODate(), startTime: '10:00', durationMinutes: 60, seats: 200, priceMinor: 3000 } })
    if (res.status !== 201) throw new Error(`session failed: ${res.status} ${JSON.stringify(res.body)}`)
    sessionIds.push(res.body[0].id as number)
  }
  const [[demoGuest]] = await db.query('SELECT password_hash AS hash FROM users WHERE email = ?', ['guest@saltmarsh.test']) as unknown as [[{ hash: string }]]
  const emails = Array.from({ length: GUESTS }, (_, i) => `growth-${round}-${i}@example.test`)
  await db.query('INSERT INTO users (email, name, password_hash, role, date_of_birth, email_verified_at) VALUES ?', [emails.map((e, i) => [e, `Growth Guest ${i}`, demoGuest.hash, 'guest', '1990-05-14', new Date()])])
  const guests: { cookie: string, email: string, ip: string }[] = []
  for (let i = 0; i < emails.length; i += 4) {
    guests.push(...await Promise.all(emails.slice(i, i + 4).map(async (email, j) => {
      const n = i + j
      const ip = `10.${20 + round}.${Math.floor(n / 250)}.${(n % 250) + 1}`
      const res = await call('/api/auth/signin', { method: 'POST', ip, body: { email, password: DEMO_PASSWORD } })
      if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`)
      return { cookie: res.cookie, email, ip }
    })))
  }

  // The host's busiest coming day (most parties on the list), and the last full calendar month.
  const [[busiest]] = await db.query(`SELECT DATE(CONVERT_TZ(s.starts_at, '+00:00', ?)) AS day, COUNT(*) AS n FROM tasting_sessions s JOIN bookings b ON b.session_id = s.id
    WHERE s.starts_at > UTC_TIMESTAMP() AND s.starts_at < UTC_TIMESTAMP() + INTERVAL 60 DAY AND b.state IN ('held', 'confirmed', 'checked_in', 'no_show') GROUP BY day ORDER BY n DESC, day LIMIT 1`, [DateTime.now().setZone(DEMO_VENUE.timeZone).toFormat('ZZ')]) as unknown as [[{ day: string | Date, n: number }]]
  const hostDate = busiest ? DateTime.fromJSDate(new Date(busiest.day), { zone: 'UTC' }).toISODate()! : DateTime.now().setZone(DEMO_VENUE.timeZone).toISODate()!
  const lastMonth = DateTime.now().setZone(DEMO_VENUE.timeZone).minus({ months: 1 })
  const month = `from=${lastMonth.startOf('month').toISODate()}&to=${lastMonth.endOf('month').toISODate()}`
  console.log(`[growth] host's day ${hostDate} (${busiest?.n ?? 0} parties); report ${month}`)

  const get = (path: string, cookie?: string, headers: Record<string, string> = {}): GrowthTarget => ({ route: `GET ${path}`, opts: { url: `${base}${path}`, headers: { ...headers, ...(cookie ? { cookie } : {}) } }, probe: { path, cookie } })
  const targets: GrowthTarget[] = [
    { ...get('/', undefined, BROWSER), route: 'GET / (home)' },
    { ...get('/flights', undefined, BROWSER), route: 'GET /flights' },
    { ...get(`/flights/${flightId}`, undefined, BROWSER), route: 'GET /flights/:id' },
    { ...get('/glass', undefined, BROWSER), route: 'GET /glass' },
    { ...get(`/pour/${flightId}/1`, undefined, BROWSER), route: 'GET /pour/:id/1' },
    { ...get(`/api/flights/${flightId}`), route: 'GET /api/flights/:id' },
    { ...get(`/api/days/${hostDate}`, manager.cookie), route: 'GET /api/days/:date (host\'s busiest day)' },
    { ...get(`/api/reports/bookings?${month}`, manager.cookie), route: 'GET /api/reports/bookings (a month)' },
    { ...get(`/reports/bookings.csv?${month}`, manager.cookie), route: 'GET /reports/bookings.csv (a month)' },
    // The products list as the manager opens it (a page of 20 by name), sorted by ABV, and searched.
    { ...get('/api/products?status=active&pageSize=20', manager.cookie), route: 'GET /api/products (first page)' },
    { ...get('/api/products?status=active&sort=abv&dir=desc&pageSize=20', manager.cookie), route: 'GET /api/products (by ABV)' },
    { ...get('/api/products?q=gin&status=active&pageSize=8', manager.cookie), route: 'GET /api/products (search)' },
  ]
  for (const t of targets) {
    const res = await call(t.probe!.path, { cookie: t.probe!.cookie })
    if (res.status !== 200) throw new Error(`${t.route} answered ${res.status}: ${JSON.stringify(res.body).slice(0, 300)}`)
  }
  const rows: GrowthRow[] = []
  for (const t of targets) {
    const row = await measure(t)
    await afterEach(row)
    rows.push(row)
  }

  // Holds: each guest's k-th request goes to a session of its own, so every request is a new hold.
  const booking = (g: typeof guests[number], sessionId: number) => ({ sessionId, partySize: 1, contactName: 'Growth Guest', contactEmail: g.email, contactPhone: '+1 207 555 0100', dateOfBirth: '1990-05-14', ageConfirmed: true })
  let n = 0
  const hold: GrowthTarget = {
    route: `POST /api/bookings (new holds, ${GUESTS * HOLDS_PER_GUEST} requests)`,
    opts: {
      url: `${base}/api/bookings`,
      amount: GUESTS * HOLDS_PER_GUEST,
      requests: [{
        method: 'POST',
        setupRequest: (req: autocannon.Request) => {
          const g = guests[n % guests.length]!
          const k = Math.floor(n / guests.length)
          const sessionId = sessionIds[(k + (n % guests.length)) % sessionIds.length]!
          n++
          return { ...req, headers: { 'content-type': 'application/json', 'cookie': g.cookie, 'x-forwarded-for': g.ip }, body: JSON.stringify(booking(g, sessionId)) }
        },
      }],
    },
  }
  const holdRow = await measure(hold)
  await afterEach(holdRow)
  rows.push(holdRow)
  targets.push(hold)
  return { rows, targets }
}

/** Every statement one GET of each route ran (general log), EXPLAINed, with its plan's table, access, key and rows. */
async function explainRoutes(db: mysql.Connection, targets: GrowthTarget[]): Promise<string[]> {
  const out: string[] = []
  asRoot(`SET GLOBAL log_output = 'TABLE'`)
  for (const t of targets) {
    if (!t.probe) continue
    asRoot('SET GLOBAL general_log = 0; TRUNCATE mysql.general_log; SET GLOBAL general_log = 1')
    await call(t.probe.path, { cookie: t.probe.cookie })
    const rows = asRoot(`SET GLOBAL general_log = 0; SELECT argument FROM mysql.general_log WHERE command_type IN ('Query', 'Execute') AND user_host LIKE 'larmoir%' AND argument LIKE 'select%'`)
    const queries = [...new Set(rows.map(r => r[0]!.replace(/\\n/g, ' ').replace(/\\t/g, ' ')))]
    out.push(`\n#### ${t.route}: ${queries.length} SELECT statement${queries.length === 1 ? '' : 's'}\n`)
    for (const q of queries) {
      out.push(`- \`${q.length > 220 ? `${q.slice(0, 220)}…` : q}\``)
      try {
        const [plan] = await db.query(`EXPLAIN ${q}`) as unknown as [{ table: string, type: string, key: string | null, rows: number, Extra: string | null }[]]
        for (const p of plan) out.push(`  - ${p.table}: ${p.type}${p.key ? ` via ${p.key}` : ''}, ~${p.rows} rows${p.Extra ? ` (${p.Extra})` : ''}`)
      }
      catch (err) { out.push(`  - (no plan: ${(err as Error).message.slice(0, 120)})`) }
    }
  }
  return out
}

/** The slow log's statements grouped with their literals blanked out, the costliest first. */
function slowLogTop(limit = 10): string[] {
  if (!existsSync(SLOW_LOG)) return ['(no slow log)']
  const groups = new Map<string, { count: number, total: number, max: number, rows: number }>()
  let time = 0
  let examined = 0
  let sql: string[] = []
  const flush = () => {
    const text = sql.join(' ').trim()
    sql = []
    if (!text || /^(SET timestamp|use |# )/i.test(text) || !/^select|^insert|^update|^delete/i.test(text)) return
    const shape = text.replace(/'(?:[^'\\]|\\.)*'/g, '?').replace(/\b\d+(\.\d+)?\b/g, 'N').replace(/(\?|N)(\s*,\s*(\?|N))+/g, '…').replace(/\s+/g, ' ')
    const g = groups.get(shape) ?? { count: 0, total: 0, max: 0, rows: 0 }
    g.count++
    g.total += time
    g.max = Math.max(g.max, time)
    g.rows = Math.max(g.rows, examined)
    groups.set(shape, g)
  }
  for (const line of readFileSync(SLOW_LOG, 'utf8').split('\n')) {
    const m = /^# Query_time: ([\d.]+)\s+Lock_time: [\d.]+\s+Rows_sent: \d+\s+Rows_examined: (\d+)/.exec(line)
    if (m) {
      flush()
      time = Number(m[1])
      examined = Number(m[2])
      continue
    }
    if (line.startsWith('#') || /^SET timestamp=/.test(line) || /^use /.test(line)) continue
    sql.push(line)
  }
  flush()
  return [...groups.entries()].sort((a, b) => b[1].total - a[1].total).slice(0, limit)
    .map(([shape, g]) => `| ${g.count} | ${(g.total * 1000).toFixed(0)} | ${(g.max * 1000).toFixed(0)} | ${g.rows} | \`${shape.length > 200 ? `${shape.slice(0, 200)}…` : shape}\` |`)
}

async function main() {
  mkdirSync(resolve(root, '.data'), { recursive: true })
  await startDb(GROWTH_DB)
  resetDatabase(GROWTH_DB)
  const mail = await startMailFake({ smtpPort: PORTS.smtp, httpPort: PORTS.mailHttp, dir: resolve(root, '.data/mail-growth') })
  const stripe = await startStripeFake({ port: PORTS.stripe, webhookUrl: `${base}/webhooks/stripe`, webhookSecret: localSecrets('bench').stripeWebhookSecret, publicUrl: `http://127.0.0.1:${PORTS.stripe}` })
  const env = benchAppEnv(base, databaseUrl(GROWTH_DB), PORTS)
  const logFile = resolve(root, '.data/app-growth.log')
  let app: RunningApp = await startApp({ port: PORTS.app, logFile, env })
  const db = await mysql.createConnection({ uri: databaseUrl(GROWTH_DB), timezone: 'Z' })
  try {
    const loadBefore = loadavg()
    let memory = memorySampler(app.child.pid!)
    let crashedPeak = 0
    const demo = await measureGrowthRoutes(db, 0)
    const demoPeak = memory.peak()
    memory.stop()
    const tableSize = async () => {
      const [rows] = await db.query(`SELECT table_name AS t, table_rows AS n FROM information_schema.tables WHERE table_schema = ? AND table_name IN ('products', 'flights', 'tasting_sessions', 'bookings', 'outbox', 'users', 'check_ins', 'booking_events')`, [GROWTH_DB.database]) as unknown as [{ t: string, n: number }[]]
      return rows
    }

    await app.stop()
    console.log('[growth] filling the busy venue…')
    const filled = await fillBusyVenue(db)
    console.log(`[growth] busy venue added in ${filled.seconds.toFixed(1)} s: ${filled.counts.map(c => `${c.table} ${c.rows}`).join(', ')}`)
    rmSync(SLOW_LOG, { force: true })
    asRoot(`SET GLOBAL slow_query_log_file = '${SLOW_LOG}'; SET GLOBAL long_query_time = 0.05; SET GLOBAL log_queries_not_using_indexes = 1; SET GLOBAL slow_query_log = 1`)
    app = await startApp({ port: PORTS.app, logFile, env })
    memory = memorySampler(app.child.pid!)
    // A server that died under a route (its heap bound, SERVER_NODE_FLAGS) is noted on that route
    // and started again, so the routes after it are still measured.
    const busy = await measureGrowthRoutes(db, 1, async (row) => {
      if (app.child.exitCode === null && app.child.signalCode === null) return
      const tail = readFileSync(logFile, 'utf8').slice(-20_000)
      row.crashed = /heap out of memory/.test(tail) ? 'the server ran out of heap (--max-old-space-size=192) and exited' : `the server exited (code ${app.child.exitCode}, ${app.child.signalCode})`
      console.log(`[growth] ${row.route}: ${row.crashed}; starting it again`)
      crashedPeak = Math.max(crashedPeak, memory.peak())
      memory.stop()
      app = await startApp({ port: PORTS.app, logFile, env })
      memory = memorySampler(app.child.pid!)
    })
    const busyPeak = Math.max(crashedPeak, memory.peak())
    memory.stop()
    asRoot('SET GLOBAL slow_query_log = 0')
    const explained = await explainRoutes(db, busy.targets)
    const sizes = await tableSize()
    const alive = app.child.exitCode === null

    console.log(`\n${spawnSync('date', ['-u']).stdout.toString().trim()} · ${cpus().length} cores · load average before ${loadBefore.map(l => l.toFixed(1)).join(' ')}, after ${loadavg().map(l => l.toFixed(1)).join(' ')} · ${SECONDS} s per route, 10 connections · Node ${process.version}\n`)
    console.log(`Busy venue generated in ${filled.seconds.toFixed(1)} s: ${filled.counts.map(c => `${c.rows.toLocaleString('en-US')} ${c.table}`).join(', ')}. Table rows after (estimates): ${sizes.map(s => `${s.t} ${Number(s.n).toLocaleString('en-US')}`).join(', ')}.\n`)
    console.log('| route | demo p50 ms | demo p99 ms | busy p50 ms | busy p99 ms | busy req/s | busy bytes | growth (p99) | goal 5: ≤ 2× |')
    console.log('|---|---:|---:|---:|---:|---:|---:|---:|---|')
    let met = 0
    for (let i = 0; i < demo.rows.length; i++) {
      const d = demo.rows[i]!
      const b = busy.rows[i]!
      const growth = b.p99 / Math.max(1, d.p99)
      // A route that got no answer (a server stuck at its heap bound) is not met, whatever its zeros say.
      if (!b.crashed && b.rps === 0) b.crashed = 'no answer: the server was stuck at its heap bound or down'
      const ok = growth <= 2 && !b.crashed
      if (ok) met++
      console.log(`| ${b.route} | ${d.p50} | ${d.p99} | ${b.p50} | ${b.p99} | ${b.rps.toFixed(0)} | ${b.bytes} | ${growth.toFixed(2)}× | ${ok ? 'met' : `not met${b.crashed ? ` (${b.crashed})` : ''}`} |`)
    }
    console.log(`\nGoal 5 met on ${met} of ${demo.rows.length} routes. Answers: ${busy.rows.map(r => `${r.route}: ${r.codes}`).join('; ')}. Server ${alive ? 'still running' : 'EXITED (see .data/app-growth.log)'} after the busy run; its peak resident memory ${demoPeak.toFixed(0)} MB at demo size, ${busyPeak.toFixed(0)} MB busy.\n`)
    console.log('Slow log of the busy run (long_query_time 0.05 s, and every query not using an index):\n')
    console.log('| count | total ms | max ms | rows examined (max) | statement |')
    console.log('|---:|---:|---:|---:|---|')
    for (const l of slowLogTop()) console.log(l)
    console.log('\n### EXPLAIN of each route\'s statements (busy venue)')
    for (const l of explained) console.log(l)
  }
  finally {
    await db.end()
    await app.stop()
    await stripe.close()
    await mail.close()
    await stopDb(GROWTH_DB)
  }
}

if (process.argv[1] && resolve(process.argv[1]) === resolve(import.meta.filename)) {
  main().then(() => process.exit(process.exitCode ?? 0), (err) => { console.error(err); process.exit(1) })
}
