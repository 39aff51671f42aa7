/**
 * The sentences a guest reads after recording a glass: their reading against the model's range and
 * against other people's readings of the same pour. Generated only from compareObservation's result
 * and the numbers, so nothing is said that the numbers do not carry; ranges as the model gives them
 * (two significant figures), never one false-precise value.
 */
import { rangeText } from './science/predictions'
import type { Range } from './science/uncertainty'
import { BAND_READING_ERROR_MM, TEAR_COUNTS, TEAR_COUNT_BINS, TEAR_COUNT_LABELS, TEAR_SPEEDS, TEAR_SPEED_LABELS, TEAR_SPEED_SPANS, type Agreement, type TearCount, type TearSpeed } from './observations'
import type { OthersSeen, PourObservations } from './types/observations'

const AGAINST: Record<Exclude<Agreement, 'not_compared'>, string> = {
  inside: 'within the model’s range',
  above: 'above the model’s range',
  below: 'below the model’s range',
}

const secondsPerCm = (mm_s: number) => 10 / mm_s
/** A predicted speed as a guest times it: seconds per centimetre, to a half second, slow end first. */
function speedAsTime(r: Range): string {
  const half = (s: number) => Math.max(0.5, Math.round(s * 2) / 2)
  const a = half(secondsPerCm(r.high))
  const b = half(secondsPerCm(r.low))
  const f = (s: number) => String(s).replace('.5', '½').replace(/^0½$/, '½')
  return a === b ? `about ${f(a)} s per cm` : `${f(a)}–${f(b)} s per cm`
}

function countRangeText(r: Range): string {
  const lo = Math.max(1, Math.round(r.low))
  const hi = Math.max(lo, Math.round(r.high))
  return lo === hi ? `about ${lo}` : `${lo}–${hi}`
}

/** The band bins that hold the middle half of the readings, as "a–b mm"; null with fewer than 3. */
export function middleHalf(band: OthersSeen['band']): { from: number, to: number } | null {
  const total = band.reduce((n, b) => n + b.count, 0)
  if (total < 3) return null
  let seen = 0
  let from: number | null = null
  let to = 0
  for (const b of band) {
    seen += b.count
    if (from === null && seen > total * 0.25) from = b.fromMm
    if (seen >= total * 0.75) {
      to = b.toMm
      break
    }
  }
  return { from: from ?? band[0]!.fromMm, to }
}

function mostOf<K extends string>(counts: Record<K, number>, keys: readonly K[]): { key: K, n: number, total: number } | null {
  const total = keys.reduce((n, k) => n + counts[k], 0)
  if (!total) return null
  const key = keys.reduce((best, k) => (counts[k] > counts[best] ? k : best), keys[0]!)
  return { key, n: counts[key], total }
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`

/** The guest's reading against the prediction, one sentence per thing they recorded. */
export function ownComparisonLines(view: PourObservations): string[] {
  const { mine, predicted: p } = view
  if (!mine) return []
  const c = mine.comparison
  const out: string[] = []
  const band = p.band ? rangeText(p.band, 'mm') : null
  if (mine.noClearBand) {
    out.push(p.bandVisible && band
      ? `You saw no clear band; the model expected one of ${band}, so your glass showed less than predicted.`
      : 'You saw no clear band, as the model expected for this glass.')
  }
  else if (mine.bandHeightMm !== null) {
    const yours = `Your band: ${mine.bandHeightMm} mm (±${BAND_READING_ERROR_MM} mm by eye)`
    out.push(band && c.band !== 'not_compared' ? `${yours}, ${AGAINST[c.band]} of ${band}.` : `${yours}; the model expected no steady band here, so yours is above what it predicted.`)
  }
  if (c.tears !== 'not_compared') {
    out.push(c.tears === 'agrees'
      ? (p.tearsExpected ? 'You saw tears, as the model expected.' : 'You saw no tears, as the model expected.')
      : (p.tearsExpected ? 'You saw no tears, although the model expected some.' : 'You saw tears where the model expected none.'))
  }
  if (mine.tearSpeed && c.speed !== 'not_compared' && p.speed) {
    out.push(`You timed them ${TEAR_SPEED_LABELS[mine.tearSpeed].toLowerCase()} (${TEAR_SPEED_SPANS[mine.tearSpeed]}): ${AGAINST[c.speed]} of ${rangeText(p.speed, 'mm/s')}, ${speedAsTime(p.speed)}.`)
  }
  if (mine.tearCount && c.count !== 'not_compared' && p.around) {
    out.push(`You counted ${TEAR_COUNT_LABELS[mine.tearCount].toLowerCase()} around the glass: ${AGAINST[c.count]} of ${countRangeText(p.around)}.`)
  }
  return out
}

/** Other people's readings of the same pour, in words, and where the guest's own band sits among them. */
export function othersLines(view: PourObservations): string[] {
  const o = view.others
  if (!o.count) return [view.mine ? 'Yours is the first reading of this pour. Others will see it here, without your name.' : 'Nobody has recorded this pour yet.']
  const out = [`${plural(o.count, 'other reading')} of this pour so far${o.flaggedLeftOut ? ` (${o.flaggedLeftOut} more left out as unlikely)` : ''}.`]
  const mid = middleHalf(o.band)
  if (mid) out.push(`The middle half of their bands stood ${mid.from}–${mid.to} mm high.`)
  if (o.noClearBand) out.push(`${plural(o.noClearBand, 'person', 'people')} saw no clear band.`)
  const mine = view.mine?.bandHeightMm ?? null
  const banded = o.band.reduce((n, b) => n + b.count, 0)
  if (mine !== null && banded >= 3) {
    const lower = o.band.filter(b => b.toMm <= mine).reduce((n, b) => n + b.count, 0)
    const higher = o.band.filter(b => b.fromMm > mine).reduce((n, b) => n + b.count, 0)
    out.push(lower === banded
      ? `Your band stood higher than all ${banded} of their band readings.`
      : higher === banded
        ? `Your band stood lower than all ${banded} of their band readings.`
        : `Your band stood higher than ${lower} and lower than ${higher} of their ${banded} band readings.`)
  }
  const speed = mostOf<TearSpeed>(o.speed, TEAR_SPEEDS)
  if (speed && speed.total >= 2) out.push(`Most often the tears were called ${TEAR_SPEED_LABELS[speed.key].toLowerCase()} (${speed.n} of ${speed.total}).`)
  const around = mostOf<TearCount>(o.around, TEAR_COUNTS)
  if (around && around.total >= 2) {
    const bin = TEAR_COUNT_BINS[around.key]
    out.push(`The count most often given was ${bin.max === null ? `over ${bin.min - 1}` : `${bin.min}–${bin.max}`} tears (${around.n} of ${around.total}).`)
  }
  return out
}
