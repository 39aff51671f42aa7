import { OBSERVATION_PAGE_SIZE, observationListQuerySchema } from '../../../shared/schemas/observationAnalysis'
import type { ObservationPage } from '../../../shared/types/observationAnalysis'

/** The venue's observations under the manager's filters, newest first, a page at a time. */
export default defineEventHandler(async (event): Promise<ObservationPage> => {
  await requireRole(event, 'manager')
  const { page, ...filters } = await readQueryAs(event, observationListQuerySchema)
  const venue = await getVenue()
  const [rows, total] = await Promise.all([
    loadObservationRows(venue, filters, { limit: OBSERVATION_PAGE_SIZE, offset: (page - 1) * OBSERVATION_PAGE_SIZE }),
    countObservations(venue, filters),
  ])
  return { rows, page, pageSize: OBSERVATION_PAGE_SIZE, total }
})
