import { z } from 'zod'
import type { PourObservations } from '../../../../../../shared/types/observations'

const params = z.object({
  id: z.coerce.number({ error: 'The flight id must be a number.' }).int().positive({ error: 'The flight id must be positive.' }),
  position: z.coerce.number({ error: 'The pour number must be a number.' }).int().min(1, { error: 'Pours are numbered from 1.' }).max(8, { error: 'A flight has at most 8 pours.' }),
})
const query = z.object({
  s: z.coerce.number({ error: 'The session id must be a number.' }).int().positive({ error: 'The session id must be positive.' }).optional(),
})

/**
 * How a pour's glasses compared with the model (public, aggregated only): the predicted ranges,
 * other people's readings in bins, and this device's own newest entry. Nothing names anyone.
 */
export default defineEventHandler(async (event): Promise<PourObservations> => {
  const { id, position } = await readParamsAs(event, params)
  const { s } = await readQueryAs(event, query)
  return pourObservations(await getVenue(), id, position, s ?? null, deviceKeyOf(event))
})
