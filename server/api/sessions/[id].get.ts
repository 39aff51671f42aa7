import { and, eq } from 'drizzle-orm'
import { idParam } from '../../../shared/schemas/common'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager', 'host', 'marketing')
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  const [view] = await loadSessionViews(and(eq(tables.tastingSessions.id, id), eq(tables.tastingSessions.venueId, venue.id)), venue.timeZone)
  if (!view) notFound('No such session.')
  return view
})
