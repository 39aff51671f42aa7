/** The signed-in person's own bookings, newest session first. */
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  return loadGuestBookings(user.id)
})
