import { and, desc, eq, gte, lt, type SQL } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { Venue } from '../db/schema/venues'
import type { Observation } from '../db/schema/observations'
import { compareObservation, OBSERVATION_FLAG_LABELS, TEAR_SPEEDS, type ObservationFlag, type TearSpeed } from '../../shared/observations'
import { calibrate, type CalibrationResult, type GroupCalibration } from '../../shared/science/calibration'
import { drinkKindOf } from '../../shared/pours'
import type { ObservationFilter } from '../../shared/schemas/observationAnalysis'
import type { FitRow } from './calibration'
import type { AgreementStats, CalibrationPanelRow, ChartProduct, ObservationRow, ObservationSummary, RangeView } from '../../shared/types/observationAnalysis'

/** The flags' words (codes the capture side writes); an unknown code is spelt out from itself. */
const flagWords = (code: string) => OBSERVATION_FLAG_LABELS[code as ObservationFlag] ?? code.replaceAll('_', ' ')

/**
 * A band reading is far outside when it misses its range by more than the range's own width (and
 * by at least 5 mm): more than a misread scale or an unusual glass explains (estimate, no source).
 */
const FAR_OUTSIDE_MIN_MM = 5
function farOutside(seen: number | null, r: RangeView | null): boolean {
  if (seen === null || !r) return false
  const margin = Math.max(FAR_OUTSIDE_MIN_MM, r.high - r.low)
  return seen > r.high + margin || seen < r.low - margin
}

const range = (r: { low: number, high: number } | null | undefined): RangeView | null => (r ? { low: r.low, high: r.high } : null)

function whereOf(venue: Venue, f: ObservationFilter): SQL {
  const o = tables.observations
  const parts: SQL[] = [eq(o.venueId, venue.id)]
  if (f.productId) parts.push(eq(o.productId, f.productId))
  if (f.glassId) parts.push(eq(o.glassId, f.glassId))
  if (f.flightId) parts.push(eq(o.flightId, f.flightId))
  if (f.source) parts.push(eq(o.source, f.source))
  if (f.demo === 'exclude') parts.push(eq(o.demo, false))
  // Calendar days in the venue's zone, both ends included.
  if (f.from) parts.push(gte(o.recordedAt, DateTime.fromISO(f.from, { zone: venue.timeZone }).startOf('day').toUTC().toJSDate()))
  if (f.to) parts.push(lt(o.recordedAt, DateTime.fromISO(f.to, { zone: venue.timeZone }).plus({ days: 1 }).startOf('day').toUTC().toJSDate()))
  return and(...parts)!
}

/** The observations that match the filters, newest first, each with its prediction and comparison. */
export async function loadObservationRows(venue: Venue, f: ObservationFilter, page?: { limit: number, offset: number }): Promise<ObservationRow[]> {
  const o = tables.observations
  const q = useDb().select({ o, glass: tables.glasses, pour: tables.flightPours, product: tables.products, flightName: tables.flights.name, startsAt: tables.tastingSessions.startsAt })
    .from(o)
    .innerJoin(tables.glasses, eq(tables.glasses.id, o.glassId))
    .innerJoin(tables.flightPours, eq(tables.flightPours.id, o.flightPourId))
    .innerJoin(tables.products, eq(tables.products.id, o.productId))
    .innerJoin(tables.flights, eq(tables.flights.id, o.flightId))
    .leftJoin(tables.tastingSessions, eq(tables.tastingSessions.id, o.sessionId))
    .where(whereOf(venue, f))
    .orderBy(desc(o.recordedAt), desc(o.id))
  const rows = page ? await q.limit(page.limit).offset(page.offset) : await q
  return rows.map(r => observationRow(venue, r.o, r))
}

export async function countObservations(venue: Venue, f: ObservationFilter): Promise<number> {
  return useDb().$count(tables.observations, whereOf(venue, f))
}

