import { and, asc, count, desc, eq, inArray, like, or, sql, type SQL } from 'drizzle-orm'
import type { Product, ProductMeasurement } from '../db/schema/products'
import type { Venue } from '../db/schema/venues'
import type { Role } from '../../shared/roles'
import { DEFAULT_TASTING_POUR_ML, drinkKindOf } from '../../shared/pours'
import { GLASS_PAGE_PRODUCTS_MAX } from '../../shared/products'
import type { MeasurementView, ProductListItem, ProductPage, ProductView } from '../../shared/types/products'
import type { ProductListQuery } from '../../shared/schemas/products'

export interface ProductWithMeasurement extends Product { current: ProductMeasurement }

/**
 * Products of the venue with their current (newest) measurement, in one query pair (no N+1).
 * `ids` limits the set; a product without any measurement cannot exist (created with one).
 */
export async function loadProducts(venueId: number, opts: { ids?: number[], history?: boolean } = {}): Promise<(ProductWithMeasurement & { history?: ProductMeasurement[] })[]> {
  const db = useDb()
  if (opts.ids && opts.ids.length === 0) return []
  const rows = await db.select().from(tables.products)
    .where(opts.ids ? and(eq(tables.products.venueId, venueId), inArray(tables.products.id, opts.ids)) : eq(tables.products.venueId, venueId))
  if (!rows.length) return []
  const measurements = await db.select().from(tables.productMeasurements)
    .where(inArray(tables.productMeasurements.productId, rows.map(r => r.id)))
    .orderBy(desc(tables.productMeasurements.measuredOn), desc(tables.productMeasurements.id))
  const byProduct = new Map<number, ProductMeasurement[]>()
  for (const m of measurements) {
    const list = byProduct.get(m.productId) ?? []
    list.push(m)
    byProduct.set(m.productId, list)
  }
  return rows.flatMap((p) => {
    const list = byProduct.get(p.id)
    if (!list?.[0]) return []
    return [{ ...p, current: list[0], ...(opts.history ? { history: list } : {}) }]
  })
}

/**
 * The products the public glass page explains: the active ones poured in the venue's published
 * flights (what a guest can taste here), or, with no flight published, its active products; at most
 * GLASS_PAGE_PRODUCTS_MAX either way, so a venue with a large catalogue still gets a page of a size a
 * guest reads (and the server computes a bounded number of pours).
 */
export async function glassPageProducts(venueId: number): Promise<ProductWithMeasurement[]> {
  const db = useDb()
  const p = tables.products
  const poured = await db.selectDistinct({ id: p.id }).from(tables.flightPours)
    .innerJoin(tables.flights, eq(tables.flights.id, tables.flightPours.flightId))
    .innerJoin(p, eq(p.id, tables.flightPours.productId))
    .where(and(eq(tables.flights.venueId, venueId), eq(tables.flights.status, 'published'), eq(p.status, 'active')))
    .orderBy(asc(p.id)).limit(GLASS_PAGE_PRODUCTS_MAX)
  const ids = poured.length
    ? poured
    : await db.select({ id: p.id }).from(p).where(and(eq(p.venueId, venueId), eq(p.status, 'active'))).orderBy(asc(p.id)).limit(GLASS_PAGE_PRODUCTS_MAX)
  return loadProducts(venueId, { ids: ids.map(r => r.id) })
}

export async function loadProduct(venueId: number, id: number, history = false) {
  const [p] = await loadProducts(venueId, { ids: [id], history })
  if (!p) notFound('No such product.')
  return p
}

/**
 * The API's view of a product: its fields, its current measurement and what the glass model
 * derives from them for a default tasting pour at the product's serving temperature, in the venue's
 * usual room air. The cost is
 * shown to managers only.
 */
