import { eq } from 'drizzle-orm'
import { idParam } from '../../../../shared/schemas/common'
import { roomReadingSchema } from '../../../../shared/schemas/room'
import type { SessionRoomReading } from '../../../../shared/types/host'

/**
 * The host's reading of the room for a session, on the session's day: relative humidity (%) and
 * the air temperature (°C on the wire; the range is told in the venue's unit). A newer reading
 * replaces the last. Cards printed after it assume this air.
 */
export default defineEventHandler(async (event): Promise<SessionRoomReading> => {
  // The role first, before the address or the body is read: a stranger learns nothing from them.
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const { user, venue, session } = await requireSessionHost(event, id, 'read the room for it')
  const reading = await readBodyAs(event, roomReadingSchema(venue.temperatureUnit))
  assertRoomReadingDay(session, venue)
  const readAt = new Date()
  await useDb().update(tables.tastingSessions)
    .set({ roomHumidityPct: reading.relativeHumidityPct, roomAirTempC: reading.airTempC, roomReadAt: readAt, roomReadBy: user.id })
    .where(eq(tables.tastingSessions.id, id))
  return { sessionId: id, relativeHumidityPct: reading.relativeHumidityPct, airTempC: reading.airTempC, readAt: readAt.toISOString(), readByName: user.name }
})
