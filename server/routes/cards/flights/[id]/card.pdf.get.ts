import { idParam } from '../../../../../shared/schemas/common'
import { cardPdfQuerySchema } from '../../../../../shared/schemas/cards'
import { cachedCardsPdf } from '../../../../cards/pdfCache'
import { venueCardPaper } from '../../../../../shared/paper'

/**
 * A flight's card as PDF, A5 or US half letter (by default the venue's paper), with the shipped Lora
 * font embedded; the same card again is the PDF kept for its content (server/cards/pdfCache.ts).
 */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager', 'host', 'marketing')
  const { id } = await readParamsAs(event, idParam)
  const query = await readQueryAs(event, cardPdfQuerySchema)
  const venue = await getVenue()
  const paper = query.paper ?? venueCardPaper(venue)
  const card = await flightCard(venue, id)
  const pdf = await cachedCardsPdf(Array.from({ length: query.copies }, () => card), { paper, fonts: await cardFonts() })
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `inline; filename="flight-${id}-${paper}.pdf"`,
    'cache-control': 'no-store',
  })
  return pdf
})
