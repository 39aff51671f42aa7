import { describe, expect, it } from 'vitest'
import { calibrationCardLine, calibrationSentence, pickAppliedGroup } from '../../shared/calibrationText'
import { ENTRIES_PER_DEVICE_POUR_SESSION } from '../../shared/observations'
import type { AppliedCalibration, CalibrationResult, FitObservation, GroupCalibration } from '../../shared/science/calibration'
import { pourFacts } from '../../server/utils/pours'
import { appliedSince } from '../../server/utils/observationAnalysis'
import type { FitRow } from '../../server/utils/calibration'
import { planSeason, planSeasonSessions, type SeasonPour } from '../../server/demo/season'
import { DEMO_VENUE } from '../../server/demo/data'

const group = (over: Partial<GroupCalibration>): GroupCalibration => ({
  glassKey: '7', roomKey: null, observations: 40, devices: 30, entries: 40, correlation: 0, fit: { bandScatter: 0.1, speedScoreZ: 0 },
  parameters: { exchangeFactor: 1.4, massTransferFactor: 0.9 },
  intervals: { exchangeFactor: [1.2, 1.6], massTransferFactor: [0.8, 1] },
  sdLn: { exchangeFactor: 0.1, massTransferFactor: 0.08 },
  status: 'applied',
  ...over,
})
const applied = (observations: number): AppliedCalibration => ({ parameters: { exchangeFactor: 1.4, massTransferFactor: 0.9 }, sdLn: { exchangeFactor: 0.1, massTransferFactor: 0.08 }, observations })

describe('which calibration a glass uses', () => {
  it('takes the glass in this room when it applies, else the glass over every room, else none', () => {
    const inRoom = group({ roomKey: '1', observations: 25, parameters: { exchangeFactor: 1.2, massTransferFactor: 1 } })
    const overall = group({})
    expect(pickAppliedGroup([overall, inRoom], '7', '1')?.observations).toBe(25)
    expect(pickAppliedGroup([overall, { ...inRoom, status: 'too_few' }], '7', '1')?.observations).toBe(40)
    expect(pickAppliedGroup([{ ...overall, status: 'does_not_fit' }, { ...inRoom, status: 'too_few' }], '7', '1')).toBeNull()
    expect(pickAppliedGroup([overall], '8', '1')).toBeNull()
    expect(pickAppliedGroup([overall], '7', '2')).toEqual({ parameters: overall.parameters, sdLn: overall.sdLn, correlation: 0, observations: 40 })
  })
})

describe('what the guest is told', () => {
  it('says nothing on the defaults and gives the number of readings when tuned', () => {
    expect(calibrationSentence(null)).toBeNull()
    expect(calibrationSentence(applied(84))).toMatch(/tuned to this glass by 84 readings/)
    expect(calibrationSentence(applied(1))).toMatch(/by 1 reading that/)
  })
  it('puts one line on the card, grouping pours by their glass (two glasses with as many readings stay apart)', () => {
    expect(calibrationCardLine([{ position: 1, glass: 'Flute', calibration: null }, { position: 2, glass: 'Flute', calibration: null }])).toBeNull()
    expect(calibrationCardLine([{ position: 1, glass: 'Flute', calibration: null }, { position: 3, glass: 'Tulip', calibration: applied(84) }, { position: 4, glass: 'Tulip', calibration: applied(84) }]))
      .toBe('Tuned here: figures for pours 3 and 4 rest on 84 readings of their glass taken at this venue.')
    expect(calibrationCardLine([{ position: 2, glass: 'Flute', calibration: applied(40) }, { position: 5, glass: 'Nosing', calibration: applied(40) }]))
      .toBe('Tuned here, from readings of each glass taken at this venue: pour 2 (40 readings), pour 5 (40 readings).')
  })
})

describe('the prediction memo', () => {
  it('keys on the calibration, so a glass that becomes calibrated is not served its cached defaults', () => {
    const pour = { abvPctVol: 12.5, residualSugarGL: 2, servingTempC: 10, volumeMl: 60, wallAngleDeg: 78, bowlDiameterMm: 84, kind: 'still' as const }
    const room = { relativeHumidityPct: 62, airTempC: 20.5 }
    const venue = { standardDrinkGrams: 14 }
    expect(pourFacts(pour, venue, room).film.calibration).toBeNull()
    expect(pourFacts({ ...pour, calibration: applied(84) }, venue, room).film.calibration?.observations).toBe(84)
    expect(pourFacts({ ...pour, calibration: applied(85) }, venue, room).film.calibration?.observations).toBe(85)
    expect(pourFacts({ ...pour, calibration: null }, venue, room).film.calibration).toBeNull()
  })
})

