import { idParam } from '../../../../shared/schemas/common'
import { hostObservationSchema, sessionTie } from '../../../../shared/observations'
import type { ObservationSaved } from '../../../../shared/types/observations'

/**
 * The host's observation of one pour at their session, with their own reading of the room's
 * humidity and air temperature. Only the session's host or a manager; from 2 h before its start to
 * 6 h after its end (409 otherwise). No device key: staff are not limited per device.
 */
export default defineEventHandler(async (event): Promise<ObservationSaved> => {
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const { venue, session } = await requireSessionHost(event, id, 'record observations for it')
  const { position, relativeHumidityPct, airTempC, ...fields } = await readBodyAs(event, hostObservationSchema(venue.temperatureUnit))
  if (sessionTie(session, session.flightId, new Date()) !== 'matched') conflict('Record a session’s glasses from 2 hours before it starts to 6 hours after it ends.')
  setResponseStatus(event, 201)
  return recordObservation({ venue, flightId: session.flightId, position, sessionId: session.id, fields, source: 'host', deviceKey: null, hostReading: { relativeHumidityPct, airTempC } })
})
