import { and, eq, gte, lt, type SQL } from 'drizzle-orm'
import { DateTime } from 'luxon'
import { sessionListQuerySchema } from '../../../shared/schemas/sessions'

/** Sessions in a date range of the venue's calendar (staff). Dates are local to the venue. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager', 'host', 'marketing')
  const q = await readQueryAs(event, sessionListQuerySchema)
  const venue = await getVenue()
  const where: SQL[] = [eq(tables.tastingSessions.venueId, venue.id)]
  if (q.from) where.push(gte(tables.tastingSessions.startsAt, DateTime.fromISO(q.from, { zone: venue.timeZone }).startOf('day').toUTC().toJSDate()))
  if (q.to) where.push(lt(tables.tastingSessions.startsAt, DateTime.fromISO(q.to, { zone: venue.timeZone }).plus({ days: 1 }).startOf('day').toUTC().toJSDate()))
  if (q.flightId) where.push(eq(tables.tastingSessions.flightId, q.flightId))
  if (q.status) where.push(eq(tables.tastingSessions.status, q.status))
  return loadSessionViews(and(...where), venue.timeZone)
})
