/**
 * What sets each pour apart from the others in its flight, in plain words, from the glass model's
 * numbers: the highest climb, the first to show tears, the slowest tears, the one whose sugar slows
 * everything, the one whose foam holds still. Each claim names the prediction's range, and a claim
 * is made only when the central values put the pour first; where another pour's range reaches
 * the winner's central value, the sentence says that the two may look alike. Pure: the card
 * (shared/cards.ts) and any page may call it with the flight's results.
 */
import { rangeText, type FilmResult, type Range } from './science'

/** One pour as the comparison needs it. */
export interface ContrastPour { position: number, film: FilmResult }

/** What a pour is singled out for (one per pour at most, each claim given to one pour). */
export type ContrastClaim
  = | 'foam' | 'still' | 'sugar' | 'highest' | 'first' | 'slowest' | 'fastest' | 'lowest' | 'last' | 'swirl' | 'rank'

export interface PourContrast {
  position: number
  claim: ContrastClaim
  /** One or two sentences, every number from the pour's own result. */
  text: string
  /** A second lead the same pour holds, said after the first ("It also has the slowest tears, …"). */
  also?: string
}

/** The second leads a pour may add to its first, in a short sentence with the range. */
const ALSO: Partial<Record<ContrastClaim, (f: FilmResult) => string>> = {
  slowest: f => `Also the slowest tears, at ${rangeOr(f.predictions.ranges.tearFallSpeed_mm_s, f.predictions.tearFallSpeed_mm_s, 'mm/s')}.`,
  fastest: f => `Also the fastest tears, at ${rangeOr(f.predictions.ranges.tearFallSpeed_mm_s, f.predictions.tearFallSpeed_mm_s, 'mm/s')}.`,
  first: f => `Also the first to show tears, ${rangeOr(f.predictions.ranges.tearOnset_s, f.predictions.tearOnset_s, 's')} after a swirl.`,
  lowest: f => `Also the lowest band, ${rangeOr(f.predictions.ranges.clearBandHeight_mm, f.predictions.clearBandHeight_mm, 'mm')}.`,
}

/** A sugar viscosity factor from which sugar is worth singling out (tears 10 % slower or more). */
const SUGAR_CLAIM_MIN_FACTOR = 1.1

/** Claims tried in this order: the rare and visible ones first, the rankings after. */
const ORDER: readonly ContrastClaim[] = ['foam', 'still', 'sugar', 'highest', 'first', 'slowest', 'fastest', 'lowest', 'last', 'swirl']

