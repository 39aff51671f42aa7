/**
 * The glass model's predictions as the figures a guest reads beside the text: each one a range
 * (the model's 10th–90th percentiles, printed with describePour's own rangeText), with the room the
 * numbers assume. Pages and the builder read these, so the figures say what describePour says.
 */
import { INDEX_REFERENCE } from './science/activityIndex'
import { DEFAULT_ROOM_AIR, type RoomAir, type TearPrediction } from './science/glassModel'
import { rangeText } from './science/predictions'
import type { Range } from './science/uncertainty'
import { formatTemperature } from './pours'

/** One figure: what it is and its range in words ("5.4–16 mm"). */
export interface TearFigure {
  key: 'band' | 'onset' | 'around' | 'speed' | 'show'
  label: string
  value: string
}

/** A count as describePour prints it: whole numbers, at least 1 ("25–27", "about 26"). */
function countRangeText(r: Range): string {
  const lo = Math.max(1, Math.round(r.low))
  const hi = Math.max(lo, Math.round(r.high))
  return lo === hi ? `about ${lo}` : `${lo}–${hi}`
}

/**
 * The predicted ranges a guest can check in the glass, in the order they happen after a swirl.
 * Empty when no tears are expected (the reason is tearSummary's). A band that stays inside the
 * meniscus is named so (describePour says it in words: it "stays low"), and the swirl's legs take
 * the tears' place; they start as the swirl drains, so no onset is given for them, as in the text.
 */
/** What the tear figures and their summary read of a prediction. */
export type FigurePrediction = Pick<TearPrediction, 'tearsExpected' | 'bandVisible' | 'suppressedBy' | 'climbFlux_mm2_s'> & {
  ranges: Omit<TearPrediction['ranges'], 'filmThickness_um'>
}

export function tearFigures(p: Pick<FigurePrediction, 'tearsExpected' | 'bandVisible' | 'ranges'>): TearFigure[] {
  if (!p.tearsExpected) return []
  const r = p.ranges
  const band = p.bandVisible
  const out: TearFigure[] = []
  if (r.clearBandHeight_mm) out.push({ key: 'band', label: band ? 'Clear band above the liquid' : 'Band (stays low, inside the liquid\'s curve)', value: rangeText(r.clearBandHeight_mm, 'mm') })
  if (r.tearOnset_s && band) out.push({ key: 'onset', label: 'First tears after a swirl', value: `within ${rangeText(r.tearOnset_s, 's')}` })
  if (r.tearsAround) out.push({ key: 'around', label: band ? 'Tears around the glass' : 'Legs around the glass', value: countRangeText(r.tearsAround) })
  if (r.tearFallSpeed_mm_s) out.push({ key: 'speed', label: band ? 'Tears slide down at' : 'Legs slide down at', value: rangeText(r.tearFallSpeed_mm_s, 'mm/s') })
  if (r.swirlShow_s) out.push({ key: 'show', label: band ? 'The swirl\'s curtain turns to tears' : 'Legs keep coming', value: `${band ? 'within' : 'for'} ${rangeText(r.swirlShow_s, 's')}` })
  return out
}

/** A few words on what the glass shows, for a list or a card (agrees with tearFigures and the diagram). */
export function tearSummary(p: Pick<TearPrediction, 'tearsExpected' | 'bandVisible' | 'suppressedBy' | 'climbFlux_mm2_s'>): string {
  if (p.tearsExpected) return p.bandVisible ? 'A clear band, then tears' : 'A low band; legs run down from the swirl'
  if (p.suppressedBy === 'foam') return 'Foam rings, no tears'
  if (p.suppressedBy === 'held') return 'The surface holds still: no distinct tears'
  return p.climbFlux_mm2_s > 0 ? 'Too little pull for distinct tears' : 'No climbing film, no tears'
}

/** "50 % humidity and 21 °C": a room's air in the venue's temperature unit (rounded as describePour rounds it). */
export function roomAirText(room: RoomAir, temperatureUnit: 'c' | 'f'): string {
  return `${Math.round(room.relativeHumidityPct)}\u00a0% humidity and ${formatTemperature(room.airTempC, temperatureUnit).replace(' ', '\u00a0')}`
}

/** "a clean glass in still air at 50 % humidity and 21 °C": what the figures assume, as describePour says it. */
export function roomText(room: RoomAir, temperatureUnit: 'c' | 'f'): string {
  return `a clean glass in still air at ${roomAirText(room, temperatureUnit)}`
}

/** The index as a range of the 0–10 scale ("6.5–9.2"), or its value to a tenth when no range is known. */
export function indexText(value: number, range?: Range | null): string {
  return range ? rangeText(range, '') : value.toFixed(1)
}

/** What the index measures, in a guest's words, the anchor's temperature in the venue's unit (INDEX_REFERENCE). */
export function indexMeaning(temperatureUnit: 'c' | 'f'): string {
  const at = formatTemperature(INDEX_REFERENCE.tempC, temperatureUnit).replace(' ', '\u00a0')
  return `How much liquid the climbing film carries up the glass each second, on a scale where 10 is the most that any mix of water and alcohol carries (about ${Math.round(INDEX_REFERENCE.abvPctVol)}\u00a0% ABV at ${at}, in a room at ${roomAirText(DEFAULT_ROOM_AIR, temperatureUnit)}).`
}
