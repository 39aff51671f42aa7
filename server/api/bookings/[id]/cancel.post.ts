import { idParam } from '../../../../shared/schemas/common'

/** A guest cancels their paid booking before the venue's cut-off; the refund is made at once. */
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await readParamsAs(event, idParam)
  await cancelByGuest(user, id)
  return loadGuestBooking(user.id, id)
})
