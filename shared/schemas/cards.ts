import { z } from './zod'
import { CARD_PAPERS } from '../paper'

export const cardPdfQuerySchema = z.object({
  /** Left out: the venue's paper (shared/paper.ts venueCardPaper). */
  paper: z.enum(CARD_PAPERS, { error: 'Paper must be a5 or half-letter.' }).optional(),
  copies: z.coerce.number({ error: 'Copies must be a number.' }).int({ error: 'Copies must be a whole number.' }).min(1, { error: 'Print 1 to 60 copies.' }).max(60, { error: 'Print 1 to 60 copies.' }).default(1),
})

export const sessionCardsSchema = z.object({
  /** Left out: the venue's paper (shared/paper.ts venueCardPaper). */
  paper: z.enum(CARD_PAPERS, { error: 'Paper must be a5 or half-letter.' }).optional(),
  names: z.boolean({ error: 'Say whether to print names.' }).default(true),
})
export const cardJobParams = z.object({ jobId: z.string().uuid({ error: 'Not a print job.' }) })
