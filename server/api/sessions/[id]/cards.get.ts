import { idParam } from '../../../../shared/schemas/common'
import type { SessionCards } from '../../../../shared/types/cards'

/** Every seated guest's card for one session, for the print page (the PDF uses the same data). */
export default defineEventHandler(async (event): Promise<SessionCards> => {
  // The role first, before the address or the body is read: a stranger learns nothing from them.
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const { venue, session } = await requireSessionHost(event, id)
  const names = getQuery(event).names !== '0'
  return { sessionId: id, cards: await sessionCards(venue, session, names) }
})
