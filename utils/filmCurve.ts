import type { CurvePoint } from '#shared/science'

/** One-sentence reading of the curve: where the index peaks and where it falls back to zero. */
export function filmCurveSummary(curve: CurvePoint[], tempLabel: string): string {
  if (!curve.length) return ''
  const peak = curve.reduce((a, b) => (b.filmActivityIndex > a.filmActivityIndex ? b : a))
  const zero = curve.find(p => p.abvPctVol > peak.abvPctVol && p.filmActivityIndex < 0.05)
  return `At ${tempLabel}, the film activity index rises from 0 for water to its peak of ${peak.filmActivityIndex.toFixed(1)} near ${peak.abvPctVol.toFixed(0)} % vol`
    + (zero ? ` and falls back to about 0 by ${zero.abvPctVol.toFixed(0)} % vol, where evaporation no longer leaves the film richer in water.` : '.')
    + ` The wine's surface tension falls from ${curve[0]!.surfaceTensionBulk_mN_m.toFixed(1)} to ${curve.at(-1)!.surfaceTensionBulk_mN_m.toFixed(1)} mN/m across the range.`
}
