/**
 * Timing of the glass model (not a test). Run: npx tsx bench/science.bench.ts
 * Prints the median wall time of computeCurve (201 points), of one computeFilm call and of one
 * calibrate call over a season of 2,000 observations.
 */
import { computeCurve, computeFilm } from '../shared/science'
import { calibrate } from '../shared/science/calibration'
import { syntheticObservations } from '../tests/unit/science/calibrationSynthetic'

const REPETITIONS = Number(process.env.BENCH_REPETITIONS ?? 200)
const WARM_UP = 20

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b)
  const mid = Math.floor(s.length / 2)
  return s.length % 2 === 1 ? (s[mid] ?? 0) : ((s[mid - 1] ?? 0) + (s[mid] ?? 0)) / 2
}

function time(label: string, fn: () => unknown, repetitions = REPETITIONS, warmUp = WARM_UP): void {
  for (let i = 0; i < warmUp; i++) fn()
  const samples: number[] = []
  for (let i = 0; i < repetitions; i++) {
    const t0 = performance.now()
    fn()
    samples.push(performance.now() - t0)
  }
  const sorted = [...samples].sort((a, b) => a - b)
  const p95 = sorted[Math.floor(0.95 * (sorted.length - 1))] ?? 0
  console.log(`${label}: median ${median(samples).toFixed(3)} ms, p95 ${p95.toFixed(3)} ms (${repetitions} runs)`)
}

let k = 0
time('computeCurve, 201 points', () => computeCurve({ tempC: 18, sugarGL: 4, points: 201 }))
time('computeFilm, one pour', () => computeFilm({ abvPctVol: 12 + (k++ % 7), tempC: 18, sugarGL: 4 }))

// The calibration: 2,000 observations over 6 glasses (3 pours each, 20 sessions with their own room
// readings, so 360 distinct pour-and-room conditions), from the model itself with noise. A cold
// calibrate call each time: its model runs are memoised within the call only.
const glasses = Array.from({ length: 6 }, (_, g) => syntheticObservations({
  glassKey: `glass-${g}`, truth: { exchangeFactor: 0.8 + 0.15 * g, massTransferFactor: 1.2 - 0.08 * g },
  n: g < 2 ? 334 : 333, seed: 1000 + g, sessions: 20, rooms: ['room-a', 'room-b'],
}))
const season = glasses.flat()
console.log(`calibrate: ${season.length} observations over ${glasses.length} glasses`)
console.log(`calibrate: ${calibrate(season).modelRuns} model runs per call`)
time('calibrate, 2,000 observations over 6 glasses', () => calibrate(season), 10, 2)
