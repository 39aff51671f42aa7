/**
 * Ranges for the glass model's predictions: the model is run again with its uncertain inputs and
 * parameters drawn from their documented spreads, and each prediction is reported as the 10th to
 * 90th percentile of the draws. The draws are seeded from the inputs, so one pour always gets the
 * same range (deterministic, testable).
 */

/** Number of draws per range (the 10th–90th percentiles move by < 10 % between 32 and 256 draws; see tests). */
export const RANGE_DRAWS = 32

/** The spreads sampled, with their sources (docs/science.md, "Ranges"). */
export const RANGE_SPREADS = {
  /** Henry's-law Hcp of ethanol: the compilation's spread 1.7–2.0 mol/(m³·Pa) (Sander 2015): ×/÷ 1.08, log-normal 1σ. */
  henrySigmaLn: 0.08,
  /** γ2∞ of water in ethanol at glass temperature, ±12 % 1σ (the DECHEMA value, not checked against isothermal data; estimate). */
  waterGammaSigmaLn: 0.12,
  /** Room draughts 0.05–0.2 m/s, log-uniform (ASHRAE 55 still air — from memory). */
  airSpeed_m_s: [0.05, 0.2] as const,
  /** Exchanged fraction at the band's top ×/÷ 2, log-uniform (the calibration, climbingFilm.ts). */
  exchangeFactor: [0.5, 2] as const,
  /** ∂σ/∂x of the surface-tension fit ±10 % 1σ (its residuals of up to 1.1 mN/m near 5 % mass). */
  sigmaSlopeSigma: 0.1,
  /** Viscosity fits ±5 % 1σ (their residuals at 0 and 40 °C). */
  viscositySigma: 0.05,
  /** A room hygrometer's reading ±4 % RH 1σ (consumer hygrometers ±3–5 % RH, common practice, no source). */
  humiditySigmaPct: 4,
  /** Glass wall conductance ×/÷ 1.5 (0.8–2 mm walls), log-uniform. */
  conductanceFactor: [1 / 1.5, 1.5] as const,
  /** Wall angle at the liquid line ±5° 1σ around the glass's stated angle (bowls curve; estimate). */
  wallAngleSigmaDeg: 5,
} as const

/** Mulberry32: a small, well-mixed 32-bit generator (public domain), enough for sampling. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** A 32-bit FNV-1a hash of a string: the seed of a pour's draws. */
export function seedOf(text: string): number {
  let h = 0x811C9DC5
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i)
    h = Math.imul(h, 0x01000193)
  }
  return h >>> 0
}

/** A standard normal draw (Box–Muller). */
export function normalDraw(random: () => number): number {
  const u = Math.max(1e-12, random())
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random())
}

/** A log-uniform draw in [lo, hi]. */
export function logUniformDraw(random: () => number, lo: number, hi: number): number {
  return lo * (hi / lo) ** random()
}

/** The p-th quantile (0–1) of values, linear between order statistics; null when empty. */
function quantile(values: readonly number[], p: number): number | null {
  if (!values.length) return null
  const sorted = [...values].sort((a, b) => a - b)
  const pos = (sorted.length - 1) * p
  const lo = Math.floor(pos)
  const hi = Math.ceil(pos)
  return sorted[lo]! + (sorted[hi]! - sorted[lo]!) * (pos - lo)
}

/** A prediction's range: the 10th and 90th percentiles of the draws. */
export interface Range { low: number, high: number }

/** 10th–90th percentile range of values, or null when fewer than half the draws gave a value. */
export function rangeOf(values: readonly number[], draws: number): Range | null {
  if (values.length < draws / 2) return null
  return { low: quantile(values, 0.1)!, high: quantile(values, 0.9)! }
}