function observationRow(venue: Venue, o: Observation, r: { glass: { id: number, name: string, wallAngleDeg: number, bowlDiameterMm: number }, pour: { volumeMl: number, position: number }, product: { id: number, name: string, kind: Parameters<typeof drinkKindOf>[0] }, flightName: string, startsAt: Date | null }): ObservationRow {
  const room = { relativeHumidityPct: o.roomHumidityPct, airTempC: o.roomAirTempC }
  // The published defaults: the comparison is what the calibration learns from, not its result.
  const film = pourFacts({ abvPctVol: o.abvPctVol, residualSugarGL: o.residualSugarGL, servingTempC: o.servingTempC, volumeMl: r.pour.volumeMl, wallAngleDeg: r.glass.wallAngleDeg, bowlDiameterMm: r.glass.bowlDiameterMm, kind: drinkKindOf(r.product.kind) }, venue, room).film
  const p = film.predictions
  const comparison = compareObservation(o, p)
  const band = range(p.ranges.clearBandHeight_mm)
  const flags = o.flags.map(flagWords)
  const far = farOutside(o.bandHeightMm, band)
  return {
    id: o.id,
    recordedAt: o.recordedAt.toISOString(),
    source: o.source,
    demo: o.demo,
    flight: { id: o.flightId, name: r.flightName },
    position: r.pour.position,
    product: { id: r.product.id, name: r.product.name },
    glass: { id: r.glass.id, name: r.glass.name },
    sessionId: o.sessionId,
    sessionStartsAt: r.startsAt?.toISOString() ?? null,
    abvPctVol: o.abvPctVol,
    residualSugarGL: o.residualSugarGL,
    servingTempC: o.servingTempC,
    volumeMl: r.pour.volumeMl,
    room: { ...room, source: o.roomSource },
    seen: { bandHeightMm: o.bandHeightMm, noClearBand: o.noClearBand, tearsFormed: o.tearsFormed, tearCount: o.tearCount, tearSpeed: o.tearSpeed, minutesSince: o.minutesSince, since: o.since },
    predicted: { tearsExpected: p.tearsExpected, bandVisible: p.bandVisible, band, speed: range(p.ranges.tearFallSpeed_mm_s), around: range(p.ranges.tearsAround) },
    comparison,
    flags,
    outlier: flags.length ? `Flagged: ${flags.join('; ')}` : far ? `Band ${o.bandHeightMm} mm, far outside ${band!.low.toFixed(1)}–${band!.high.toFixed(1)} mm` : null,
  }
}

/** Device of a row for counting: a guest's device at the pour; each host entry on its own. */
const deviceOf = (r: ObservationRow, keys: Map<number, string>) => keys.get(r.id) ?? `row:${r.id}`

function stats(rows: ObservationRow[], keyOf: (r: ObservationRow) => { id: number, name: string }, devices: Map<number, string>): AgreementStats[] {
  const groups = new Map<number, { name: string, rows: ObservationRow[] }>()
  for (const r of rows) {
    const k = keyOf(r)
    const g = groups.get(k.id) ?? { name: k.name, rows: [] }
    g.rows.push(r)
    groups.set(k.id, g)
  }
  return [...groups].map(([id, g]) => {
    const clean = g.rows.filter(r => !r.flags.length)
    const count = (pick: (r: ObservationRow) => string, ok: string) => ({ compared: clean.filter(r => pick(r) !== 'not_compared').length, hit: clean.filter(r => pick(r) === ok).length })
    const band = count(r => r.comparison.band, 'inside')
    const speed = count(r => r.comparison.speed, 'inside')
    const tears = count(r => r.comparison.tears, 'agrees')
    return {
      id, name: g.name, observations: g.rows.length,
      devices: new Set(g.rows.map(r => deviceOf(r, devices))).size,
      band: { compared: band.compared, inside: band.hit },
      speed: { compared: speed.compared, inside: speed.hit },
      tears: { compared: tears.compared, agree: tears.hit },
      flagged: g.rows.length - clean.length,
    }
  }).sort((a, b) => a.name.localeCompare(b.name))
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b)
  const m = Math.floor(s.length / 2)
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2
}
const medianRange = (rs: (RangeView | null)[]): RangeView | null => {
  const list = rs.filter((r): r is RangeView => r !== null)
  return list.length ? { low: median(list.map(r => r.low)), high: median(list.map(r => r.high)) } : null
}

