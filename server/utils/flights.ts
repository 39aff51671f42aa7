import { and, asc, count, eq, inArray, ne } from 'drizzle-orm'
import type { Venue } from '../db/schema/venues'
import type { Flight, Glass } from '../db/schema/flights'
import type { PourInput } from '../../shared/schemas/flights'
import { flightTotals, type RoomAir } from '../../shared/science'
import { drinkKindOf } from '../../shared/pours'
import type { FlightPreview, FlightView, GlassView } from '../../shared/types/flights'
import { groupedBy } from '../../shared/utils/grouped'

export interface PourSpec { productId: number, volumeMl: number, glassId: number, servingTempC: number, note?: string | null }

/**
 * Computes every pour of a flight (saved or being edited) with the glass model, and the flight's
 * totals against the venue's per-guest limit. Unknown products or glasses are a 400 on the pour.
 */
async function loadPourContext(venue: Venue, specs: PourSpec[]) {
  const products = new Map((await loadProducts(venue.id, { ids: [...new Set(specs.map(s => s.productId))] })).map(p => [p.id, p]))
  const glassIds = [...new Set(specs.map(s => s.glassId))]
  const glassRows = glassIds.length
    ? await useDb().select().from(tables.glasses).where(and(eq(tables.glasses.venueId, venue.id), inArray(tables.glasses.id, glassIds)))
    : []
  const notes = await publishedNotes(venue.id, 'product_note', [...products.keys()])
  const photos = await productPhotos(venue.id, [...products.keys()])
  const calibrations = await appliedCalibrations(venue, glassRows.map(g => g.id))
  return { products, glasses: new Map(glassRows.map(g => [g.id, g])), notes, photos, calibrations }
}
type PourContext = Awaited<ReturnType<typeof loadPourContext>>

function computeWith(venue: Venue, ctx: PourContext, specs: PourSpec[], room: RoomAir): FlightPreview {
  const fields: Record<string, string> = {}
  specs.forEach((s, i) => {
    if (!ctx.products.has(s.productId)) fields[`pours.${i}.productId`] = 'No such product.'
    if (!ctx.glasses.has(s.glassId)) fields[`pours.${i}.glassId`] = 'No such glass.'
  })
  if (Object.keys(fields).length) invalidFields(fields)

  const pours = specs.map((s, i) => {
    const p = ctx.products.get(s.productId)!
    const g = ctx.glasses.get(s.glassId)!
    const facts = pourFacts({ abvPctVol: p.current.abvPctVol, residualSugarGL: p.current.residualSugarGL, servingTempC: s.servingTempC, volumeMl: s.volumeMl, wallAngleDeg: g.wallAngleDeg, bowlDiameterMm: g.bowlDiameterMm, kind: drinkKindOf(p.kind), calibration: ctx.calibrations.get(g.id) ?? null }, venue, room)
    return {
      position: i + 1,
      productId: p.id,
      product: { code: p.code, name: p.name, kind: p.kind, producer: p.producer, vintageOrBatch: p.vintageOrBatch, colour: p.colour, allergens: p.allergens, status: p.status },
      abvPctVol: p.current.abvPctVol,
      residualSugarGL: p.current.residualSugarGL,
      measuredOn: p.current.measuredOn,
      volumeMl: s.volumeMl,
      servingTempC: s.servingTempC,
      note: s.note ?? null,
      glass: glassView(g),
      ethanolGrams: facts.ethanolGrams,
      standardDrinks: facts.standardDrinks,
      filmActivityIndex: facts.filmActivityIndex,
      film: facts.film,
      /** The product's published tasting note (drafts never reach guests or cards). */
      tastingNote: ctx.notes.get(p.id) ?? null,
      photo: ctx.photos.get(p.id) ?? null,
    }
  })
  const totals = flightTotals(pours.map(p => ({ volumeMl: p.volumeMl, abvPctVol: p.abvPctVol })), venue.standardDrinkGrams)
  return {
    pours,
    totals: {
      volumeMl: totals.volumeMl,
      ethanolGrams: totals.ethanolGrams,
      standardDrinks: totals.standardDrinks,
      limitGrams: venue.guestEthanolLimitGrams,
      overLimit: totals.ethanolGrams > venue.guestEthanolLimitGrams,
    },
  }
}

/**
 * Computes every pour of a flight (saved or being edited) with the glass model, and the flight's
 * totals against the venue's per-guest limit. Unknown products or glasses are a 400 on the pour.
 */
export async function computePours(venue: Venue, specs: PourSpec[]): Promise<FlightPreview> {
  return computeWith(venue, await loadPourContext(venue, specs), specs, venueRoom(venue).air)
}

export const glassView = (g: Glass): GlassView => ({ id: g.id, name: g.name, bowlDiameterMm: g.bowlDiameterMm, wallAngleDeg: g.wallAngleDeg, fillHeightMm: g.fillHeightMm })

/** A flight in the venue, or 404. Guests and anonymous visitors see published flights only. */
export async function loadFlight(venue: Venue, id: number, opts: { publishedOnly?: boolean } = {}): Promise<Flight> {
  const [flight] = await useDb().select().from(tables.flights).where(and(eq(tables.flights.id, id), eq(tables.flights.venueId, venue.id)))
  if (!flight || (opts.publishedOnly && flight.status !== 'published')) notFound('No such flight.')
  return flight
}

