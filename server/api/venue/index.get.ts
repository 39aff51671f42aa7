/** The venue's public settings (units, zone, currency, cautions); anyone may read them. */
export default defineEventHandler(async () => {
  const { createdAt, updatedAt, ...venue } = await getVenue()
  return venue
})
