import { idParam } from '../../../shared/schemas/common'

/** One product with its whole measurement history, newest first. */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'manager', 'host', 'marketing')
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  return productView(await loadProduct(venue.id, id, true), venue, user.role)
})
