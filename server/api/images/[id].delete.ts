import { and, eq } from 'drizzle-orm'
import { idParam } from '../../../shared/schemas/common'

/** Deletes an image: the database row and the stored file with its resized copies. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager', 'marketing')
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  const [row] = await useDb().select().from(tables.images).where(and(eq(tables.images.id, id), eq(tables.images.venueId, venue.id)))
  if (!row) notFound('No such image.')
  await useDb().delete(tables.images).where(eq(tables.images.id, id))
  await removeImageFiles(row.storedName)
  return { ok: true }
})
