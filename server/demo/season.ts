/**
 * The demo's season of invented observations: the last ~3 months of weekly sessions of its published
 * flight, with what guests and hosts "saw". Every reading is made from the glass model itself run
 * with chosen "true" multipliers per glass (DEMO_TRUE_PARAMETERS), plus reading noise, a few
 * implausible entries and one device that floods a pour — so the manager's chart has scatter to
 * show and the calibration has something to find. Deterministic: one seed, no clock but `now`.
 */
import { DateTime } from 'luxon'
import { computeFilm, normalDraw, seededRandom, type DrinkKind, type RoomAir } from '../../shared/science'
import type { ModelParameters } from '../../shared/science/calibration'
import { ENTRIES_PER_DEVICE_POUR_SESSION, TEAR_COUNT_BINS, TEAR_COUNTS, TEAR_SPEED_BINS_MM_S, TEAR_SPEEDS, observationFlags, type ObservationFlag, type TearCount, type TearSpeed, type TearsFormed } from '../../shared/observations'
import { holidayOn } from './holidays'

const DEMO_SEASON_SEED = 20_260_902

/**
 * What the demo pretends each glass "really" does, against the published defaults (1 = published):
 * the tulip is seen often and drifts clearly; the flute is seen so rarely that it must stay at the
 * defaults; the others sit near the published values.
 */
const DEMO_TRUE_PARAMETERS: Record<string, ModelParameters> = {
  'Tulip wine glass': { exchangeFactor: 1.5, massTransferFactor: 0.85 },
  'Nosing glass': { exchangeFactor: 0.85, massTransferFactor: 1.1 },
  'Stemless tasting tumbler': { exchangeFactor: 1.05, massTransferFactor: 1 },
  'Flute': { exchangeFactor: 1.3, massTransferFactor: 1 },
}

/** Guests who record something, per pour and session, by glass (min–max); the flute's foam keeps most away. */
const READERS: Record<string, [number, number]> = {
  'Tulip wine glass': [3, 5],
  'Nosing glass': [1, 3],
  'Stemless tasting tumbler': [2, 3],
  'Flute': [0, 0],
}
/** Sessions (by index from the oldest) in which one guest did read the flute. */
const FLUTE_SESSIONS = new Set([2, 9, 15])

/** The room as the host read it: three readings, so the model runs for few distinct rooms (each run is ~13 ms). */
const ROOM_READINGS: RoomAir[] = [
  { relativeHumidityPct: 58, airTempC: 20.5 },
  { relativeHumidityPct: 64, airTempC: 21.5 },
  { relativeHumidityPct: 70, airTempC: 22 },
]

/** Past weekly sessions: Saturdays 14:00 for 13 weeks, Fridays 18:30 for the last 6. */
const PAST_SERIES = [
  { weekday: 6, startTime: '14:00', weeks: 13, durationMinutes: 75, seats: 12, priceMinor: 3500 },
  { weekday: 5, startTime: '18:30', weeks: 6, durationMinutes: 60, seats: 8, priceMinor: 3000 },
]

/** Reading noise (estimates): a band read by eye ×/÷ e^0.15 and ±1 mm; speed ×/÷ e^0.25; count ×/÷ e^0.3. */
const NOISE = { bandLn: 0.15, bandMm: 1, speedLn: 0.25, countLn: 0.3 }

export interface SeasonPour { flightPourId: number, productId: number, measurementId: number, glassId: number, glassName: string, wallAngleDeg: number, bowlDiameterMm: number, volumeMl: number, abvPctVol: number, residualSugarGL: number, servingTempC: number, kind: DrinkKind }
export interface SeasonSession { startsAt: Date, durationMinutes: number, seats: number, priceMinor: number, room: RoomAir, readAt: Date }
export interface SeasonObservation {
  session: number
  pour: SeasonPour
  source: 'guest' | 'host'
  deviceKey: string | null
  bandHeightMm: number | null
  noClearBand: boolean
  tearsFormed: TearsFormed
  tearCount: TearCount | null
  tearSpeed: TearSpeed | null
  minutesSince: number
  since: 'pour' | 'swirl'
  room: RoomAir
  roomSource: 'host' | 'session'
  flags: ObservationFlag[]
  recordedAt: Date
}

/** The past sessions the season happened at, oldest first, each with the host's room reading. */
export function planSeasonSessions(now: Date, timeZone: string): SeasonSession[] {
  const today = DateTime.fromJSDate(now, { zone: timeZone })
  const random = seededRandom(DEMO_SEASON_SEED + 1)
  const out: Omit<SeasonSession, 'room' | 'readAt'>[] = []
  for (const s of PAST_SERIES) {
    const last = today.minus({ days: ((today.weekday - s.weekday + 7) % 7) || 7 })
    for (let week = 0; week < s.weeks; week++) {
      const local = DateTime.fromISO(`${last.minus({ weeks: week }).toISODate()}T${s.startTime}`, { zone: timeZone })
      if (!local.isValid || local.toFormat('HH:mm') !== s.startTime || holidayOn(local.toISODate()!)) continue
      out.push({ startsAt: local.toUTC().toJSDate(), durationMinutes: s.durationMinutes, seats: s.seats, priceMinor: s.priceMinor })
    }
  }
  return out.sort((a, b) => a.startsAt.getTime() - b.startsAt.getTime())
    .map(s => ({ ...s, room: ROOM_READINGS[Math.floor(random() * ROOM_READINGS.length)]!, readAt: new Date(s.startsAt.getTime() - 10 * 60_000) }))
}

