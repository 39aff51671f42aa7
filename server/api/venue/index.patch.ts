import { eq } from 'drizzle-orm'
import { venueSchema } from '../../../shared/schemas/venue'
import type { PublicVenue } from '../../../shared/types/venue'

/** The manager's venue settings, all at once: checked in full by the form's own schema before one UPDATE. */
export default defineEventHandler(async (event): Promise<PublicVenue> => {
  await requireRole(event, 'manager')
  const input = await readBodyAs(event, venueSchema)
  const venue = await getVenue()
  await useDb().update(tables.venues).set(input).where(eq(tables.venues.id, venue.id))
  const { createdAt, updatedAt, ...updated } = await getVenue()
  return updated
})
