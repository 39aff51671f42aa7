import { and, count, desc, eq, gte, isNull, ne, or, sql } from 'drizzle-orm'
import type { Venue } from '../db/schema/venues'
import type { TastingSession } from '../db/schema/sessions'
import type { Observation } from '../db/schema/observations'
import { drinkKindOf } from '../../shared/pours'
import type { RoomAir, TearPrediction } from '../../shared/science'
import {
  ENTRIES_PER_DEVICE_POUR_SESSION, TEARS_FORMED, TEAR_COUNTS, TEAR_SPEEDS, compareObservation, observationFlags, sessionTie,
  type ObservationFields, type ObservationFlag, type ObservationSource, type RoomSource,
} from '../../shared/observations'
import type { ObservationSaved, OthersSeen, OwnObservation, PourObservations, PredictedForComparison, SessionObservationPours } from '../../shared/types/observations'

/** Entries one device may make across every pour in an hour: a flight of 8 pours, 3 glasses each. */
const DEVICE_ENTRIES_PER_HOUR = 24

/** One pour of a flight with what the model needs: the product's current measurement and the glass. */
async function pourContext(venue: Venue, flightId: number, position: number) {
  const db = useDb()
  const [row] = await db.select({ pour: tables.flightPours, glass: tables.glasses, flight: tables.flights })
    .from(tables.flightPours)
    .innerJoin(tables.flights, eq(tables.flights.id, tables.flightPours.flightId))
    .innerJoin(tables.glasses, eq(tables.glasses.id, tables.flightPours.glassId))
    .where(and(eq(tables.flightPours.flightId, flightId), eq(tables.flightPours.position, position), eq(tables.flights.venueId, venue.id)))
  if (!row) notFound('This flight has no such pour.')
  const product = (await loadProducts(venue.id, { ids: [row.pour.productId] }))[0]
  if (!product) notFound('This pour’s product is gone.')
  // The glass's calibration at this venue, as the pour page uses it, so the comparison shows the page's ranges.
  const calibration = (await appliedCalibrations(venue, [row.glass.id])).get(row.glass.id) ?? null
  return { ...row, product, calibration }
}
type PourContext = Awaited<ReturnType<typeof pourContext>>

/** The model's prediction for these numbers in this room (the same memoised call every page makes). */
function predictionFor(venue: Venue, ctx: PourContext, numbers: { abvPctVol: number, residualSugarGL: number, servingTempC: number }, room: RoomAir): TearPrediction {
  return pourFacts({
    ...numbers,
    volumeMl: ctx.pour.volumeMl,
    wallAngleDeg: ctx.glass.wallAngleDeg,
    bowlDiameterMm: ctx.glass.bowlDiameterMm,
    kind: drinkKindOf(ctx.product.kind),
    calibration: ctx.calibration,
  }, venue, room).film.predictions
}

const currentNumbers = (ctx: PourContext) => ({ abvPctVol: ctx.product.current.abvPctVol, residualSugarGL: ctx.product.current.residualSugarGL, servingTempC: ctx.pour.servingTempC })

async function sessionOf(venueId: number, id: number | null): Promise<TastingSession | null> {
  if (id === null) return null
  const [s] = await useDb().select().from(tables.tastingSessions).where(and(eq(tables.tastingSessions.id, id), eq(tables.tastingSessions.venueId, venueId)))
  return s ?? null
}

/** The room an observation was seen in: the host's own reading, else the session's, else the venue's usual air. */
function roomFor(venue: Venue, session: TastingSession | null, hostReading: RoomAir | null): { air: RoomAir, source: RoomSource } {
  if (hostReading) return { air: hostReading, source: 'host' }
  const room = session ? sessionRoom(venue, session) : venueRoom(venue)
  return { air: room.air, source: room.source === 'session' ? 'session' : 'venue' }
}

const sameSession = (sessionId: number | null) => (sessionId === null ? isNull(tables.observations.sessionId) : eq(tables.observations.sessionId, sessionId))

function tooMany(message: string, retryAfterSeconds: number): never {
  throw createError({ status: 429, statusText: 'Too many observations', message, data: { retryAfterSeconds } })
}

/**
 * Stores one observation with everything it was seen under: the pour's numbers now (the product's
 * current measurement, the flight pour's serving temperature), the measurement and glass ids, the
 * session when it fits this flight and this time (else null, and flagged), and the room reading.
 * Guests' entries are counted under the pour's row lock, so a burst in parallel stops at the limit.
 */
