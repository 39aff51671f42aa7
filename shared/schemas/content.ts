import { z } from './zod'
import { CONTENT_KINDS } from '../content'

export const contentParams = z.object({
  kind: z.enum(CONTENT_KINDS, { error: `The kind must be one of: ${CONTENT_KINDS.join(', ')}.` }),
  subject: z.string().min(1).max(80).regex(/^[\w-]+$/, { error: 'Not a valid product, flight or article.' }),
})

export const contentSaveSchema = z.object({
  title: z.string({ error: 'The title must be text.' }).trim().max(200, { error: 'Use at most 200 characters for the title.' }).optional(),
  body: z.string({ error: 'Write the text in Markdown.' }).max(50_000, { error: 'Keep it under 50,000 characters.' }),
})

export const contentRestoreSchema = z.object({ revisionId: z.number({ error: 'Choose a revision.' }).int().positive({ error: 'Choose a revision.' }) })
