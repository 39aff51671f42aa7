import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { computeFilm } from '../../shared/science'
import {
  FLAG_BAND_MAX_MM, FLAG_BAND_OVER_PREDICTED_FACTOR, FLAG_MINUTES_MAX, FLAG_VERY_SWEET_G_L, compareObservation, guestObservationSchema, observationFieldsSchema, observationFlags, sessionTie,
  type FlagInput, type FlagPrediction,
} from '../../shared/observations'
import { answers, leadingZeroBits, solveChallenge } from '../../shared/observationChallenge'
import { middleHalf, othersLines, ownComparisonLines } from '../../shared/observationWords'
import type { PourObservations } from '../../shared/types/observations'

/** A prediction with a band of 6–11 mm and steady-to-slow tears of 3–5 mm/s, 20–30 around. */
const banded: FlagPrediction = {
  tearsExpected: true,
  bandVisible: true,
  suppressedBy: null,
  ranges: { clearBandHeight_mm: { low: 6, high: 11 }, tearFallSpeed_mm_s: { low: 3, high: 5 }, tearsAround: { low: 20, high: 30 } },
}
const seen = (over: Partial<FlagInput> = {}): FlagInput => ({ bandHeightMm: 8, noClearBand: false, tearsFormed: 'yes', tearCount: '16_to_30', tearSpeed: 'steady', minutesSince: 5, residualSugarGL: 3, session: 'matched', ...over })

describe('observationFlags: implausible values are kept and say why', () => {
  it('a plausible glass has no flag', () => {
    expect(observationFlags(seen(), banded)).toEqual([])
  })
  it.each([
    ['a band over 4× the predicted high end (44 mm), under 50 mm', seen({ bandHeightMm: FLAG_BAND_OVER_PREDICTED_FACTOR * 11 + 1 }), ['band_far_above_prediction']],
    ['a band over FLAG_BAND_MAX_MM even where the range is wide', seen({ bandHeightMm: FLAG_BAND_MAX_MM + 1 }), ['band_far_above_prediction', 'band_over_50_mm']],
    ['a band with "tears: no"', seen({ tearsFormed: 'no', tearCount: null, tearSpeed: null }), ['band_without_tears']],
    ['minutes over FLAG_MINUTES_MAX', seen({ minutesSince: FLAG_MINUTES_MAX + 1 }), ['read_after_two_hours']],
    ['a card of another flight', seen({ session: 'other_flight' }), ['session_not_this_flight']],
    ['a card of a session not on now', seen({ session: 'not_now' }), ['session_not_now']],
  ] as const)('%s', (_what, input, flags) => {
    expect(observationFlags(input, banded)).toEqual(flags)
  })
  it('exactly 4× the high end and exactly 120 minutes are not flagged (the bounds are strict)', () => {
    expect(observationFlags(seen({ bandHeightMm: 44, minutesSince: FLAG_MINUTES_MAX }), banded)).toEqual([])
  })
  it('tears reported for a beer whose foam holds the surface', () => {
    const beer = computeFilm({ abvPctVol: 8, tempC: 8, sugarGL: 10, kind: 'beer' }).predictions
    expect(beer.suppressedBy).toBe('foam')
    expect(observationFlags(seen({ bandHeightMm: null }), beer)).toContain('tears_under_foam')
    expect(observationFlags(seen({ bandHeightMm: null, tearsFormed: 'no', tearCount: null, tearSpeed: null }), beer)).toEqual([])
  })
  it('fast tears from a very sweet pour whose predicted speed stays below the fast bin', () => {
    const port = computeFilm({ abvPctVol: 20, tempC: 16, sugarGL: 110 }).predictions
    expect(port.ranges.tearFallSpeed_mm_s!.high).toBeLessThan(20 / 3)
    expect(observationFlags(seen({ tearSpeed: 'fast', residualSugarGL: 110, bandHeightMm: null }), port)).toContain('fast_tears_very_sweet')
    expect(observationFlags(seen({ tearSpeed: 'fast', residualSugarGL: FLAG_VERY_SWEET_G_L - 1, bandHeightMm: null }), port)).not.toContain('fast_tears_very_sweet')
  })
})

describe('sessionTie: from 2 h before the start to 6 h after the end', () => {
  const start = new Date('2026-12-05T19:00:00Z')
  const s = { flightId: 3, startsAt: start, durationMinutes: 75, status: 'open' }
  const at = (minutes: number) => new Date(start.getTime() + minutes * 60_000)
  it.each([
    [-121, 'not_now'], [-119, 'matched'], [75 + 359, 'matched'], [75 + 361, 'not_now'],
  ] as const)('%i minutes from the start → %s', (m, tie) => {
    expect(sessionTie(s, 3, at(m))).toBe(tie)
  })
  it('another flight, a cancelled session, and none', () => {
    expect(sessionTie(s, 4, at(10))).toBe('other_flight')
    expect(sessionTie({ ...s, status: 'cancelled' }, 3, at(10))).toBe('not_now')
    expect(sessionTie(null, 3, at(10))).toBe('none')
  })
})

