import { and, eq } from 'drizzle-orm'
import { productCreateSchema } from '../../../shared/schemas/products'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'manager')
  const { measurement, ...fields } = await readBodyAs(event, productCreateSchema)
  const venue = await getVenue()
  const id = await useDb().transaction(async (tx) => {
    const [dup] = await tx.select({ id: tables.products.id }).from(tables.products)
      .where(and(eq(tables.products.venueId, venue.id), eq(tables.products.code, fields.code))).for('update')
    if (dup) refuseDuplicateCode(fields.code)
    const [row] = await tx.insert(tables.products).values({ ...fields, venueId: venue.id }).$returningId()
    await tx.insert(tables.productMeasurements).values({ ...measurement, notes: measurement.notes ?? null, productId: row!.id })
    return row!.id
  }).catch((err) => {
    if (isDuplicateKey(err)) refuseDuplicateCode(fields.code)
    throw err
  })
  setResponseStatus(event, 201)
  return productView(await loadProduct(venue.id, id, true), venue, user.role)
})
