import { idParam } from '../../../shared/schemas/common'

export default defineEventHandler(async (event) => {
  const { id } = await readParamsAs(event, idParam)
  const isStaff = isStaffRole((await optionalUser(event))?.role)
  const venue = await getVenue()
  return flightView(venue, await loadFlight(venue, id, { publishedOnly: !isStaff }))
})
