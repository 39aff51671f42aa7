import { dayParams } from '../../../shared/schemas/host'

/** The host's day: sessions of a venue-local date with every party. */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'host', 'manager')
  const { date } = await readParamsAs(event, dayParams)
  return hostDay(await getVenue(), user, date)
})
