/**
 * Lighthouse on the guest pages (not a test): `npm run bench:lighthouse`, after `npx nuxt build`.
 * Starts its own MariaDB instance with the demo data and the built server on 127.0.0.1, runs
 * Lighthouse 12 in Debian's Chromium (never a downloaded browser) on home, flights, a flight page,
 * the glass page and a pour page, and prints the four category scores and each page's JavaScript
 * (the /_nuxt scripts the page loads, gzipped sizes measured from .output/public/_nuxt).
 */
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { gzipSync } from 'node:zlib'
import { execSync } from 'node:child_process'
import * as chromeLauncher from 'chrome-launcher'
import lighthouse from 'lighthouse'
import { databaseUrl, resetDatabase, startDb, stopDb, type DbInstance } from '../scripts/lib/mariadb'
import { startApp } from '../scripts/lib/app'
import { localSecrets } from '../scripts/lib/secrets'

const BENCH_DB: DbInstance = { name: 'bench-db', port: 3419, database: 'larmoir_bench', user: 'larmoir', password: 'larmoir' }
const PORT = 3198
const base = `http://127.0.0.1:${PORT}`
const root = resolve(import.meta.dirname, '..')
const FLAGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync']

const gz = (file: string) => gzipSync(readFileSync(file)).length
const kb = (n: number) => `${(n / 1024).toFixed(1)} KB`

async function main() {
  await startDb(BENCH_DB)
  resetDatabase(BENCH_DB)
  const app = await startApp({
    port: PORT,
    logFile: resolve(root, '.data/app-bench.log'),
    env: { NUXT_APP_URL: base, NUXT_DEMO_SEED: 'true', NUXT_DATABASE_URL: databaseUrl(BENCH_DB), NUXT_SESSION_PASSWORD: localSecrets('bench').sessionPassword },
  })
  const chrome = await chromeLauncher.launch({ chromePath: '/usr/bin/chromium', chromeFlags: FLAGS })
  try {
    const flights = await (await fetch(`${base}/api/flights/published`)).json() as { id: number }[]
    const id = flights[0]!.id
    const pages = [['home', '/'], ['flights', '/flights'], ['a flight page', `/flights/${id}`], ['the glass page', '/glass'], ['a pour page', `/pour/${id}/1`]] as const
    const lines: string[] = []
    for (const [name, path] of pages) {
      const result = await lighthouse(`${base}${path}`, {
        port: chrome.port, output: 'json', logLevel: 'error',
        onlyCategories: ['performance', 'accessibility', 'best-practices', 'seo'],
      }, { extends: 'lighthouse:default', settings: { formFactor: 'mobile', throttlingMethod: 'simulate' } })
      const c = result!.lhr.categories
      const score = (k: string) => Math.round((c[k]?.score ?? 0) * 100)
      // The page's JavaScript: every /_nuxt/*.js it requested, gzipped as built.
      const requests = (result!.lhr.audits['network-requests']?.details as { items?: { url: string }[] } | undefined)?.items ?? []
      const js = [...new Set(requests.map(r => new URL(r.url).pathname).filter(p => p.startsWith('/_nuxt/') && p.endsWith('.js')))]
      const bytes = js.reduce((n, p) => n + gz(resolve(root, '.output/public', p.slice(1))), 0)
      // What the page's HTML asks for up front: its module script and modulepreload links.
      const html = await (await fetch(`${base}${path}`)).text()
      const upfront = [...new Set([...html.matchAll(/<(?:script[^>]*\ssrc|link[^>]*rel="modulepreload"[^>]*\shref)="(\/_nuxt\/[^"]+\.js)"/g)].map(m => m[1]!))]
      const upfrontBytes = upfront.reduce((n, p) => n + gz(resolve(root, '.output/public', p.slice(1))), 0)
      const line = `| ${name} (\`${path}\`) | ${score('performance')} | ${score('accessibility')} | ${score('best-practices')} | ${score('seo')} | ${upfront.length} files, ${kb(upfrontBytes)} | ${js.length} files, ${kb(bytes)} |`
      console.log(line)
      lines.push(line)
    }
    console.log(`\n${execSync('date -u').toString().trim()} · nproc ${execSync('nproc').toString().trim()} · Lighthouse 12.2.3, mobile, simulated throttling\n`)
    console.log('| page | performance | accessibility | best practices | SEO | JS in the page\'s tags (gzip) | all JS requested, with prefetches (gzip) |')
    console.log('|---|---:|---:|---:|---:|---|---|')
    for (const l of lines) console.log(l)
  }
  finally {
    chrome.kill()
    await app.stop()
    await stopDb(BENCH_DB)
  }
}

main().catch((err) => { console.error(err); process.exit(1) })