export async function recordObservation(opts: {
  venue: Venue
  flightId: number
  position: number
  sessionId: number | null
  fields: ObservationFields
  source: ObservationSource
  deviceKey: string | null
  hostReading?: RoomAir
  now?: Date
}): Promise<ObservationSaved> {
  const { venue, fields, source, deviceKey } = opts
  const now = opts.now ?? new Date()
  const ctx = await pourContext(venue, opts.flightId, opts.position)
  const session = await sessionOf(venue.id, opts.sessionId)
  const tie = opts.sessionId === null ? 'none' : sessionTie(session ?? { flightId: -1, startsAt: now, durationMinutes: 0, status: 'open' }, opts.flightId, now)
  const sessionId = tie === 'matched' ? session!.id : null
  const room = roomFor(venue, tie === 'matched' ? session : null, opts.hostReading ?? null)
  const numbers = currentNumbers(ctx)
  const prediction = predictionFor(venue, ctx, numbers, room.air)
  const flags = observationFlags({ ...fields, residualSugarGL: numbers.residualSugarGL, session: tie }, prediction)

  const id = await useDb().transaction(async (tx) => {
    await tx.select({ id: tables.flightPours.id }).from(tables.flightPours).where(eq(tables.flightPours.id, ctx.pour.id)).for('update')
    if (deviceKey) {
      const [here] = await tx.select({ n: count() }).from(tables.observations)
        .where(and(eq(tables.observations.flightPourId, ctx.pour.id), eq(tables.observations.deviceKey, deviceKey), sameSession(sessionId)))
      if ((here?.n ?? 0) >= ENTRIES_PER_DEVICE_POUR_SESSION) {
        tooMany(`This phone has recorded ${ENTRIES_PER_DEVICE_POUR_SESSION} glasses of this pour${sessionId ? ' at this session' : ''}; that is the most we keep from one phone. Thank you!`, 3600)
      }
      const [hour] = await tx.select({ n: count() }).from(tables.observations)
        .where(and(eq(tables.observations.deviceKey, deviceKey), gte(tables.observations.recordedAt, new Date(now.getTime() - 3_600_000))))
      if ((hour?.n ?? 0) >= DEVICE_ENTRIES_PER_HOUR) tooMany(`This phone has recorded ${DEVICE_ENTRIES_PER_HOUR} glasses in the last hour; please wait a while before the next.`, 3600)
    }
    const [row] = await tx.insert(tables.observations).values({
      venueId: venue.id,
      flightId: opts.flightId,
      flightPourId: ctx.pour.id,
      productId: ctx.product.id,
      measurementId: ctx.product.current.id,
      glassId: ctx.glass.id,
      sessionId,
      source,
      deviceKey,
      ...numbers,
      bandHeightMm: fields.noClearBand ? null : fields.bandHeightMm,
      noClearBand: fields.noClearBand,
      tearsFormed: fields.tearsFormed,
      tearCount: fields.tearCount,
      tearSpeed: fields.tearSpeed,
      minutesSince: fields.minutesSince,
      since: fields.since,
      roomHumidityPct: Math.round(room.air.relativeHumidityPct),
      roomAirTempC: Math.round(room.air.airTempC * 10) / 10,
      roomSource: room.source,
      flags,
      recordedAt: now,
    }).$returningId()
    return row!.id
  })
  return { id, source, sessionId, flags, roomSource: room.source }
}

function predictedView(p: TearPrediction, room: { air: RoomAir, source: RoomSource }): PredictedForComparison {
  return {
    tearsExpected: p.tearsExpected,
    bandVisible: p.bandVisible,
    suppressedBy: p.suppressedBy,
    band: p.ranges.clearBandHeight_mm,
    speed: p.ranges.tearFallSpeed_mm_s,
    around: p.ranges.tearsAround,
    room: { relativeHumidityPct: room.air.relativeHumidityPct, airTempC: room.air.airTempC, source: room.source },
  }
}

const BAND_BIN_MM = 2
const zeros = <K extends string>(keys: readonly K[]) => Object.fromEntries(keys.map(k => [k, 0])) as Record<K, number>

/** Counts per bin of other people's readings: no row, time or key leaves this function. */
function aggregate(rows: Pick<Observation, 'bandHeightMm' | 'noClearBand' | 'tearsFormed' | 'tearSpeed' | 'tearCount' | 'flags'>[]): OthersSeen {
  const kept = rows.filter(r => !r.flags.length)
  const bins = new Map<number, number>()
  const out: OthersSeen = { count: kept.length, flaggedLeftOut: rows.length - kept.length, band: [], noClearBand: 0, bandNotRead: 0, tears: zeros(TEARS_FORMED), speed: zeros(TEAR_SPEEDS), around: zeros(TEAR_COUNTS) }
  for (const r of kept) {
    if (r.noClearBand) out.noClearBand++
    else if (r.bandHeightMm === null) out.bandNotRead++
    else {
      const from = Math.floor(r.bandHeightMm / BAND_BIN_MM) * BAND_BIN_MM
      bins.set(from, (bins.get(from) ?? 0) + 1)
    }
    out.tears[r.tearsFormed]++
    if (r.tearSpeed) out.speed[r.tearSpeed]++
    if (r.tearCount) out.around[r.tearCount]++
  }
  out.band = [...bins].sort((a, b) => a[0] - b[0]).map(([fromMm, n]) => ({ fromMm, toMm: fromMm + BAND_BIN_MM, count: n }))
  return out
}

