import { and, asc, eq } from 'drizzle-orm'
import { z } from 'zod'

const query = z.object({ productId: z.coerce.number({ error: 'productId must be a number.' }).int().positive() })

/** A product's images (staff). */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager', 'marketing', 'host')
  const { productId } = await readQueryAs(event, query)
  const venue = await getVenue()
  const rows = await useDb().select().from(tables.images).where(and(eq(tables.images.venueId, venue.id), eq(tables.images.productId, productId))).orderBy(asc(tables.images.id))
  return rows.map(imageView)
})
