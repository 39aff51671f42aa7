/** Every product of the venue with its current measurement and derived figures (staff only). */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'manager', 'host', 'marketing')
  const venue = await getVenue()
  const rows = await loadProducts(venue.id)
  return rows.map(p => productView(p, venue, user.role)).sort((a, b) => a.name.localeCompare(b.name))
})
