import { and, eq, inArray } from 'drizzle-orm'
import { drinkKindOf } from '../../shared/pours'
import { planSeason, planSeasonSessions, type SeasonPour } from '../demo/season'

/**
 * The demo's season of invented observations (server/demo/season.ts) at past sessions of its
 * published flight, inside the seeding transaction. Rows carry demo = true. Returns how many.
 */
export async function seedDemoSeason(tx: Tx, venueId: number, opts: { flightId: number, hostId: number | null, currency: string, timeZone: string }): Promise<{ sessions: number, observations: number }> {
  const pourRows = await tx.select({ pour: tables.flightPours, glass: tables.glasses, product: tables.products })
    .from(tables.flightPours)
    .innerJoin(tables.glasses, eq(tables.glasses.id, tables.flightPours.glassId))
    .innerJoin(tables.products, eq(tables.products.id, tables.flightPours.productId))
    .where(eq(tables.flightPours.flightId, opts.flightId))
  const measurements = new Map((await tx.select().from(tables.productMeasurements).where(inArray(tables.productMeasurements.productId, pourRows.map(r => r.product.id)))).map(m => [m.productId, m]))
  const pours: SeasonPour[] = pourRows.sort((a, b) => a.pour.position - b.pour.position).map(({ pour, glass, product }) => {
    const m = measurements.get(product.id)!
    return {
      flightPourId: pour.id, productId: product.id, measurementId: m.id, glassId: glass.id, glassName: glass.name, wallAngleDeg: glass.wallAngleDeg,
      bowlDiameterMm: glass.bowlDiameterMm, volumeMl: pour.volumeMl, abvPctVol: m.abvPctVol, residualSugarGL: m.residualSugarGL, servingTempC: pour.servingTempC, kind: drinkKindOf(product.kind),
    }
  })
  const planned = planSeasonSessions(new Date(), opts.timeZone)
  if (!planned.length || !pours.length) return { sessions: 0, observations: 0 }
  await tx.insert(tables.tastingSessions).values(planned.map(s => ({
    venueId, flightId: opts.flightId, startsAt: s.startsAt, hostId: opts.hostId, currency: opts.currency, status: 'closed' as const,
    durationMinutes: s.durationMinutes, seats: s.seats, priceMinor: s.priceMinor, bookingCutoffMinutes: 60,
    roomHumidityPct: s.room.relativeHumidityPct, roomAirTempC: s.room.airTempC, roomReadAt: s.readAt, roomReadBy: opts.hostId,
  })))
  const sessionRows = await tx.select({ id: tables.tastingSessions.id, startsAt: tables.tastingSessions.startsAt }).from(tables.tastingSessions)
    .where(and(eq(tables.tastingSessions.flightId, opts.flightId), inArray(tables.tastingSessions.startsAt, planned.map(s => s.startsAt))))
  const sessionIds = new Map(sessionRows.map(r => [r.startsAt.getTime(), r.id]))
  const rows = planSeason(planned, pours).map(o => ({
    venueId, flightId: opts.flightId, flightPourId: o.pour.flightPourId, productId: o.pour.productId, measurementId: o.pour.measurementId, glassId: o.pour.glassId,
    sessionId: sessionIds.get(planned[o.session]!.startsAt.getTime()) ?? null, source: o.source, deviceKey: o.deviceKey,
    abvPctVol: o.pour.abvPctVol, residualSugarGL: o.pour.residualSugarGL, servingTempC: o.pour.servingTempC,
    bandHeightMm: o.bandHeightMm, noClearBand: o.noClearBand, tearsFormed: o.tearsFormed, tearCount: o.tearCount, tearSpeed: o.tearSpeed,
    minutesSince: o.minutesSince, since: o.since, roomHumidityPct: o.room.relativeHumidityPct, roomAirTempC: o.room.airTempC, roomSource: o.roomSource,
    flags: o.flags, demo: true, recordedAt: o.recordedAt,
  }))
  for (let i = 0; i < rows.length; i += 500) await tx.insert(tables.observations).values(rows.slice(i, i + 500))
  return { sessions: planned.length, observations: rows.length }
}
