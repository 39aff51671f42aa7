import { idParam } from '../../../shared/schemas/common'

/** One of the signed-in person's bookings; someone else's is a 404 like a missing one. */
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await readParamsAs(event, idParam)
  return loadGuestBooking(user.id, id)
})
