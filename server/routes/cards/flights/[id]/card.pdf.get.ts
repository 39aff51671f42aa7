import { idParam } from '../../../../../shared/schemas/common'
import { cardPdfQuerySchema } from '../../../../../shared/schemas/cards'
import { renderCardsPdf } from '../../../../cards/cardPdf'

/** A flight's card as PDF, A5 or US half letter, with the shipped Lora font embedded. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager', 'host', 'marketing')
  const { id } = await readParamsAs(event, idParam)
  const { paper, copies } = await readQueryAs(event, cardPdfQuerySchema)
  const card = await flightCard(await getVenue(), id)
  const pdf = await renderCardsPdf(Array.from({ length: copies }, () => card), { paper, fonts: await cardFonts() })
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `inline; filename="flight-${id}-${paper}.pdf"`,
    'cache-control': 'no-store',
  })
  return pdf
})
