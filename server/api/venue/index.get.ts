import type { PublicVenue } from '../../../shared/types/venue'

/** The venue's public settings (units, zone, currency, cautions); anyone may read them. */
export default defineEventHandler(async (): Promise<PublicVenue> => {
  const { createdAt, updatedAt, ...venue } = await getVenue()
  return venue
})
