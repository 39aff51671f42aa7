import type { ManagerOverview } from '../../../shared/types/reports'

/** The manager's first screen: today, the coming week, the week's takings, stuck mail, people and products. */
export default defineEventHandler(async (event): Promise<ManagerOverview> => {
  await requireRole(event, 'manager')
  return managerOverview(await getVenue())
})
