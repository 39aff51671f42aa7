import type { PublicVenue } from '../../../shared/types/venue'

/** The venue's public settings (units, zone, currency, cautions); anyone may read them. Read from the database each time (the pages' own copy, not the process's 2 s one). */
export default defineEventHandler(async (): Promise<PublicVenue> => {
  const { createdAt, updatedAt, ...venue } = await getVenue({ fresh: true })
  return venue
})
