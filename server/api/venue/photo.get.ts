import type { VenuePhoto } from '../../../shared/types/site'

/** The photo the venue's public pages lead with (server/utils/venuePhoto.ts). Anyone may read it. */
export default defineEventHandler(async (): Promise<VenuePhoto> => {
  const venue = await getVenue()
  return { photo: await venuePhoto(venue.id) }
})
