import { and, eq } from 'drizzle-orm'
import { idParam } from '../../../shared/schemas/common'
import { sessionPatchSchema } from '../../../shared/schemas/sessions'

/** Changes a session's seats, price, host, cut-off or whether it takes bookings. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  const patch = await readBodyAs(event, sessionPatchSchema)
  const venue = await getVenue()
  if (patch.hostId !== undefined) await assertHost(venue.id, patch.hostId)
  await useDb().transaction(async (tx) => {
    const [s] = await tx.select().from(tables.tastingSessions).where(and(eq(tables.tastingSessions.id, id), eq(tables.tastingSessions.venueId, venue.id))).for('update')
    if (!s) notFound('No such session.')
    if (s.status === 'cancelled') conflict('This session is cancelled and can no longer change.')
    await tx.update(tables.tastingSessions).set(patch).where(eq(tables.tastingSessions.id, id))
  })
  const [view] = await loadSessionViews(eq(tables.tastingSessions.id, id), venue.timeZone)
  return view!
})