describe('when cards started to use a calibration', () => {
  it('is the time of the observation with which a fit first applies', () => {
    const rows: FitRow[] = Array.from({ length: 40 }, (_, i) => ({
      row: { id: i + 1, recordedAt: new Date(Date.UTC(2026, 8, 1 + i)), flags: i === 3 ? ['band_without_tears'] : [] },
      fit: { glassKey: '7', roomKey: '1' } as FitObservation,
    }) as unknown as FitRow)
    // A stand-in fit that applies from 20 readings on (the real method is the science side's).
    const fit = (list: FitObservation[]): CalibrationResult => ({ groups: [group({ observations: list.length, status: list.length >= 20 ? 'applied' : 'too_few' })], modelRuns: 0 })
    const since = appliedSince(rows, fit(rows.filter(r => r.row.flags.length === 0).map(r => r.fit)), fit)
    // The 20th unflagged reading is row 21 (row 4 is flagged and left out): 2026-09-21.
    expect(since.get('7|')).toBe('2026-09-21T00:00:00.000Z')
  })
})

describe('the demo season', () => {
  const pours: SeasonPour[] = [
    ['Stemless tasting tumbler', 6.2, 4, 8, 'cider', 90, 80, 70],
    ['Flute', 11.8, 8, 7, 'sparkling', 60, 85, 52],
    ['Tulip wine glass', 12.5, 2.1, 10, 'still', 60, 78, 84],
    ['Tulip wine glass', 13.6, 1.5, 16, 'still', 60, 78, 84],
    ['Nosing glass', 19.5, 98, 16, 'fortified', 45, 70, 62],
    ['Nosing glass', 43, 0, 18, 'spirit', 15, 70, 62],
  ].map(([glassName, abvPctVol, residualSugarGL, servingTempC, kind, volumeMl, wallAngleDeg, bowlDiameterMm], i) => ({
    flightPourId: i + 1, productId: i + 1, measurementId: i + 1, glassId: i + 1, glassName, abvPctVol, residualSugarGL, servingTempC, kind, volumeMl, wallAngleDeg, bowlDiameterMm,
  }) as SeasonPour)
  const now = new Date('2026-12-02T15:00:00Z')
  const sessions = planSeasonSessions(now, DEMO_VENUE.timeZone)
  const season = planSeason(sessions, pours)

  it('is the same season on every start', () => {
    expect(planSeason(planSeasonSessions(now, DEMO_VENUE.timeZone), pours)).toEqual(season)
  })
  it('covers about three months of past sessions', () => {
    expect(sessions.length).toBeGreaterThanOrEqual(17)
    expect(sessions.every(s => s.startsAt < now)).toBe(true)
    expect(now.getTime() - sessions[0]!.startsAt.getTime()).toBeLessThan(95 * 86_400_000)
    expect(season.every(o => o.recordedAt < now)).toBe(true)
  })
  it('reads the tulip often and the flute hardly at all, flags a few and has one flooding device', () => {
    const by = (name: string) => season.filter(o => o.pour.glassName === name && !o.flags.length).length
    expect(by('Tulip wine glass')).toBeGreaterThan(120)
    expect(by('Flute')).toBeLessThanOrEqual(4)
    // Six invented implausible readings (a tall band with no tears), and the flood's far-off band on the gin,
    // each flagged by the routes' own rules (observationFlags).
    const flagged = season.filter(o => o.flags.length)
    expect(flagged.filter(o => o.flags.includes('band_without_tears'))).toHaveLength(6)
    const perDevice = new Map<string, number>()
    for (const o of season) if (o.deviceKey) perDevice.set(o.deviceKey, (perDevice.get(o.deviceKey) ?? 0) + 1)
    expect([...perDevice.values()].filter(n => n > 1)).toEqual([ENTRIES_PER_DEVICE_POUR_SESSION])
    expect(season.filter(o => o.source === 'host').every(o => o.deviceKey === null && o.roomSource === 'host')).toBe(true)
  })
})
