import { and, eq } from 'drizzle-orm'
import type { ArticleSummary } from '../../../shared/types/content'

/** Published articles for guests: the edited copy when there is one, else the shipped default. */
export default defineEventHandler(async (): Promise<ArticleSummary[]> => {
  const venue = await getVenue()
  const docs = await useDb().select().from(tables.contentDocs).where(and(eq(tables.contentDocs.venueId, venue.id), eq(tables.contentDocs.kind, 'article')))
  const bySlug = new Map(docs.map(d => [d.slug, d]))
  return [...(await articleDefaults()).values()].flatMap((def) => {
    const doc = bySlug.get(def.slug)
    if (doc && (doc.status !== 'published' || !doc.publishedBody)) return []
    return [{ slug: def.slug, title: doc?.publishedTitle || def.title, summary: def.summary }]
  })
})
