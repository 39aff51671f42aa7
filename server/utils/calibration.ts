import { count, eq, max } from 'drizzle-orm'
import type { Venue } from '../db/schema/venues'
import type { Observation } from '../db/schema/observations'
import { calibrate, type AppliedCalibration, type CalibrationResult, type FitObservation } from '../../shared/science/calibration'
import { pickAppliedGroup } from '../../shared/calibrationText'
import { drinkKindOf } from '../../shared/pours'

/** Every observation of a venue the fit may use, with what the fit needs of its glass and pour. */
export interface FitRow { row: Observation, fit: FitObservation }

/** The room key of a venue's observations: the venue itself until venues have rooms of their own. */
const roomKeyOf = (venueId: number) => String(venueId)

/**
 * One device at one pour of one session counts once (the fit weighs by it); a host's entry stands
 * for itself, since a host reads a glass on purpose and says what the room was.
 */
export function fitDeviceKey(o: Pick<Observation, 'id' | 'source' | 'deviceKey' | 'sessionId' | 'flightPourId'>): string {
  if (o.source === 'host' || !o.deviceKey) return `host:${o.id}`
  return `${o.deviceKey}:${o.sessionId ?? 'none'}:${o.flightPourId}`
}

/** The venue's observations with their glass, pour volume and the product's kind, flagged ones included (the caller chooses). */
export async function loadFitRows(venueId: number): Promise<FitRow[]> {
  const db = useDb()
  const rows = await db.select({ o: tables.observations, g: tables.glasses, volumeMl: tables.flightPours.volumeMl, kind: tables.products.kind })
    .from(tables.observations)
    .innerJoin(tables.glasses, eq(tables.glasses.id, tables.observations.glassId))
    .innerJoin(tables.flightPours, eq(tables.flightPours.id, tables.observations.flightPourId))
    .innerJoin(tables.products, eq(tables.products.id, tables.observations.productId))
    .where(eq(tables.observations.venueId, venueId))
  return rows.map(({ o, g, volumeMl, kind }) => ({
    row: o,
    fit: {
      glassKey: String(o.glassId),
      roomKey: roomKeyOf(venueId),
      deviceKey: fitDeviceKey(o),
      abvPctVol: o.abvPctVol,
      tempC: o.servingTempC,
      sugarGL: o.residualSugarGL,
      wallAngleDeg: g.wallAngleDeg,
      bowlDiameterMm: Math.min(150, Math.max(30, g.bowlDiameterMm)),
      pourVolumeMl: Math.min(500, Math.max(5, volumeMl)),
      kind: drinkKindOf(kind),
      room: { relativeHumidityPct: o.roomHumidityPct, airTempC: o.roomAirTempC },
      minutesSince: o.minutesSince,
      since: o.since,
      bandHeightMm: o.bandHeightMm,
      noClearBand: o.noClearBand,
      tearsFormed: o.tearsFormed,
      tearCount: o.tearCount,
      tearSpeed: o.tearSpeed,
    },
  }))
}

interface CachedFit { version: string, result: CalibrationResult, computedAt: Date }
/** Venues kept; the oldest fit goes first past it. */
const FIT_CACHE_MAX = 64
const fitCache = new Map<number, CachedFit>()
const running = new Map<string, Promise<CachedFit>>()
/** How long a guest's page waits for a new fit before it uses the previous one. */
const STALE_AFTER_MS = 300

/**
 * A cheap key that changes whenever the fit's input can: a new or deleted observation (count and
 * largest id). The venue's switch is read from the venue row on each call.
 */
async function fitVersion(venueId: number): Promise<string> {
  const [r] = await useDb().select({ n: count(), top: max(tables.observations.id) }).from(tables.observations).where(eq(tables.observations.venueId, venueId))
  return `${r?.n ?? 0}|${r?.top ?? 0}`
}

/**
 * The venue's calibration from its unflagged observations, recomputed only when an observation was
 * added or removed (calibrate is pure, so a cached result for the same rows is the same result).
 * Parallel callers share one fit. `stale: true` (guests' pages) waits at most STALE_AFTER_MS for a new
 * fit, then answers with the previous one while the new one finishes, so no guest waits long for a
 * fit; the manager's page always waits for the new one.
 */
export async function venueCalibration(venueId: number, opts: { stale?: boolean } = {}): Promise<CachedFit> {
  const version = await fitVersion(venueId)
  const cached = fitCache.get(venueId)
  if (cached?.version === version) return cached
  const key = `${venueId}|${version}`
  let job = running.get(key)
  if (!job) {
    job = (async () => {
      const rows = await loadFitRows(venueId)
      const result = calibrate(rows.filter(r => r.row.flags.length === 0).map(r => r.fit))
      const fit = { version, result, computedAt: new Date() }
      fitCache.delete(venueId)
      if (fitCache.size >= FIT_CACHE_MAX) fitCache.delete(fitCache.keys().next().value!)
      fitCache.set(venueId, fit)
      return fit
    })().finally(() => running.delete(key))
    running.set(key, job)
  }
  if (opts.stale && cached) {
    job.catch(err => console.error('[larmoir] calibration fit failed', err))
    const late = new Promise<CachedFit>(resolve => setTimeout(resolve, STALE_AFTER_MS, cached).unref())
    return Promise.race([job, late])
  }
  return job
}

/**
 * The calibration each glass's predictions use, by glass id: null when the venue switched
 * calibration off or the glass's group is not 'applied' (the glass in this room first, then the
 * glass over every room).
 */
export async function appliedCalibrations(venue: Pick<Venue, 'id' | 'calibrationEnabled'>, glassIds: number[]): Promise<Map<number, AppliedCalibration | null>> {
  const out = new Map<number, AppliedCalibration | null>(glassIds.map(id => [id, null]))
  if (!venue.calibrationEnabled || !glassIds.length) return out
  const { result } = await venueCalibration(venue.id, { stale: true })
  for (const id of glassIds) out.set(id, pickAppliedGroup(result.groups, String(id), roomKeyOf(venue.id)))
  return out
}

/** Turns the venue's calibration on or off; predictions follow on the next read. */
export async function setCalibrationEnabled(venueId: number, enabled: boolean): Promise<void> {
  await updateVenue(venueId, { calibrationEnabled: enabled })
}
