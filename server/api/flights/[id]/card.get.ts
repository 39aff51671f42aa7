import { idParam } from '../../../../shared/schemas/common'

/** The card data of a flight, for the print page (the PDF is made from the same data). */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager', 'host', 'marketing')
  const { id } = await readParamsAs(event, idParam)
  return flightCard(await getVenue(), id)
})
