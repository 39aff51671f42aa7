import { eq } from 'drizzle-orm'
import { venueSchema } from '../../../shared/schemas/venue'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const input = await readBodyAs(event, venueSchema)
  const venue = await getVenue()
  await useDb().update(tables.venues).set(input).where(eq(tables.venues.id, venue.id))
  const { createdAt, updatedAt, ...updated } = await getVenue()
  return updated
})
