/**
 * Lighthouse on the guest pages (not a test): `npm run bench:lighthouse`, after `npx nuxt build`;
 * `npm run bench:load` runs the same measurement at its end. Starts its own MariaDB instance with
 * the demo data and the built server on 127.0.0.1 (ports shifted by LARMOIR_PORT_OFFSET), runs
 * Lighthouse 12 in Debian's Chromium (never a downloaded browser) three times on each of home,
 * flights, a flight page, the glass page and a pour page, and prints each category's median score
 * with the JavaScript each page's HTML asks for up front (bench/pageWeight.ts).
 */
import { resolve } from 'node:path'
import { execSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import * as chromeLauncher from 'chrome-launcher'
import lighthouse from 'lighthouse'
import { databaseUrl, resetDatabase, startDb, stopDb, type DbInstance } from '../scripts/lib/mariadb'
import { startApp } from '../scripts/lib/app'
import { localSecrets } from '../scripts/lib/secrets'
import { guestPages } from './pageWeight'

const OFFSET = Number(process.env.LARMOIR_PORT_OFFSET ?? 0) || 0
const BENCH_DB: DbInstance = { name: 'bench-db', port: 3419 + OFFSET, database: 'larmoir_bench', user: 'larmoir', password: 'larmoir' }
const PORT = 3198 + OFFSET
const root = resolve(import.meta.dirname, '..')
/** Each page's last report, for reading the trace's details (`.data/lighthouse/*.json`). */
const REPORTS = resolve(root, '.data/lighthouse')
const FLAGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync']
const CATEGORIES = ['performance', 'accessibility', 'best-practices', 'seo'] as const

export interface LighthouseRow { name: string, path: string, runs: number, scores: Record<(typeof CATEGORIES)[number], number>, allRuns: Record<(typeof CATEGORIES)[number], number[]> }

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b)
  return s.length % 2 ? s[(s.length - 1) / 2]! : Math.round((s[s.length / 2 - 1]! + s[s.length / 2]!) / 2)
}

/** Each guest page `runs` times (mobile, simulated throttling); each category's median. */
export async function runLighthouse(base: string, flightId: number, runs = 3): Promise<LighthouseRow[]> {
  const chrome = await chromeLauncher.launch({ chromePath: '/usr/bin/chromium', chromeFlags: FLAGS })
  try {
    const out: LighthouseRow[] = []
    for (const [name, path] of guestPages(flightId)) {
      const allRuns = Object.fromEntries(CATEGORIES.map(c => [c, [] as number[]])) as LighthouseRow['allRuns']
      for (let i = 0; i < runs; i++) {
        const result = await lighthouse(`${base}${path}`, {
          port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: [...CATEGORIES],
        }, { extends: 'lighthouse:default', settings: { formFactor: 'mobile', throttlingMethod: 'simulate' } })
        for (const c of CATEGORIES) allRuns[c].push(Math.round((result!.lhr.categories[c]?.score ?? 0) * 100))
        // What the score is made of: each metric's simulated value and its own score (0–100).
        const a = result!.lhr.audits
        const metric = (id: string, unit = 'ms') => `${id.replace(/-/g, ' ')} ${Math.round(a[id]?.numericValue ?? 0)}${unit} (${Math.round((a[id]?.score ?? 0) * 100)})`
        console.log(`[lighthouse] ${path} run ${i + 1}: ${[metric('first-contentful-paint'), metric('largest-contentful-paint'), metric('total-blocking-time'), metric('speed-index'), `cumulative layout shift ${(a['cumulative-layout-shift']?.numericValue ?? 0).toFixed(3)}`].join(', ')}`)
        if (i === runs - 1) {
          mkdirSync(REPORTS, { recursive: true })
          writeFileSync(resolve(REPORTS, `${name.replace(/\W+/g, '-')}.json`), JSON.stringify(result!.lhr))
        }
      }
      const scores = Object.fromEntries(CATEGORIES.map(c => [c, median(allRuns[c])])) as LighthouseRow['scores']
      console.log(`[lighthouse] ${path}: ${CATEGORIES.map(c => `${c} ${allRuns[c].join('/')}`).join(', ')}`)
      out.push({ name, path, runs, scores, allRuns })
    }
    return out
  }
  finally { chrome.kill() }
}

/** Goal 2 of issue 17: performance ≥ 95 (median of three), the other three categories 100. */
export function lighthouseTable(rows: LighthouseRow[]): string {
  const lines = ['| page | performance | accessibility | best practices | SEO | runs (performance) | goal 2 |', '|---|---:|---:|---:|---:|---|---|']
  for (const r of rows) {
    const met = r.scores.performance >= 95 && r.scores.accessibility === 100 && r.scores['best-practices'] === 100 && r.scores.seo === 100
    lines.push(`| ${r.name} (\`${r.path}\`) | ${r.scores.performance} | ${r.scores.accessibility} | ${r.scores['best-practices']} | ${r.scores.seo} | ${r.allRuns.performance.join(', ')} | ≥ 95 and 100 — ${met ? 'met' : 'not met'} |`)
  }
  return lines.join('\n')
}

async function main() {
  await startDb(BENCH_DB)
  resetDatabase(BENCH_DB)
  const base = `http://127.0.0.1:${PORT}`
  const app = await startApp({
    port: PORT,
    logFile: resolve(root, '.data/app-bench.log'),
    env: { NUXT_APP_URL: base, NUXT_DEMO_SEED: 'true', NUXT_DATABASE_URL: databaseUrl(BENCH_DB), NUXT_SESSION_PASSWORD: localSecrets('bench').sessionPassword },
  })
  try {
    const flights = await (await fetch(`${base}/api/flights/published`)).json() as { id: number }[]
    const rows = await runLighthouse(base, flights[0]!.id, Number(process.env.LIGHTHOUSE_RUNS ?? 3) || 3)
    console.log(`\n${execSync('date -u').toString().trim()} · nproc ${execSync('nproc').toString().trim()} · Lighthouse 12.2.3, mobile, simulated throttling, median of 3\n`)
    console.log(lighthouseTable(rows))
  }
  finally {
    await app.stop()
    await stopDb(BENCH_DB)
  }
}

if (process.argv[1] && resolve(process.argv[1]) === import.meta.filename) main().catch((err) => { console.error(err); process.exit(1) })
