import { asc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager', 'host', 'marketing')
  const venue = await getVenue()
  const rows = await useDb().select().from(tables.glasses).where(eq(tables.glasses.venueId, venue.id)).orderBy(asc(tables.glasses.name))
  return rows.map(glassView)
})
