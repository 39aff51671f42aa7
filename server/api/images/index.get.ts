import { and, asc, eq, isNull } from 'drizzle-orm'
import { z } from 'zod'

/** `?productId=` for a product's images, or `?of=venue` for the venue's own photos (no product). */
const query = z.object({
  productId: z.coerce.number({ error: 'productId must be a number.' }).int().positive().optional(),
  of: z.enum(['venue'], { error: 'of can only be venue.' }).optional(),
}).refine(q => (q.productId === undefined) !== (q.of === undefined), { path: ['productId'], error: 'Give a productId, or of=venue for the venue\'s own photos.' })

/** A product's images, or the venue's own photos of the room (staff). */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager', 'marketing', 'host')
  const q = await readQueryAs(event, query)
  const venue = await getVenue()
  const i = tables.images
  const rows = await useDb().select().from(i)
    .where(and(eq(i.venueId, venue.id), q.productId === undefined ? isNull(i.productId) : eq(i.productId, q.productId)))
    .orderBy(asc(i.id))
  return rows.map(imageView)
})
