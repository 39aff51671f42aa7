import { idParam } from '../../../../shared/schemas/common'
import { sessionCardsSchema } from '../../../../shared/schemas/cards'
import type { CardJobStarted } from '../../../../shared/types/host'
import { venueCardPaper } from '../../../../shared/paper'

/** Starts one PDF of a session's cards (one per seated guest); poll the job for progress. */
export default defineEventHandler(async (event): Promise<CardJobStarted> => {
  // The role first, before the address or the body is read: a stranger learns nothing from them.
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const body = await readBodyAs(event, sessionCardsSchema)
  const { user, venue, session } = await requireSessionHost(event, id)
  const paper = body.paper ?? venueCardPaper(venue)
  const cards = await sessionCards(venue, session, body.names)
  if (!cards.length) conflict('Nobody is booked or seated in this session yet.')
  const job = startCardJob(user.id, cards, paper, `session-${id}-cards-${paper}.pdf`)
  setResponseStatus(event, 202)
  return { jobId: job.id, total: job.total }
})
