import type { CurvePoint } from '#shared/science/glassModel'

/** ABVs the reading names beyond the peak: a spirit, and nearly pure alcohol (% vol). */
const SPIRIT_ABV = 40
const STRONGEST_ABV = 95

/** An index below this reads as 0 (it prints as 0.0). */
const ZERO_INDEX = 0.05

const nearest = (curve: CurvePoint[], abv: number) => curve.reduce((a, b) => (Math.abs(b.abvPctVol - abv) < Math.abs(a.abvPctVol - abv) ? b : a))

/**
 * A short reading of the curve: where the index (the liquid the film carries up) peaks, how slowly
 * it falls for stronger mixes and why, and the surface tension across the range. Index values are
 * rounded to whole numbers: the curve is the model's central line, not a measurement.
 */
export function filmCurveSummary(curve: CurvePoint[], tempLabel: string, roomLabel: string, roomWarmer = false): string {
  if (!curve.length) return ''
  const peak = curve.reduce((a, b) => (b.filmActivityIndex > a.filmActivityIndex ? b : a))
  const spirit = nearest(curve, SPIRIT_ABV)
  const strongest = nearest(curve, STRONGEST_ABV)
  const zero = curve.find(p => p.abvPctVol > peak.abvPctVol && p.filmActivityIndex < ZERO_INDEX)
  const about = (v: number) => `about ${Math.round(v)}`
  const beyond = zero && zero.abvPctVol <= SPIRIT_ABV ? [] : [`${about(spirit.filmActivityIndex)} at ${spirit.abvPctVol.toFixed(0)} % vol`]
  if (!zero) beyond.push(`${about(strongest.filmActivityIndex)} at ${strongest.abvPctVol.toFixed(0)} % vol`)
  const falls = beyond.length ? `Above that it falls slowly — ${beyond.join(', ')} — because` : 'Above that it falls, because'
  const cut = zero
    ? ` From about ${zero.abvPctVol.toFixed(0)} % vol it is 0${roomWarmer ? ': the room\'s warmer air warms the film, and a warmer film pulls less, which cancels the weak pull of strong mixes' : ''}.`
    : ''
  return `For a liquid at ${tempLabel} in a room at ${roomLabel}: the index is 0 for water, rises steeply over the first per cent of alcohol and peaks at ${about(peak.filmActivityIndex)} near ${peak.abvPctVol.toFixed(0)} % vol. ${falls} a spirit's film pulls about as hard as a wine's but is more viscous, so it carries less liquid and its tears fall slower; towards pure alcohol the pull weakens too, as losing ethanol hardly changes the surface tension there.${cut}`
    + ` The surface tension of the liquid falls from about ${Math.round(curve[0]!.surfaceTensionBulk_mN_m)} to about ${Math.round(curve.at(-1)!.surfaceTensionBulk_mN_m)} mN/m across the range; the film's, after evaporation, stays a little above it.`
}
