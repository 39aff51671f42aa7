import { cardJobParams } from '../../../../../shared/schemas/cards'

/** The finished PDF of a print job. */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'host', 'manager')
  const { jobId } = await readParamsAs(event, cardJobParams)
  const job = findCardJob(jobId, user)
  if (job.status !== 'done' || !job.pdf) conflict(job.status === 'failed' ? `The cards could not be made: ${job.error}` : `Still making the cards: ${job.done} of ${job.total}.`)
  setResponseHeaders(event, { 'content-type': 'application/pdf', 'content-disposition': `attachment; filename="${job.fileName}"`, 'cache-control': 'no-store' })
  return job.pdf
})