function chart(rows: ObservationRow[]): ChartProduct[] {
  const byProduct = new Map<number, ObservationRow[]>()
  for (const r of rows) byProduct.set(r.product.id, [...(byProduct.get(r.product.id) ?? []), r])
  return [...byProduct].map(([productId, list]) => {
    const clean = list.filter(r => !r.flags.length)
    const speedSeen = Object.fromEntries(TEAR_SPEEDS.map(s => [s, 0])) as Record<TearSpeed, number>
    for (const r of clean) if (r.seen.tearSpeed) speedSeen[r.seen.tearSpeed]++
    return {
      productId,
      name: list[0]!.product.name,
      abvPctVol: median(list.map(r => r.abvPctVol)),
      band: medianRange(list.map(r => r.predicted.band)),
      speed: medianRange(list.map(r => r.predicted.speed)),
      bandSeen: clean.flatMap(r => (r.seen.noClearBand ? [0] : r.seen.bandHeightMm === null ? [] : [r.seen.bandHeightMm])),
      speedSeen,
    }
  }).sort((a, b) => a.abvPctVol - b.abvPctVol)
}

const pct = (n: number, d: number) => (d ? `${Math.round((100 * n) / d)} %` : '—')

function chartText(products: ChartProduct[], stats: AgreementStats[]): ObservationSummary['chartText'] {
  const byId = new Map(stats.map(s => [s.id, s]))
  return {
    band: products.map((p) => {
      const s = byId.get(p.productId)
      const band = p.band ? `predicted band ${p.band.low.toFixed(1)}–${p.band.high.toFixed(1)} mm` : 'no band predicted'
      const seen = p.bandSeen.length ? `seen ${Math.min(...p.bandSeen)}–${Math.max(...p.bandSeen)} mm (median ${median(p.bandSeen)})` : 'no band readings'
      return `${p.name}, ${p.abvPctVol} % ABV: ${band}, ${seen}; ${pct(s?.band.inside ?? 0, s?.band.compared ?? 0)} of ${s?.band.compared ?? 0} readings inside.`
    }),
    speed: products.map((p) => {
      const s = byId.get(p.productId)
      const speed = p.speed ? `predicted ${p.speed.low.toFixed(1)}–${p.speed.high.toFixed(1)} mm/s` : 'no tears predicted'
      const seen = TEAR_SPEEDS.map(k => `${p.speedSeen[k]} ${k}`).join(', ')
      return `${p.name}, ${p.abvPctVol} % ABV: ${speed}; seen ${seen}; ${pct(s?.speed.inside ?? 0, s?.speed.compared ?? 0)} of ${s?.speed.compared ?? 0} inside.`
    }),
  }
}

interface PanelCache { version: string, since: Map<string, string | null> }
const panelCache = new Map<number, PanelCache>()
const groupKey = (g: Pick<GroupCalibration, 'glassKey' | 'roomKey'>) => `${g.glassKey}|${g.roomKey ?? ''}`

/**
 * When each applied group became applied: the time of the observation with which a fit over the
 * observations up to it first applies (found by halving, about log2(n) fits; the status rises with
 * the readings, so the first applying prefix is where cards changed).
 */
export function appliedSince(fitRows: FitRow[], result: CalibrationResult, fit: typeof calibrate = calibrate): Map<string, string | null> {
  const clean = fitRows.filter(r => r.row.flags.length === 0).sort((a, b) => a.row.recordedAt.getTime() - b.row.recordedAt.getTime() || a.row.id - b.row.id)
  const out = new Map<string, string | null>()
  for (const g of result.groups.filter(x => x.status === 'applied')) {
    const mine = clean.filter(r => r.fit.glassKey === g.glassKey && (g.roomKey === null || r.fit.roomKey === g.roomKey))
    const applies = (n: number) => fit(mine.slice(0, n).map(r => r.fit)).groups.some(x => groupKey(x) === groupKey(g) && x.status === 'applied')
    let lo = 1
    let hi = mine.length
    while (lo < hi) {
      const mid = Math.floor((lo + hi) / 2)
      if (applies(mid)) hi = mid
      else lo = mid + 1
    }
    out.set(groupKey(g), mine[lo - 1]?.row.recordedAt.toISOString() ?? null)
  }
  return out
}

