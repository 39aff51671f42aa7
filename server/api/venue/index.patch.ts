import { venueSchema } from '../../../shared/schemas/venue'
import type { PublicVenue } from '../../../shared/types/venue'

/** The manager's venue settings, all at once: checked in full by the form's own schema before one UPDATE. */
export default defineEventHandler(async (event): Promise<PublicVenue> => {
  await requireRole(event, 'manager')
  const input = await readBodyAs(event, venueSchema)
  const venue = await getVenue()
  await updateVenue(venue.id, input)
  const { createdAt, updatedAt, ...updated } = await getVenue()
  return updated
})