describe('the shared schema', () => {
  it('takes a sound glass and fills the optional fields', () => {
    expect(observationFieldsSchema.parse({ tearsFormed: 'unsure', minutesSince: 0, since: 'pour' })).toEqual({ bandHeightMm: null, noClearBand: false, tearsFormed: 'unsure', tearCount: null, tearSpeed: null, minutesSince: 0, since: 'pour' })
  })
  it('rounds a band to a tenth of a millimetre (finer is not read by eye)', () => {
    expect(observationFieldsSchema.parse({ bandHeightMm: 7.26, tearsFormed: 'yes', minutesSince: 3, since: 'swirl' }).bandHeightMm).toBe(7.3)
  })
  it('names every bad field at once in a guest\'s body', () => {
    const r = guestObservationSchema.safeParse({ flightId: 0, position: 9, bandHeightMm: -1, tearsFormed: 'maybe', minutesSince: 999, since: 'swirl', website: 'x' })
    expect(r.success).toBe(false)
    const paths = new Set(r.error!.issues.map(i => i.path.join('.')))
    for (const p of ['flightId', 'position', 'bandHeightMm', 'tearsFormed', 'minutesSince', 'challenge', 'website']) expect(paths).toContain(p)
  })
})

describe('the bot check', () => {
  it('counts leading zero bits', () => {
    expect(leadingZeroBits(new Uint8Array([0, 0, 0x80]))).toBe(16)
    expect(leadingZeroBits(new Uint8Array([0, 0x01]))).toBe(15)
    expect(leadingZeroBits(new Uint8Array([0xff]))).toBe(0)
  })
  it('finds the answer the server checks with one hash, and a wrong counter fails', async () => {
    const counter = await solveChallenge('unit-token', 10)
    expect(await answers('unit-token', counter, 10)).toBe(true)
    expect(leadingZeroBits(createHash('sha256').update(`unit-token:${counter}`).digest())).toBeGreaterThanOrEqual(10)
    // The smallest answer: every counter before it fails.
    for (let c = 0; c < counter; c++) expect(await answers('unit-token', c, 10)).toBe(false)
  })
})

describe('the words after submitting', () => {
  const view = (over: Partial<PourObservations> = {}): PourObservations => ({
    flightId: 1,
    position: 1,
    pourName: 'Unit Red',
    sessionId: 5,
    predicted: { tearsExpected: true, bandVisible: true, suppressedBy: null, band: { low: 6, high: 11 }, speed: { low: 3, high: 5 }, around: { low: 20, high: 30 }, room: { relativeHumidityPct: 50, airTempC: 21, source: 'venue' } },
    others: { count: 5, flaggedLeftOut: 1, band: [{ fromMm: 4, toMm: 6, count: 1 }, { fromMm: 6, toMm: 8, count: 2 }, { fromMm: 10, toMm: 12, count: 2 }], noClearBand: 0, bandNotRead: 0, tears: { yes: 5, no: 0, unsure: 0 }, speed: { slow: 1, steady: 3, fast: 1 }, around: { 'up_to_5': 0, '6_to_15': 1, '16_to_30': 4, 'over_30': 0 } },
    mine: { bandHeightMm: 13, noClearBand: false, tearsFormed: 'yes', tearCount: '16_to_30', tearSpeed: 'slow', minutesSince: 3, since: 'swirl', recordedAt: '2026-12-05T19:30:00Z', flags: [], comparison: compareObservation({ bandHeightMm: 13, noClearBand: false, tearsFormed: 'yes', tearCount: '16_to_30', tearSpeed: 'slow' }, { tearsExpected: true, bandVisible: true, ranges: { clearBandHeight_mm: { low: 6, high: 11 }, tearFallSpeed_mm_s: { low: 3, high: 5 }, tearsAround: { low: 20, high: 30 } } }) },
    entriesLeft: 2,
    ...over,
  })
  it('say where the guest\'s reading fell, with the model\'s range and the reading\'s own error', () => {
    expect(ownComparisonLines(view())).toEqual([
      'Your band: 13 mm (±1 mm by eye), above the model’s range of 6–11\u00a0mm.',
      'You saw tears, as the model expected.',
      // 10 mm / 3–5 mm/s = 2–3.3 s per cm, to a half second.
      'You timed them slow (3 s or more per cm): within the model’s range of 3–5\u00a0mm/s, 2–3½ s per cm.',
      'You counted many (16–30) around the glass: within the model’s range of 20–30.',
    ])
  })
  it('sum up the others in bins, and where the guest\'s band sits among them', () => {
    expect(othersLines(view())).toEqual([
      '5 other readings of this pour so far (1 more left out as unlikely).',
      'The middle half of their bands stood 6–12 mm high.',
      'Your band stood higher than all 5 of their band readings.',
      'Most often the tears were called steady (3 of 5).',
      'The count most often given was 16–30 tears (4 of 5).',
    ])
    expect(othersLines(view({ mine: { ...view().mine!, bandHeightMm: 7 } }))[2]).toBe('Your band stood higher than 1 and lower than 2 of their 5 band readings.')
    expect(othersLines(view({ others: { ...view().others, count: 0, flaggedLeftOut: 0, band: [] } }))).toEqual(['Yours is the first reading of this pour. Others will see it here, without your name.'])
  })
  it('give no middle half for fewer than 3 band readings (no false precision)', () => {
    expect(middleHalf([{ fromMm: 6, toMm: 8, count: 2 }])).toBeNull()
  })
})
