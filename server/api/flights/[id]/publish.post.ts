import { idParam } from '../../../../shared/schemas/common'

/** Publishes a draft whose products are all active; an older published version is retired (moveFlight). */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  return moveFlight(await getVenue(), id, 'published')
})
