/**
 * What the guest reads: a few sentences generated from one computeFilm result — what to look for
 * (with the predicted ranges), why (the Gibbs–Marangoni effect), what this kind of drink changes,
 * the limits of the numbers, and always that tears say nothing about quality. Every number in the
 * text comes from the result passed in, so no sentence can contradict the figures beside it.
 */
import { type FilmResult, centralClimb } from './glassModel'
import type { Range } from './uncertainty'

/** Options for describePour. */
export interface DescribeOptions {
  /** Temperature unit in the text (default 'C'). */
  temperatureUnit?: 'C' | 'F'
  /**
   * A card's few lines: what to look for, the comparison with a table wine, sugar and the kind of
   * drink — without the why, cooling, humidity, limits and quality sentences, which a card says
   * once for all its pours.
   */
  brief?: boolean
}

/** The sentence every description ends with. */
export const QUALITY_DISCLAIMER
  = 'Tears say nothing about quality: they come from alcohol and evaporation, and sugar only slows them — it does not make them.'

/** A sugar viscosity factor below this is not worth a sentence (5 % slower flow). */
const SUGAR_SENTENCE_MIN_FACTOR = 1.05

/** ABV from which a pour is compared with a table wine in the text (spirits and their dilutions). */
const COMPARE_FROM_ABV_PCT_VOL = 30

/** The table wine the stronger pours are compared with, % vol (a common table-wine strength). */
const TABLE_WINE_ABV_PCT_VOL = 12

/** Ratios within this of 1 read as "similar" (±15 %). */
const SIMILAR_WITHIN = 0.15

/** The share of the pull from cooling worth a sentence. */
const THERMAL_SENTENCE_MIN_SHARE = 0.2

/** 2 significant figures, no trailing zeros ("12", "0.85", "1.3"). */
function sig2(value: number): string {
  if (value === 0) return '0'
  const digits = Math.max(0, 1 - Math.floor(Math.log10(Math.abs(value))))
  return String(Number(value.toFixed(Math.min(digits, 3))))
}

/** A range for prose: "8–14", or "about 9" when both ends round alike. */
export function rangeText(r: Range, unit: string): string {
  const lo = sig2(r.low)
  const hi = sig2(r.high)
  const sep = unit ? '\u00a0' : ''
  return lo === hi ? `about ${lo}${sep}${unit}` : `${lo}–${hi}${sep}${unit}`
}

/** A whole-number range for counts ("20–30"). */
function countText(r: Range): string {
  const lo = Math.max(1, Math.round(r.low))
  const hi = Math.max(lo, Math.round(r.high))
  return lo === hi ? `about ${lo}` : `${lo}–${hi}`
}

/** The ABV exactly as the lab sheet states it (up to two decimals, no rounding to whole per cent). */
export function abvText(abvPctVol: number): string {
  return String(Number(abvPctVol.toFixed(2)))
}

function tempText(tempC: number, unit: 'C' | 'F'): string {
  return unit === 'F' ? `${Math.round((tempC * 9) / 5 + 32)}\u00a0°F` : `${Math.round(tempC)}\u00a0°C`
}

function tempDiffText(kelvin: number, unit: 'C' | 'F'): string {
  return unit === 'F' ? `${sig2((kelvin * 9) / 5)}\u00a0°F` : `${sig2(kelvin)}\u00a0°C`
}

/** The room and glass the numbers assume, said where the numbers are. */
function limitsSentence(r: FilmResult, unit: 'C' | 'F'): string {
  const room = r.inputs.room
  return `These are ranges for a clean glass in still air at ${Math.round(room.relativeHumidityPct)}\u00a0% humidity and ${tempText(room.airTempC, unit)}; traces of detergent, a draught or a warm hand change them.`
}

