import { cardJobParams } from '../../../shared/schemas/cards'
import type { CardJobView } from '../../../shared/types/host'

export default defineEventHandler(async (event): Promise<CardJobView> => {
  const user = await requireRole(event, 'host', 'manager')
  const { jobId } = await readParamsAs(event, cardJobParams)
  const job = findCardJob(jobId, user)
  return { jobId, status: job.status, done: job.done, total: job.total, error: job.error ?? null }
})
