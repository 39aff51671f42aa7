import { and, eq, ne } from 'drizzle-orm'
import { idParam } from '../../../shared/schemas/common'
import { productPatchSchema } from '../../../shared/schemas/products'

/** Changes a product's descriptive fields; lab numbers change only by adding a measurement. */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const patch = await readBodyAs(event, productPatchSchema)
  const venue = await getVenue()
  await useDb().transaction(async (tx) => {
    const [row] = await tx.select({ id: tables.products.id }).from(tables.products)
      .where(and(eq(tables.products.id, id), eq(tables.products.venueId, venue.id))).for('update')
    if (!row) notFound('No such product.')
    if (patch.code) {
      const [dup] = await tx.select({ id: tables.products.id }).from(tables.products)
        .where(and(eq(tables.products.venueId, venue.id), eq(tables.products.code, patch.code), ne(tables.products.id, id)))
      if (dup) refuseDuplicateCode(patch.code)
    }
    await tx.update(tables.products).set(patch).where(eq(tables.products.id, id))
  }).catch((err) => {
    if (isDuplicateKey(err) && patch.code) refuseDuplicateCode(patch.code)
    throw err
  })
  return productView(await loadProduct(venue.id, id, true), venue, user.role)
})