/** How a stronger pour compares with a table wine in the same glass and room, from both results. */
function tableWineComparison(r: FilmResult, brief: boolean): string | null {
  const p = r.predictions
  if (r.inputs.abvPctVol < COMPARE_FROM_ABV_PCT_VOL || !p.tearsExpected || p.tearFallSpeed_mm_s === null) return null
  const wine = centralClimb({ ...r.inputs, abvPctVol: TABLE_WINE_ABV_PCT_VOL, sugarGL: 0, kind: 'still' }, r.calibration?.parameters)
  if (!(wine.marangoniStress_Pa > 0) || wine.tearFallSpeed_mm_s === null) return null
  const word = (ratio: number, more: string, less: string, same: string): string =>
    Math.abs(ratio - 1) <= SIMILAR_WITHIN ? same : ratio > 1 ? more : less
  const pull = word(p.marangoniStress_Pa / wine.marangoniStress_Pa, 'a stronger pull', 'a weaker pull', 'a similar pull')
  const film = word(p.filmThickness_um / wine.filmThickness_um, 'a thicker film', 'a thinner film', 'a film about as thick')
  const carried = word(p.climbFlux_mm2_s / wine.climbFlux_mm2_s, 'more liquid carried up', 'less liquid carried up', 'about as much liquid carried up')
  const fallRatio = p.tearFallSpeed_mm_s / wine.tearFallSpeed_mm_s
  const fall = Math.abs(fallRatio - 1) <= SIMILAR_WITHIN
    ? 'tears that fall about as fast'
    : fallRatio < 1 ? `tears that fall about ${Math.round(100 * (1 - fallRatio))}\u00a0% slower` : `tears that fall about ${Math.round(100 * (fallRatio - 1))}\u00a0% faster`
  const band = p.clearBandHeight_mm < wine.clearBandHeight_mm * (1 - SIMILAR_WITHIN) ? ', and a lower band, so most legs run down from where the swirl left the liquid' : ''
  const legs = fallRatio < 1 - SIMILAR_WITHIN ? ' — the slow legs stronger drinks are known for' : ''
  if (brief) {
    const lower = band ? ', a lower band' : ''
    return `Against a ${TABLE_WINE_ABV_PCT_VOL}\u00a0% table wine here: ${pull}, ${fall.replace('tears that fall', 'tears falling')}${lower}${legs}.`
  }
  return `Against a ${TABLE_WINE_ABV_PCT_VOL}\u00a0% table wine in the same glass and room: ${pull}, ${film}, ${carried} and ${fall}${band}${legs}.`
}

/** What the kind of drink changes, in words that agree with the numbers above them. */
function kindSentence(r: FilmResult): string | null {
  switch (r.inputs.kind) {
    case 'sparkling':
      return 'The bubbles and the foam come first: the band and tears appear once the foam has settled, as in a still wine of the same strength.'
    case 'cider':
      return r.predictions.tearsExpected ? 'A still cider shows this like a wine of the same strength; a sparkling one, once its foam has settled.' : null
    default:
      return null
  }
}

/**
 * A few short sentences for a guest, from a computeFilm result. Handles no alcohol, beer's foam,
 * films too short to show (strong spirits in dry or still rooms, very dilute drinks), and the
 * full show with its ranges; sugar, cooling, humid rooms and the comparison of strong pours with a
 * table wine get a sentence when the numbers make them matter.
 */
