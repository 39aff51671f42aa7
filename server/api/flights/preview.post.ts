import { flightPreviewSchema } from '../../../shared/schemas/flights'

/** The builder's live figures for pours as they stand, saved or not. Writes nothing. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { pours } = await readBodyAs(event, flightPreviewSchema)
  return computePours(await getVenue(), pours)
})