const ORDINALS = ['', 'first', 'second', 'third', 'fourth', 'fifth', 'sixth', 'seventh', 'eighth', 'ninth', 'tenth', 'eleventh', 'twelfth']
const COUNT_WORDS = ['', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten', 'eleven', 'twelve']
const capital = (w: string) => w.charAt(0).toUpperCase() + w.slice(1)
const ordinal = (n: number) => ORDINALS[n] ?? `${n}th`
const countWord = (n: number) => COUNT_WORDS[n] ?? String(n)

/** A pour shows tears and a band standing clear of the liquid's curved edge. */
const banded = (f: FilmResult) => f.predictions.tearsExpected && f.predictions.bandVisible
const runs = (f: FilmResult) => f.predictions.tearsExpected && f.predictions.tearFallSpeed_mm_s !== null

interface Figure {
  /** The central value compared. */
  value: (f: FilmResult) => number | null
  range: (f: FilmResult) => Range | null
}
const BAND: Figure = { value: f => (banded(f) ? f.predictions.clearBandHeight_mm : null), range: f => f.predictions.ranges.clearBandHeight_mm }
const ONSET: Figure = { value: f => (runs(f) ? f.predictions.tearOnset_s : null), range: f => f.predictions.ranges.tearOnset_s }
const SPEED: Figure = { value: f => (runs(f) ? f.predictions.tearFallSpeed_mm_s : null), range: f => f.predictions.ranges.tearFallSpeed_mm_s }

const rangeOr = (r: Range | null, central: number | null, unit: string) =>
  r ? rangeText(r, unit) : central === null ? '' : rangeText({ low: central, high: central }, unit)

/**
 * The pour with the largest (sign +1) or smallest (−1) central value of a figure among those
 * that have one, and the other pours whose range reaches the winner's central value.
 */
function leader(pours: readonly ContrastPour[], fig: Figure, sign: 1 | -1): { winner: ContrastPour, rivals: ContrastPour[] } | null {
  const withValue = pours.filter(p => fig.value(p.film) !== null)
  if (withValue.length < 2) return null
  const sorted = [...withValue].sort((a, b) => sign * (fig.value(b.film)! - fig.value(a.film)!))
  const winner = sorted[0]!
  const v = fig.value(winner.film)!
  const rivals = sorted.slice(1).filter((p) => {
    const r = fig.range(p.film)
    return r !== null && r.low <= v && v <= r.high
  })
  return { winner, rivals }
}

/** " (pours 2 and 3 may match it)": their ranges reach its central value; or nothing. */
function overlapNote(rivals: ContrastPour[]): string {
  if (!rivals.length) return ''
  const names = rivals.slice(0, 2).map(r => r.position).sort((a, b) => a - b)
  return names.length === 1
    ? ` (pour\u00a0${names[0]} may match it)`
    : ` (pours\u00a0${names[0]} and\u00a0${names[1]} may match it)`
}

function sentence(claim: ContrastClaim, pour: ContrastPour, rivals: ContrastPour[]): string {
  const f = pour.film
  const p = f.predictions
  const band = rangeOr(p.ranges.clearBandHeight_mm, p.clearBandHeight_mm, 'mm')
  const onset = rangeOr(p.ranges.tearOnset_s, p.tearOnset_s, 's')
  const speed = rangeOr(p.ranges.tearFallSpeed_mm_s, p.tearFallSpeed_mm_s, 'mm/s')
  const more = overlapNote(rivals)
  switch (claim) {
    case 'foam':
      return 'Its foam holds the surface still: look for rings of foam on the glass as the level drops, not tears.'
    case 'still':
      return 'Too little pull to climb: no clear band and no distinct tears in this glass, only drops draining back.'
    case 'sugar': {
      const unsweet = f.tearFallSpeedUnsweetened_mm_s
      const slower = unsweet && p.tearFallSpeed_mm_s !== null ? Math.round(100 * (1 - p.tearFallSpeed_mm_s / unsweet)) : null
      const sugar = rangeText({ low: f.inputs.sugarGL, high: f.inputs.sugarGL }, 'g/L').replace(/^about /, '')
      const times = rangeText({ low: f.sugarViscosityFactor, high: f.sugarViscosityFactor }, '').replace(/^about /, '')
      return `Its ${sugar} of sugar slows everything: ${times} times as viscous, tears ${slower !== null && slower > 0 ? `about ${slower}\u00a0% slower (${speed})` : `at ${speed}`}.`
    }
    case 'highest':
      return `Highest climb of the flight: a clear band of ${band}${more}.`
    case 'lowest':
      return `Lowest band of the flight: ${band}, close to the liquid's curved edge${more}.`
    case 'first':
      return `First to show tears: ${onset} after a swirl${more}.`
    case 'last':
      return `Last to show tears: give it ${onset} after a swirl${more}.`
    case 'slowest':
      return `Slowest tears of the flight: ${speed}${more}.`
    case 'fastest':
      return `Fastest tears of the flight: ${speed}${more}.`
    case 'swirl':
      return 'Its band stays inside the liquid\'s curved edge: swirl, and watch legs run down from the swirl line.'
    default:
      return ''
  }
}

/** Whether the pour can carry the claim on its own numbers (before comparing with the others). */
function qualifies(claim: ContrastClaim, f: FilmResult): boolean {
  const p = f.predictions
  switch (claim) {
    case 'foam': return p.suppressedBy === 'foam'
    case 'still': return !p.tearsExpected && p.suppressedBy !== 'foam'
    case 'sugar': return f.sugarViscosityFactor >= SUGAR_CLAIM_MIN_FACTOR && runs(f)
    case 'swirl': return p.tearsExpected && !p.bandVisible
    default: return true
  }
}

/**
 * Each pour's distinctive line within its flight. Claims are handed out in ORDER, each to one pour
 * and each pour at most one; a pour left without one is placed by its band's height ("the third
 * highest band of six"), or, with no band, by what it does show. A flight of one pour has no
 * contrast to draw: its pour gets no line.
 */
export function flightContrasts(pours: readonly ContrastPour[]): PourContrast[] {
  if (pours.length < 2) return []
  const given = new Map<number, PourContrast>()
  const free = () => pours.filter(p => !given.has(p.position))
  for (const claim of ORDER) {
    if (given.size === pours.length) break
    let pick: { winner: ContrastPour, rivals: ContrastPour[] } | null = null
    if (claim === 'foam' || claim === 'still' || claim === 'swirl') {
      for (const p of free().filter(x => qualifies(claim, x.film))) given.set(p.position, { position: p.position, claim, text: sentence(claim, p, []) })
      continue
    }
    if (claim === 'sugar') {
      const sweet = free().filter(x => qualifies('sugar', x.film)).sort((a, b) => b.film.sugarViscosityFactor - a.film.sugarViscosityFactor)[0]
      if (sweet) pick = { winner: sweet, rivals: [] }
    }
    else {
      const fig = claim === 'highest' || claim === 'lowest' ? BAND : claim === 'first' || claim === 'last' ? ONSET : SPEED
      const sign = claim === 'highest' || claim === 'last' || claim === 'fastest' ? 1 : -1
      // The leader among all pours: a claim the pour does not hold over the whole flight is not made.
      pick = leader(pours, fig, sign)
    }
    if (!pick) continue
    const had = given.get(pick.winner.position)
    if (!had) given.set(pick.winner.position, { position: pick.winner.position, claim, text: sentence(claim, pick.winner, pick.rivals) })
    else if (had.claim !== 'rank' && !had.also && ALSO[claim]) had.also = ALSO[claim]!(pick.winner.film)
  }
  // The rest: their band's place in the flight, by central height.
  const bandOrder = pours.filter(p => BAND.value(p.film) !== null).sort((a, b) => BAND.value(b.film)! - BAND.value(a.film)!)
  for (const p of free()) {
    const place = bandOrder.findIndex(x => x.position === p.position) + 1
    const band = rangeOr(p.film.predictions.ranges.clearBandHeight_mm, p.film.predictions.clearBandHeight_mm, 'mm')
    const text = place > 0
      ? `${capital(ordinal(place))}-highest band of the ${countWord(bandOrder.length)}: ${band}.`
      : sentence(qualifies('swirl', p.film) ? 'swirl' : 'still', p, [])
    given.set(p.position, { position: p.position, claim: 'rank', text })
  }
  return pours.map(p => given.get(p.position)!)
}