export function describePour(result: FilmResult, options: DescribeOptions = {}): string[] {
  const unit = options.temperatureUnit ?? 'C'
  const brief = options.brief === true
  const { abvPctVol, tempC, sugarGL } = result.inputs
  const p = result.predictions
  const out: string[] = []
  const at = `At ${abvText(abvPctVol)}\u00a0% ABV and ${tempText(tempC, unit)}`

  if (result.solventMoleFraction === 0) {
    out.push(
      `${at} there is no alcohol to evaporate, so the liquid left on the glass keeps the same surface tension as the rest: expect no climbing film and no tears.`,
      'Any drops that run down after a swirl are simply draining under gravity.',
    )
    out.push(QUALITY_DISCLAIMER)
    return out
  }
  if (p.suppressedBy === 'foam') {
    out.push(
      `${at} evaporation would pull a film up the glass as in wine, but beer's proteins and hop compounds gather at its surface and hold it still, so the film cannot climb: expect rings of foam left on the glass as the level drops, not tears.`,
    )
    out.push(QUALITY_DISCLAIMER)
    return out
  }
  if (!p.tearsExpected || p.tearFallSpeed_mm_s === null) {
    const why = p.suppressedBy === 'held'
      ? `evaporation raises the film's surface tension by only about ${sig2(result.deltaSigma_mN_m)}\u00a0mN/m, too little to move a surface that the drink's own proteins and other surface-active compounds hold still`
      : result.solventAbvPctVol >= 50
        ? 'at this strength the surface tension hardly changes as the film loses ethanol, so evaporation makes little difference between the film and the rest'
        : 'evaporation gives the film too little pull'
    out.push(`${at} ${why}: expect no clear band and no distinct tears.`)
    out.push('Drops after a swirl simply drain back under gravity.')
    if (!brief) out.push(limitsSentence(result, unit))
    out.push(QUALITY_DISCLAIMER)
    return out
  }

  const rg = p.ranges
  const band = rg.clearBandHeight_mm ? rangeText(rg.clearBandHeight_mm, 'mm') : `about ${sig2(p.clearBandHeight_mm)}\u00a0mm`
  const onset = rg.tearOnset_s ? rangeText(rg.tearOnset_s, 's') : `${sig2(p.tearOnset_s ?? 0)}\u00a0s`
  const fall = rg.tearFallSpeed_mm_s ? rangeText(rg.tearFallSpeed_mm_s, 'mm/s') : `${sig2(p.tearFallSpeed_mm_s)}\u00a0mm/s`
  const count = rg.tearsAround ? countText(rg.tearsAround) : String(Math.round(p.tearsAround ?? 0))
  const tears = `${count} around the glass, each about ${sig2(p.tearWidth_mm ?? p.capillaryLength_mm)}\u00a0mm wide, sliding down at ${fall}`
  if (brief) {
    out.push(p.bandVisible
      ? `${at}, swirl: within ${onset} a band ${band} tall climbs the glass, then ${count} tears slide down at ${fall}.`
      : `${at}, swirl: the band stays low, but the swirled film runs down as ${count} legs at ${fall}.`)
  }
  else out.push(p.bandVisible
    ? `${at}, swirl and watch: within ${onset} a clear band ${band} tall forms above the liquid, gathers into a ridge and falls back as tears — ${tears}.`
    : `${at}, swirl and watch: the band of climbing film stays low, inside the curve of the liquid's edge, but the film the swirl leaves on the glass gathers into a ridge and runs down as legs — ${tears}.`)
  const show = rg.swirlShow_s ? rangeText(rg.swirlShow_s, 's') : `${sig2(p.swirlShow_s ?? 0)}\u00a0s`
  if (!brief) {
    out.push(p.bandVisible
      ? `The curtain the swirl leaves drains into tears within ${show}; after that the band keeps making tears for as long as the glass stands still (the pour loses only about ${sig2(p.alcoholLossPer10Min_pct)}\u00a0% of its alcohol every ten minutes).`
      : `The legs keep coming for ${show}, until the swirled film has drained; swirl again to see them again.`)
    out.push(
      `Why: ethanol leaves the thin film faster than water, so the film turns more watery and its surface tension rises from ${result.surfaceTensionBulk_mN_m.toFixed(1)} to about ${result.surfaceTensionFilm_mN_m.toFixed(1)}\u00a0mN/m; the stronger pull draws liquid up from below (the Gibbs–Marangoni effect) until the ridge grows too heavy and falls.`,
    )
    const share = result.deltaSigma_mN_m > 0 ? result.thermalDeltaSigma_mN_m / result.deltaSigma_mN_m : 0
    if (share >= THERMAL_SENTENCE_MIN_SHARE) {
      out.push(`Evaporation also cools the film by about ${tempDiffText(result.filmCooling_K, unit)}, and cooler liquid pulls harder: about ${Math.round(100 * share)}\u00a0% of that pull comes from the cooling.`)
    }
    if (result.waterFlux_kg_m2_s < 0) {
      out.push('In this humid room the film even takes water up from the air while it loses ethanol, which adds to the pull.')
    }
  }
  const compare = tableWineComparison(result, brief)
  if (compare) out.push(compare)
  const unsweet = result.tearFallSpeedUnsweetened_mm_s
  if (sugarGL > 0 && result.sugarViscosityFactor >= SUGAR_SENTENCE_MIN_FACTOR && unsweet !== null && unsweet > 0) {
    const slower = Math.round(100 * (1 - p.tearFallSpeed_mm_s / unsweet))
    out.push(
      `Its ${sig2(sugarGL)}\u00a0g/L of sugar makes it ${sig2(result.sugarViscosityFactor)} times as viscous (${sig2(result.viscosity_mPa_s)}\u00a0mPa·s), so the tears fall about ${slower}\u00a0% slower than they would without it.`,
    )
  }
  const kind = kindSentence(result)
  if (kind) out.push(kind)
  if (!brief) out.push(limitsSentence(result, unit))
  out.push(QUALITY_DISCLAIMER)
  return out
}
