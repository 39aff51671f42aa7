import { and, eq, ne } from 'drizzle-orm'
import { idParam } from '../../../shared/schemas/common'
import { glassSchema } from '../../../shared/schemas/flights'

/** Edits a glass shape; every flight poured into it picks up the new shape on its next read. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const input = await readBodyAs(event, glassSchema)
  const venue = await getVenue()
  const db = useDb()
  const [glass] = await db.select().from(tables.glasses).where(and(eq(tables.glasses.id, id), eq(tables.glasses.venueId, venue.id)))
  if (!glass) notFound('No such glass.')
  const [dup] = await db.select({ id: tables.glasses.id }).from(tables.glasses).where(and(eq(tables.glasses.venueId, venue.id), eq(tables.glasses.name, input.name), ne(tables.glasses.id, id)))
  if (dup) conflict('A glass with this name exists.', { fields: { name: 'A glass with this name exists.' } })
  await db.update(tables.glasses).set(input).where(eq(tables.glasses.id, id))
  const [updated] = await db.select().from(tables.glasses).where(eq(tables.glasses.id, id))
  return glassView(updated!)
})
