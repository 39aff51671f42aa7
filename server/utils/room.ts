import type { CardRoomInput } from '../../shared/cards'
import type { TastingSession } from '../db/schema/sessions'
import type { Venue } from '../db/schema/venues'

/** The venue's usual room air (venue settings): what every pour assumes unless a session has its own reading. */
export function venueRoom(venue: Pick<Venue, 'roomHumidityPct' | 'roomAirTempC'>): CardRoomInput {
  return { air: { relativeHumidityPct: venue.roomHumidityPct, airTempC: venue.roomAirTempC }, source: 'venue', readAt: null }
}

/** The host's reading for this session if there is one, else the venue's usual air. */
export function sessionRoom(venue: Pick<Venue, 'roomHumidityPct' | 'roomAirTempC'>, session: Pick<TastingSession, 'roomHumidityPct' | 'roomAirTempC' | 'roomReadAt'>): CardRoomInput {
  if (session.roomHumidityPct === null || session.roomAirTempC === null) return venueRoom(venue)
  return { air: { relativeHumidityPct: session.roomHumidityPct, airTempC: session.roomAirTempC }, source: 'session', readAt: session.roomReadAt }
}
