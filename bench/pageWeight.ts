/**
 * The guest pages' weight (not a test): each page's HTML, its hydration payload (the
 * `__NUXT_DATA__` script) and the JavaScript its HTML asks for up front (the module script and its
 * modulepreload links, gzipped as built in .output/public). `npm run bench:load` prints it with the
 * goals of issue 17.
 */
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { gzipSync } from 'node:zlib'

export interface PageWeight { name: string, path: string, htmlBytes: number, htmlGzipBytes: number, payloadBytes: number, jsFiles: number, jsGzipBytes: number }

/** The guest pages measured, for the flight whose id is given. */
export const guestPages = (flightId: number) => [
  ['home', '/'], ['flights', '/flights'], ['a flight page', `/flights/${flightId}`], ['the glass page', '/glass'], ['a pour page', `/pour/${flightId}/1`],
] as const

const gzipped = new Map<string, number>()
function gzipSize(root: string, path: string) {
  let n = gzipped.get(path)
  if (n === undefined) {
    n = gzipSync(readFileSync(resolve(root, '.output/public', path.replace(/^\//, '')))).length
    gzipped.set(path, n)
  }
  return n
}

export async function measurePageWeight(base: string, root: string, flightId: number): Promise<PageWeight[]> {
  const out: PageWeight[] = []
  for (const [name, path] of guestPages(flightId)) {
    const res = await fetch(`${base}${path}`, { headers: { accept: 'text/html' } })
    if (res.status !== 200) throw new Error(`${path} answered ${res.status}`)
    const html = await res.text()
    const payload = /<script[^>]*id="__NUXT_DATA__"[^>]*>([\s\S]*?)<\/script>/.exec(html)?.[1] ?? ''
    const upfront = [...new Set([...html.matchAll(/<(?:script[^>]*\ssrc|link[^>]*rel="modulepreload"[^>]*\shref)="(\/_nuxt\/[^"]+\.js)"/g)].map(m => m[1]!))]
    out.push({
      name, path,
      htmlBytes: Buffer.byteLength(html), htmlGzipBytes: gzipSync(html).length,
      payloadBytes: Buffer.byteLength(payload),
      jsFiles: upfront.length, jsGzipBytes: upfront.reduce((n, p) => n + gzipSize(root, p), 0),
    })
  }
  return out
}

const kb = (n: number) => `${(n / 1024).toFixed(1)} KB`
/** Goal 2 of issue 17: the flight page ≤ 40 KB of HTML and ≤ 15 KB of payload; ≤ 100 KB of gzipped JavaScript up front on every guest page. */
export const PAGE_GOALS = { flightHtmlBytes: 40 * 1024, flightPayloadBytes: 15 * 1024, jsGzipBytes: 100 * 1024 }

export function pageWeightTable(rows: PageWeight[]): string {
  const lines = ['| page | HTML | gzipped | payload | JS up front (gzip) | goal 2 |', '|---|---:|---:|---:|---|---|']
  for (const r of rows) {
    const checks: string[] = []
    if (r.path.startsWith('/flights/')) {
      checks.push(`HTML ≤ 40 KB ${r.htmlBytes <= PAGE_GOALS.flightHtmlBytes ? 'met' : 'not met'}`)
      checks.push(`payload ≤ 15 KB ${r.payloadBytes <= PAGE_GOALS.flightPayloadBytes ? 'met' : 'not met'}`)
    }
    checks.push(`JS ≤ 100 KB ${r.jsGzipBytes <= PAGE_GOALS.jsGzipBytes ? 'met' : 'not met'}`)
    lines.push(`| ${r.name} (\`${r.path}\`) | ${kb(r.htmlBytes)} | ${kb(r.htmlGzipBytes)} | ${kb(r.payloadBytes)} | ${r.jsFiles} files, ${kb(r.jsGzipBytes)} | ${checks.join('; ')} |`)
  }
  return lines.join('\n')
}
