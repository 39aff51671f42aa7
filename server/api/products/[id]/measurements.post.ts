import { and, eq } from 'drizzle-orm'
import { idParam } from '../../../../shared/schemas/common'
import { measurementSchema } from '../../../../shared/schemas/products'

/** Records a new lab measurement; the old ones stay as history. */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const m = await readBodyAs(event, measurementSchema)
  const venue = await getVenue()
  const [product] = await useDb().select({ id: tables.products.id }).from(tables.products)
    .where(and(eq(tables.products.id, id), eq(tables.products.venueId, venue.id)))
  if (!product) notFound('No such product.')
  await useDb().insert(tables.productMeasurements).values({ ...m, notes: m.notes ?? null, productId: id })
  setResponseStatus(event, 201)
  return productView(await loadProduct(venue.id, id, true), venue, user.role)
})
