import { and, eq } from 'drizzle-orm'
import { glassSchema } from '../../../shared/schemas/flights'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const input = await readBodyAs(event, glassSchema)
  const venue = await getVenue()
  const [dup] = await useDb().select({ id: tables.glasses.id }).from(tables.glasses).where(and(eq(tables.glasses.venueId, venue.id), eq(tables.glasses.name, input.name)))
  if (dup) conflict('A glass with this name exists.', { fields: { name: 'A glass with this name exists.' } })
  const [row] = await useDb().insert(tables.glasses).values({ ...input, venueId: venue.id }).$returningId()
  const [glass] = await useDb().select().from(tables.glasses).where(eq(tables.glasses.id, row!.id))
  setResponseStatus(event, 201)
  return glassView(glass!)
})
