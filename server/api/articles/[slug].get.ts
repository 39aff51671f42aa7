import { z } from 'zod'
import { renderMarkdown } from '../../../shared/markdown'
import type { ArticleView } from '../../../shared/types/content'

const params = z.object({ slug: z.string().regex(/^[\w-]{1,80}$/, { error: 'Not a valid article.' }) })

/** One published article as HTML (raw HTML off, safe links only). Drafts never show here. */
export default defineEventHandler(async (event): Promise<ArticleView> => {
  const { slug } = await readParamsAs(event, params)
  const venue = await getVenue()
  const subject = await resolveSubject(venue.id, 'article', slug)
  const doc = await findDoc(useDb(), venue.id, 'article', subject)
  const body = doc ? (doc.status === 'published' ? doc.publishedBody : null) : subject.default!.body
  if (!body) notFound('No such article.')
  return { slug, title: doc?.publishedTitle || subject.default!.title, summary: subject.default!.summary, html: renderMarkdown(body) }
})