const hex64 = (random: () => number) => Array.from({ length: 8 }, () => Math.floor(random() * 0x1_0000_0000).toString(16).padStart(8, '0')).join('')
const binOf = <K extends string>(value: number, order: readonly K[], bins: Record<K, { min: number, max: number | null }>): K =>
  order.find(k => value >= bins[k].min && value <= (bins[k].max ?? Number.POSITIVE_INFINITY)) ?? order[order.length - 1]!
const speedBin = (v: number) => TEAR_SPEEDS.find(k => v >= TEAR_SPEED_BINS_MM_S[k].min && v < TEAR_SPEED_BINS_MM_S[k].max) ?? 'fast'

/** The season's observations at the planned sessions of the flight's pours. */
export function planSeason(sessions: SeasonSession[], pours: SeasonPour[]): SeasonObservation[] {
  const random = seededRandom(DEMO_SEASON_SEED)
  const truth = new Map<string, ReturnType<typeof computeFilm>['predictions']>()
  const truthOf = (p: SeasonPour, room: RoomAir) => {
    const key = `${p.flightPourId}|${room.relativeHumidityPct}|${room.airTempC}`
    let t = truth.get(key)
    if (!t) {
      const parameters = DEMO_TRUE_PARAMETERS[p.glassName] ?? { exchangeFactor: 1, massTransferFactor: 1 }
      t = computeFilm(
        { abvPctVol: p.abvPctVol, tempC: p.servingTempC, sugarGL: p.residualSugarGL, wallAngleDeg: p.wallAngleDeg, bowlDiameterMm: p.bowlDiameterMm, pourVolumeMl: p.volumeMl, kind: p.kind, room },
        { calibration: { parameters, sdLn: { exchangeFactor: 0, massTransferFactor: 0 }, observations: 0 } },
      ).predictions
      truth.set(key, t)
    }
    return t
  }
  const out: SeasonObservation[] = []
  const read = (session: number, s: SeasonSession, p: SeasonPour, source: 'guest' | 'host', deviceKey: string | null): SeasonObservation => {
    const t = truthOf(p, s.room)
    const minutesSince = 1 + Math.floor(random() * 8)
    const tearsFormed: TearsFormed = !t.tearsExpected ? 'no' : random() < 0.06 ? 'unsure' : 'yes'
    const band = t.bandVisible ? Math.max(0, t.clearBandHeight_mm * Math.exp(NOISE.bandLn * normalDraw(random)) + NOISE.bandMm * normalDraw(random)) : null
    const noClearBand = band === null || band < 1.5
    const speed = t.tearFallSpeed_mm_s === null ? null : t.tearFallSpeed_mm_s * Math.exp(NOISE.speedLn * normalDraw(random))
    const around = t.tearsAround === null ? null : t.tearsAround * Math.exp(NOISE.countLn * normalDraw(random))
    const skipSpeed = random() < 0.15
    return {
      session, pour: p, source, deviceKey,
      bandHeightMm: noClearBand ? null : Math.round(band! * 2) / 2,
      noClearBand,
      tearsFormed,
      tearCount: tearsFormed === 'yes' && around !== null ? binOf(Math.max(1, around), TEAR_COUNTS, TEAR_COUNT_BINS) : null,
      tearSpeed: tearsFormed === 'yes' && speed !== null && !skipSpeed ? speedBin(speed) : null,
      minutesSince,
      since: 'swirl',
      room: s.room,
      roomSource: source === 'host' ? 'host' : 'session',
      flags: [],
      recordedAt: new Date(s.startsAt.getTime() + (15 + Math.floor(random() * (s.durationMinutes - 20))) * 60_000),
    }
  }
  sessions.forEach((s, i) => {
    for (const p of pours) {
      const [lo, hi] = READERS[p.glassName] ?? [1, 2]
      const n = p.glassName === 'Flute' ? (FLUTE_SESSIONS.has(i) ? 1 : 0) : lo + Math.floor(random() * (hi - lo + 1))
      for (let k = 0; k < n; k++) out.push(read(i, s, p, 'guest', hex64(random)))
    }
    // The host reads the tulip's first pour and the strongest pour at most sessions.
    const tulip = pours.find(p => p.glassName === 'Tulip wine glass')
    const strongest = [...pours].sort((a, b) => b.abvPctVol - a.abvPctVol)[0]
    for (const p of [tulip, strongest]) if (p && random() < 0.8) out.push(read(i, s, p, 'host', null))
  })
  // Implausible entries, kept and flagged: a tall band read where the reader saw no tears at all.
  for (let k = 0; k < 6; k++) {
    const i = Math.floor(random() * sessions.length)
    const p = pours[Math.floor(random() * pours.length)]!
    const o = read(i, sessions[i]!, p, 'guest', hex64(random))
    out.push({ ...o, bandHeightMm: 40 + Math.round(random() * 30), noClearBand: false, tearsFormed: 'no', tearCount: null, tearSpeed: null })
  }
  // One device floods the strongest pour of one session with the same far-off reading, as often as the route lets it.
  const floodSession = Math.floor(sessions.length / 2)
  const floodPour = [...pours].sort((a, b) => b.abvPctVol - a.abvPctVol)[0]!
  const floodDevice = hex64(random)
  for (let k = 0; k < ENTRIES_PER_DEVICE_POUR_SESSION; k++) {
    const o = read(floodSession, sessions[floodSession]!, floodPour, 'guest', floodDevice)
    out.push({ ...o, bandHeightMm: 28, noClearBand: false, tearsFormed: 'yes', tearSpeed: 'fast', recordedAt: new Date(o.recordedAt.getTime() + k * 20_000) })
  }
  // Flags by the same rules the routes apply (observationFlags), against the pour's prediction in that room.
  return out.map(o => ({ ...o, flags: observationFlags({ ...o, residualSugarGL: o.pour.residualSugarGL, session: 'matched' }, truthOf(o.pour, o.room)) }))
}
