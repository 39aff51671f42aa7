import { DateTime } from 'luxon'
import { hostDayQuerySchema } from '../../../shared/schemas/host'

/** The host's day: sessions of a venue-local date (today by default) with every party. */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'host', 'manager')
  const { date } = await readQueryAs(event, hostDayQuerySchema)
  const venue = await getVenue()
  return hostDay(venue, user, date ?? DateTime.now().setZone(venue.timeZone).toISODate()!)
})
