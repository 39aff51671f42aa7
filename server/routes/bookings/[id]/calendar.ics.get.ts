import { eq } from 'drizzle-orm'
import { idParam } from '../../../../shared/schemas/common'

/** The session as a calendar file, for a confirmed booking of the signed-in guest. */
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await readParamsAs(event, idParam)
  const view = await loadGuestBooking(user.id, id)
  if (view.state !== 'confirmed' && view.state !== 'checked_in') conflict('Only a confirmed booking has a calendar entry.')
  const venue = await getVenue()
  const [row] = await useDb().select({ b: tables.bookings, s: tables.tastingSessions }).from(tables.bookings)
    .innerJoin(tables.tastingSessions, eq(tables.tastingSessions.id, tables.bookings.sessionId)).where(eq(tables.bookings.id, id))
  const file = sessionCalendarFile({ venue, booking: row!.b, session: row!.s, flightName: view.session.flightName }, appLink(`/bookings/${id}`))
  setResponseHeader(event, 'content-type', 'text/calendar; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="${file.filename}"`)
  return Buffer.from(file.contentBase64, 'base64').toString('utf8')
})