const WHY_NOT: Record<GroupCalibration['status'], string> = {
  applied: '',
  too_few: 'Too few readings yet: the figures stay at the published defaults until the range is narrow enough.',
  does_not_fit: 'The readings scatter more than reading error explains, so the published defaults stay.',
}

async function calibrationPanel(venue: Venue): Promise<ObservationSummary['calibration']> {
  const fit = await venueCalibration(venue.id)
  let cache = panelCache.get(venue.id)
  if (cache?.version !== fit.version) {
    // A group that already applied keeps its moment; only newly applied groups are searched for theirs.
    const known = cache?.since ?? new Map<string, string | null>()
    const fresh = fit.result.groups.filter(g => g.status === 'applied' && !known.get(groupKey(g)))
    const found = fresh.length ? appliedSince(await loadFitRows(venue.id), { groups: fresh, modelRuns: 0 }) : new Map<string, string | null>()
    const since = new Map(fit.result.groups.filter(g => g.status === 'applied').map(g => [groupKey(g), known.get(groupKey(g)) ?? found.get(groupKey(g)) ?? null]))
    cache = { version: fit.version, since }
    panelCache.set(venue.id, cache)
  }
  const glasses = new Map((await useDb().select().from(tables.glasses).where(eq(tables.glasses.venueId, venue.id))).map(g => [String(g.id), g.name]))
  const groups: CalibrationPanelRow[] = fit.result.groups.map((g) => {
    const inUse = venue.calibrationEnabled && g.status === 'applied'
    return {
      ...g,
      glassName: glasses.get(g.glassKey) ?? `Glass ${g.glassKey}`,
      inUse,
      inUseSince: inUse ? cache.since.get(groupKey(g)) ?? null : null,
      whyNot: inUse ? null : g.status === 'applied' ? 'Calibration is switched off for the venue: cards and pour pages use the published defaults.' : WHY_NOT[g.status],
    }
  }).sort((a, b) => a.glassName.localeCompare(b.glassName) || (a.roomKey ?? '').localeCompare(b.roomKey ?? ''))
  return { enabled: venue.calibrationEnabled, groups }
}

/** One device's entries at one pour and session count as one outlier, however many it sent. */
function groupOutliers(rows: ObservationRow[], devices: Map<number, string>): ObservationSummary['outliers'] {
  const groups = new Map<string, { row: ObservationRow, entries: number }>()
  for (const r of rows) {
    const key = deviceOf(r, devices)
    const g = groups.get(key)
    if (g) g.entries++
    else groups.set(key, { row: r, entries: 1 })
  }
  return [...groups.values()]
}

/** Everything the manager's page shows for the filters: counts, agreement, the charts, outliers, the calibration. */
export async function observationSummary(venue: Venue, f: ObservationFilter): Promise<ObservationSummary> {
  const rows = await loadObservationRows(venue, f)
  const devices = new Map((await useDb().select({ id: tables.observations.id, source: tables.observations.source, deviceKey: tables.observations.deviceKey, sessionId: tables.observations.sessionId, flightPourId: tables.observations.flightPourId })
    .from(tables.observations).where(whereOf(venue, f))).map(o => [o.id, fitDeviceKey(o)]))
  const byProduct = stats(rows, r => r.product, devices)
  const products = chart(rows)
  return {
    total: rows.length,
    demo: rows.filter(r => r.demo).length,
    flagged: rows.filter(r => r.flags.length).length,
    byProduct,
    byGlass: stats(rows, r => r.glass, devices),
    byFlight: stats(rows, r => r.flight, devices),
    chart: products,
    chartText: chartText(products, byProduct),
    outliers: groupOutliers(rows.filter(r => r.outlier !== null), devices).slice(0, 50),
    calibration: await calibrationPanel(venue),
  }
}
