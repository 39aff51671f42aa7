import type { VenuePhoto } from '#shared/types/site'

/** The photo the venue's public pages lead with (GET /api/venue/photo), fetched once per page load. */
export function useVenuePhoto() {
  return useFetch<VenuePhoto>('/api/venue/photo', { key: 'venue-photo', dedupe: 'defer', default: () => ({ photo: null }) })
}
