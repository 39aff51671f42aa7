import type { CurvePoint } from '#shared/science/glassModel'

/** ABVs the reading names beyond the peak: a spirit, and nearly pure alcohol (% vol). */
const SPIRIT_ABV = 40
const STRONGEST_ABV = 95

/** An index below this reads as 0 (it prints as 0.0). */
const ZERO_INDEX = 0.05

const nearest = (curve: CurvePoint[], abv: number) => curve.reduce((a, b) => (Math.abs(b.abvPctVol - abv) < Math.abs(a.abvPctVol - abv) ? b : a))

/** One point the reading names: its ABV (% vol) and its index (0–10). */
interface ReadingPoint { abvPctVol: number, filmActivityIndex: number }

/**
 * The few points of the σ and index curve that its reading names, so a page can print the reading
 * without sending the curve itself (a few hundred numbers) to the browser.
 */
export interface FilmCurveReading {
  peak: ReadingPoint
  spirit: ReadingPoint
  strongest: ReadingPoint
  /** The first ABV beyond the peak where the index reads 0, if there is one. */
  zeroFromAbvPctVol: number | null
  bulkFirst_mN_m: number
  bulkLast_mN_m: number
}

export function filmCurveReading(curve: CurvePoint[]): FilmCurveReading | null {
  if (!curve.length) return null
  const point = (p: CurvePoint): ReadingPoint => ({ abvPctVol: p.abvPctVol, filmActivityIndex: p.filmActivityIndex })
  const peak = curve.reduce((a, b) => (b.filmActivityIndex > a.filmActivityIndex ? b : a))
  const zero = curve.find(p => p.abvPctVol > peak.abvPctVol && p.filmActivityIndex < ZERO_INDEX)
  return {
    peak: point(peak), spirit: point(nearest(curve, SPIRIT_ABV)), strongest: point(nearest(curve, STRONGEST_ABV)),
    zeroFromAbvPctVol: zero?.abvPctVol ?? null,
    bulkFirst_mN_m: curve[0]!.surfaceTensionBulk_mN_m, bulkLast_mN_m: curve.at(-1)!.surfaceTensionBulk_mN_m,
  }
}

/**
 * A short reading of the curve: where the index (the liquid the film carries up) peaks, how slowly
 * it falls for stronger mixes and why, and the surface tension across the range. Index values are
 * rounded to whole numbers: the curve is the model's central line, not a measurement.
 */
export function filmCurveSummary(reading: FilmCurveReading | null, tempLabel: string, roomLabel: string, roomWarmer = false): string {
  if (!reading) return ''
  const { peak, spirit, strongest, zeroFromAbvPctVol: zero } = reading
  const about = (v: number) => `about ${Math.round(v)}`
  const beyond = zero !== null && zero <= SPIRIT_ABV ? [] : [`${about(spirit.filmActivityIndex)} at ${spirit.abvPctVol.toFixed(0)} % vol`]
  if (zero === null) beyond.push(`${about(strongest.filmActivityIndex)} at ${strongest.abvPctVol.toFixed(0)} % vol`)
  const falls = beyond.length ? `Above that it falls slowly — ${beyond.join(', ')} — because` : 'Above that it falls, because'
  const cut = zero !== null
    ? ` From about ${zero.toFixed(0)} % vol it is 0${roomWarmer ? ': the room\'s warmer air warms the film, and a warmer film pulls less, which cancels the weak pull of strong mixes' : ''}.`
    : ''
  return `For a liquid at ${tempLabel} in a room at ${roomLabel}: the index is 0 for water, rises steeply over the first per cent of alcohol and peaks at ${about(peak.filmActivityIndex)} near ${peak.abvPctVol.toFixed(0)} % vol. ${falls} a spirit's film pulls about as hard as a wine's but is more viscous, so it carries less liquid and its tears fall slower; towards pure alcohol the pull weakens too, as losing ethanol hardly changes the surface tension there.${cut}`
    + ` The surface tension of the liquid falls from about ${Math.round(reading.bulkFirst_mN_m)} to about ${Math.round(reading.bulkLast_mN_m)} mN/m across the range; the film's, after evaporation, stays a little above it.`
}
