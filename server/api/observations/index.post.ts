import { guestObservationSchema } from '../../../shared/observations'
import type { ObservationSaved } from '../../../shared/types/observations'

/**
 * A guest's observation of one pour, from the pour page (no sign-in). The fields are checked first
 * (400 per field, nothing written), then the bot check is spent, then the entry is stored with the
 * device's keyed hash, never the cookie, an account or an address.
 */
export default defineEventHandler(async (event): Promise<ObservationSaved> => {
  limitClient(event, 'observationPerClient', 'Too many observations from this address in the last hour; try again later.')
  const body = await readBodyAs(event, guestObservationSchema)
  const deviceKey = deviceKeyOf(event)
  if (!deviceKey) invalidFields({ challenge: 'Your browser did not keep this site’s cookie, which the form needs to count your entries. Allow cookies for this site and reload the page.' })
  await spendObservationChallenge(body.challenge.token, body.challenge.counter)
  const { flightId, position, sessionId, challenge: _c, website: _w, ...fields } = body
  const venue = await getVenue()
  await loadFlight(venue, flightId, { publishedOnly: true })
  setResponseStatus(event, 201)
  return recordObservation({ venue, flightId, position, sessionId, fields, source: 'guest', deviceKey })
})
