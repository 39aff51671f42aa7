import { observationFilterSchema } from '../../../shared/schemas/observationAnalysis'
import type { ObservationSummary } from '../../../shared/types/observationAnalysis'

/** Predicted against observed for the manager: counts, agreement, the charts' data, outliers and the calibration. */
export default defineEventHandler(async (event): Promise<ObservationSummary> => {
  await requireRole(event, 'manager')
  const filters = await readQueryAs(event, observationFilterSchema)
  return observationSummary(await getVenue(), filters)
})
