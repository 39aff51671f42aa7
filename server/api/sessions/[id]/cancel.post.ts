import { idParam } from '../../../../shared/schemas/common'

/** The manager cancels a session: every paid booking is refunded and told, holds are released. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const venue = await getVenue()
  return cancelTastingSession(venue, id)
})
