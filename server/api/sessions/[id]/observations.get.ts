import { idParam } from '../../../../shared/schemas/common'
import type { SessionObservationPours } from '../../../../shared/types/observations'

/** The session's pours for the host's observation form, with the entries each has so far. */
export default defineEventHandler(async (event): Promise<SessionObservationPours> => {
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const { venue, session } = await requireSessionHost(event, id, 'record observations for it')
  return sessionObservationPours(venue, session)
})
