import { idParam } from '../../../../shared/schemas/common'
import type { SessionCards } from '../../../../shared/types/cards'

/** Every seated guest's card for one session, for the print page (the PDF uses the same data). */
export default defineEventHandler(async (event): Promise<SessionCards> => {
  const { id } = await readParamsAs(event, idParam)
  const { venue, session } = await requireSessionHost(event, id)
  const names = getQuery(event).names !== '0'
  return { sessionId: id, cards: await sessionCards(venue, session, names) }
})
