import { calibrationSwitchSchema } from '../../../shared/schemas/observationAnalysis'

/** The manager turns calibrated predictions on or off for the venue; pour pages and cards follow on their next read. */
export default defineEventHandler(async (event): Promise<{ enabled: boolean }> => {
  await requireRole(event, 'manager')
  const { enabled } = await readBodyAs(event, calibrationSwitchSchema)
  const venue = await getVenue()
  await setCalibrationEnabled(venue.id, enabled)
  return { enabled }
})
