import { idParam } from '../../../../shared/schemas/common'

/** Retires a flight: no new sessions; those already scheduled keep it (moveFlight). */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  return moveFlight(await getVenue(), id, 'retired')
})