export function productView(p: ProductWithMeasurement & { history?: ProductMeasurement[] }, venue: Venue, role: Role): ProductView {
  const pourMl = DEFAULT_TASTING_POUR_ML[p.kind]
  const facts = pourFacts({ abvPctVol: p.current.abvPctVol, residualSugarGL: p.current.residualSugarGL, servingTempC: p.servingTempC, volumeMl: pourMl, kind: drinkKindOf(p.kind) }, venue, venueRoom(venue).air)
  const strip = (m: ProductMeasurement): MeasurementView => ({ id: m.id, abvPctVol: m.abvPctVol, residualSugarGL: m.residualSugarGL, lab: m.lab, method: m.method, measuredOn: m.measuredOn, notes: m.notes, recordedAt: m.createdAt.toISOString() })
  return {
    id: p.id,
    code: p.code,
    kind: p.kind,
    name: p.name,
    producer: p.producer,
    vintageOrBatch: p.vintageOrBatch,
    colour: p.colour,
    servingTempC: p.servingTempC,
    allergens: p.allergens,
    bottleSizeMl: p.bottleSizeMl,
    costPerBottleMinor: role === 'manager' ? p.costPerBottleMinor : null,
    status: p.status,
    updatedAt: p.updatedAt.toISOString(),
    current: strip(p.current),
    history: p.history?.map(strip),
    derived: {
      tastingPourMl: pourMl,
      ethanolGramsPerPour: facts.ethanolGrams,
      standardDrinksPerPour: facts.standardDrinks,
      filmActivityIndex: facts.filmActivityIndex,
      tearsExpected: facts.film.predictions.tearsExpected,
      predictions: facts.film.predictions,
      room: facts.film.inputs.room,
    },
  }
}

/** `LIKE` text that matches `text` literally anywhere (its % and _ are escaped). */
const containing = (text: string) => `%${text.replace(/[\\%_]/g, c => `\\${c}`)}%`

/**
 * One page of the venue's catalogue under the list's filters, sorted in the database, and the film
 * model run for that page only. A sort by ABV or sugar joins each product's current measurement
 * (the newest by measured date, then id: the same rule as `loadProducts`).
 */
export async function listProducts(venue: Venue, query: ProductListQuery, role: Role): Promise<ProductPage> {
  const db = useDb()
  const p = tables.products
  const m = tables.productMeasurements
  const where: SQL[] = [eq(p.venueId, venue.id)]
  if (query.status !== 'all') where.push(eq(p.status, query.status))
  if (query.kind) where.push(eq(p.kind, query.kind))
  if (query.ids) where.push(inArray(p.id, query.ids))
  if (query.q) {
    const words = query.q.split(/\s+/).slice(0, 6)
    for (const w of words) where.push(or(like(p.name, containing(w)), like(p.producer, containing(w)), like(p.code, containing(w)), like(p.vintageOrBatch, containing(w)))!)
  }
  const filter = and(...where)
  const dir = query.dir === 'desc' ? desc : asc
  const byMeasurement = query.sort === 'abv' || query.sort === 'sugar'
  const column = { name: p.name, code: p.code, kind: p.kind, temp: p.servingTempC, status: p.status, updated: p.updatedAt, abv: m.abvPctVol, sugar: m.residualSugarGL }[query.sort]
  const order = [dir(column), asc(p.name), asc(p.id)]
  const offset = (query.page - 1) * query.pageSize
  const pageIds = byMeasurement
    ? db.select({ id: p.id }).from(p)
        .innerJoin(m, eq(m.id, sql`(select c.id from ${m} c where c.product_id = ${p.id} order by c.measured_on desc, c.id desc limit 1)`))
        .where(filter).orderBy(...order).limit(query.pageSize).offset(offset)
    : db.select({ id: p.id }).from(p).where(filter).orderBy(...order).limit(query.pageSize).offset(offset)
  const [ids, [matched], byStatus] = await Promise.all([
    pageIds,
    db.select({ n: count() }).from(p).where(filter),
    db.select({ status: p.status, n: count() }).from(p).where(eq(p.venueId, venue.id)).groupBy(p.status),
  ])
  const rows = new Map((await loadProducts(venue.id, { ids: ids.map(r => r.id) })).map(r => [r.id, r]))
  const items = ids.flatMap(({ id }) => {
    const row = rows.get(id)
    return row ? [productListItem(productView(row, venue, role))] : []
  })
  const counts = { active: 0, retired: 0 }
  for (const r of byStatus) counts[r.status] = r.n
  return { items, page: query.page, pageSize: query.pageSize, total: matched?.n ?? 0, counts }
}

/** A product's list row: the view without the model's whole prediction (its curves and ranges). */
function productListItem(view: ProductView): ProductListItem {
  const { history: _history, derived: { predictions: _predictions, room: _room, ...derived }, ...rest } = view
  return { ...rest, derived }
}

/** 409 on the code field: another product of the venue has it. */
export function refuseDuplicateCode(code: string): never {
  conflict(`Another product already uses the code ${code}.`, { fields: { code: 'Another product already uses this code.' } })
}
