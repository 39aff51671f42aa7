import { idParam } from '../../../../shared/schemas/common'

/** Takes a published flight back to draft, only while it has no sessions (moveFlight). */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { id } = await readParamsAs(event, idParam)
  return moveFlight(await getVenue(), id, 'draft')
})