/**
 * Full views of several flights in a fixed number of queries (pours, products, glasses, sessions),
 * their pours computed in `room` (the venue's usual air unless the caller has a session's reading).
 */
export async function flightViews(venue: Venue, flights: Flight[], room: RoomAir = venueRoom(venue).air): Promise<FlightView[]> {
  if (!flights.length) return []
  const db = useDb()
  const ids = flights.map(f => f.id)
  const specs = await db.select().from(tables.flightPours).where(inArray(tables.flightPours.flightId, ids)).orderBy(asc(tables.flightPours.flightId), asc(tables.flightPours.position))
  const sessionCounts = new Map((await db.select({ flightId: tables.tastingSessions.flightId, n: count() }).from(tables.tastingSessions)
    .where(inArray(tables.tastingSessions.flightId, ids)).groupBy(tables.tastingSessions.flightId)).map(r => [r.flightId, r.n]))
  const ctx = await loadPourContext(venue, specs)
  const intros = await publishedNotes(venue.id, 'flight_intro', ids)
  const pours = groupedBy(specs, s => s.flightId)
  return flights.map((flight) => {
    const n = sessionCounts.get(flight.id) ?? 0
    return {
      id: flight.id,
      lineageId: flight.lineageId ?? flight.id,
      version: flight.version,
      name: flight.name,
      summary: flight.summary,
      /** Marketing's published introduction, as HTML and plain text. */
      intro: intros.get(flight.id) ?? null,
      status: flight.status,
      publishedAt: flight.publishedAt?.toISOString() ?? null,
      updatedAt: flight.updatedAt.toISOString(),
      sessionCount: n,
      /** Published or retired with sessions: its pours are fixed; a change needs a new version. */
      locked: flight.status !== 'draft' && n > 0,
      ...computeWith(venue, ctx, pours.get(flight.id) ?? [], room),
    }
  })
}

export async function flightView(venue: Venue, flight: Flight, room?: RoomAir): Promise<FlightView> {
  return (await flightViews(venue, [flight], room))[0]!
}

/** Replaces a draft's pours in the caller's transaction. */
export async function writePours(tx: Tx, flightId: number, pours: PourInput[]) {
  await tx.delete(tables.flightPours).where(eq(tables.flightPours.flightId, flightId))
  await tx.insert(tables.flightPours).values(pours.map((p, i) => ({
    flightId, position: i + 1, productId: p.productId, volumeMl: p.volumeMl, glassId: p.glassId, servingTempC: p.servingTempC, note: p.note ?? null,
  })))
}

/** Locks the flight row and refuses pour changes once it is published and scheduled. */
export async function lockFlightForEdit(tx: Tx, venueId: number, id: number) {
  const [flight] = await tx.select().from(tables.flights).where(and(eq(tables.flights.id, id), eq(tables.flights.venueId, venueId))).for('update')
  if (!flight) notFound('No such flight.')
  return flight
}

export async function flightSessionCount(tx: Tx, flightId: number): Promise<number> {
  const [{ n } = { n: 0 }] = await tx.select({ n: count() }).from(tables.tastingSessions).where(eq(tables.tastingSessions.flightId, flightId))
  return n
}

/**
 * Moves a flight to another status, with its row locked, and returns its view. 409 when the move
 * does not fit where the flight is:
 * - published: only a draft, and only when all its products are active. Another published version
 *   of the same flight is retired: its scheduled sessions keep it, new sessions take this one.
 * - draft (unpublish): only a published flight, and only while it has no sessions.
 * - retired: any flight not retired yet; no new sessions, those already scheduled keep it.
 */
export async function moveFlight(venue: Venue, id: number, to: 'published' | 'draft' | 'retired') {
  if (to === 'published') {
    const view = await flightView(venue, await loadFlight(venue, id))
    const retiredProducts = view.pours.filter(p => p.product.status !== 'active').map(p => p.product.name)
    if (retiredProducts.length) conflict(`Replace the retired products first: ${retiredProducts.join(', ')}.`)
  }
  await useDb().transaction(async (tx) => {
    const flight = await lockFlightForEdit(tx, venue.id, id)
    if (to === 'published') {
      if (flight.status !== 'draft') conflict(`Only a draft can be published; this flight is ${flight.status}.`)
      await tx.update(tables.flights).set({ status: 'retired' })
        .where(and(eq(tables.flights.lineageId, flight.lineageId ?? flight.id), eq(tables.flights.status, 'published'), ne(tables.flights.id, id)))
      await tx.update(tables.flights).set({ status: 'published', publishedAt: new Date() }).where(eq(tables.flights.id, id))
    }
    else if (to === 'draft') {
      if (flight.status !== 'published') conflict('Only a published flight can go back to draft.')
      if (await flightSessionCount(tx, id) > 0) conflict('This flight has sessions. Retire it instead, or make a new version.')
      await tx.update(tables.flights).set({ status: 'draft', publishedAt: null }).where(eq(tables.flights.id, id))
    }
    else {
      if (flight.status === 'retired') conflict('This flight is already retired.')
      await tx.update(tables.flights).set({ status: 'retired' }).where(eq(tables.flights.id, id))
    }
  })
  return flightView(venue, await loadFlight(venue, id))
}