/**
 * How this pour's glasses compared (public; aggregated only): the model's ranges in the room of the
 * card's session (or the venue's usual air), other people's readings in bins, and where this
 * device's own newest entry fell, against the prediction for the numbers and room it was seen in.
 */
export async function pourObservations(venue: Venue, flightId: number, position: number, sessionParam: number | null, deviceKey: string | null, now = new Date()): Promise<PourObservations> {
  await loadFlight(venue, flightId, { publishedOnly: true })
  const ctx = await pourContext(venue, flightId, position)
  const session = await sessionOf(venue.id, sessionParam)
  const sessionId = session && sessionTie(session, flightId, now) === 'matched' ? session.id : null
  const o = tables.observations
  const db = useDb()
  const others = await db.select({ bandHeightMm: o.bandHeightMm, noClearBand: o.noClearBand, tearsFormed: o.tearsFormed, tearSpeed: o.tearSpeed, tearCount: o.tearCount, flags: o.flags })
    .from(o).where(and(eq(o.flightPourId, ctx.pour.id), deviceKey ? or(isNull(o.deviceKey), ne(o.deviceKey, deviceKey)) : sql`true`))
  const [latest] = deviceKey
    ? await db.select().from(o).where(and(eq(o.flightPourId, ctx.pour.id), eq(o.deviceKey, deviceKey))).orderBy(desc(o.recordedAt), desc(o.id)).limit(1)
    : []
  const [here] = deviceKey
    ? await db.select({ n: count() }).from(o).where(and(eq(o.flightPourId, ctx.pour.id), eq(o.deviceKey, deviceKey), sameSession(sessionId)))
    : [{ n: 0 }]

  let room = roomFor(venue, sessionId ? session : null, null)
  let prediction = predictionFor(venue, ctx, currentNumbers(ctx), room.air)
  let mine: OwnObservation | null = null
  if (latest) {
    // The entry is compared with what the model says for the numbers and room it was seen under.
    room = { air: { relativeHumidityPct: latest.roomHumidityPct, airTempC: latest.roomAirTempC }, source: latest.roomSource }
    prediction = predictionFor(venue, ctx, { abvPctVol: latest.abvPctVol, residualSugarGL: latest.residualSugarGL, servingTempC: latest.servingTempC }, room.air)
    mine = {
      bandHeightMm: latest.bandHeightMm,
      noClearBand: latest.noClearBand,
      tearsFormed: latest.tearsFormed,
      tearCount: latest.tearCount,
      tearSpeed: latest.tearSpeed,
      minutesSince: latest.minutesSince,
      since: latest.since,
      recordedAt: latest.recordedAt.toISOString(),
      flags: latest.flags as ObservationFlag[],
      comparison: compareObservation(latest, prediction),
    }
  }
  return {
    flightId,
    position,
    pourName: ctx.product.name,
    sessionId,
    predicted: predictedView(prediction, room),
    others: aggregate(others),
    mine,
    entriesLeft: Math.max(0, ENTRIES_PER_DEVICE_POUR_SESSION - (here?.n ?? 0)),
  }
}

/** A session's pours for the host's form, with how many entries each has at this session so far. */
export async function sessionObservationPours(venue: Venue, session: TastingSession, now = new Date()): Promise<SessionObservationPours> {
  const db = useDb()
  const pours = await db.select({ position: tables.flightPours.position, id: tables.flightPours.id, name: tables.products.name, glassName: tables.glasses.name })
    .from(tables.flightPours)
    .innerJoin(tables.products, eq(tables.products.id, tables.flightPours.productId))
    .innerJoin(tables.glasses, eq(tables.glasses.id, tables.flightPours.glassId))
    .where(eq(tables.flightPours.flightId, session.flightId)).orderBy(tables.flightPours.position)
  const o = tables.observations
  const counts = await db.select({ pourId: o.flightPourId, source: o.source, n: count() }).from(o)
    .where(eq(o.sessionId, session.id)).groupBy(o.flightPourId, o.source)
  const n = (pourId: number, source: ObservationSource) => counts.find(c => c.pourId === pourId && c.source === source)?.n ?? 0
  const reading = session.roomHumidityPct !== null && session.roomAirTempC !== null ? { relativeHumidityPct: session.roomHumidityPct, airTempC: session.roomAirTempC } : null
  return {
    sessionId: session.id,
    room: reading,
    venueRoom: { relativeHumidityPct: venue.roomHumidityPct, airTempC: venue.roomAirTempC },
    pours: pours.map(p => ({ position: p.position, name: p.name, glassName: p.glassName, guestEntries: n(p.id, 'guest'), hostEntries: n(p.id, 'host') })),
    canRecord: sessionTie(session, session.flightId, now) === 'matched',
  }
}
