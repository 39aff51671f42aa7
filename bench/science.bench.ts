/**
 * Timing of the glass model (not a test). Run: npx tsx bench/science.bench.ts
 * Prints the median wall time of computeCurve (201 points) and of one computeFilm call.
 */
import { computeCurve, computeFilm } from '../shared/science'

const REPETITIONS = 200
const WARM_UP = 20

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b)
  const mid = Math.floor(s.length / 2)
  return s.length % 2 === 1 ? (s[mid] ?? 0) : ((s[mid - 1] ?? 0) + (s[mid] ?? 0)) / 2
}

function time(label: string, fn: () => unknown): void {
  for (let i = 0; i < WARM_UP; i++) fn()
  const samples: number[] = []
  for (let i = 0; i < REPETITIONS; i++) {
    const t0 = performance.now()
    fn()
    samples.push(performance.now() - t0)
  }
  const sorted = [...samples].sort((a, b) => a - b)
  const p95 = sorted[Math.floor(0.95 * (sorted.length - 1))] ?? 0
  console.log(`${label}: median ${median(samples).toFixed(3)} ms, p95 ${p95.toFixed(3)} ms (${REPETITIONS} runs)`)
}

let k = 0
time('computeCurve, 201 points', () => computeCurve({ tempC: 18, sugarGL: 4, points: 201 }))
time('computeFilm, one pour', () => computeFilm({ abvPctVol: 12 + (k++ % 7), tempC: 18, sugarGL: 4 }))
