import { and, eq } from 'drizzle-orm'
import type { ContentList, ContentListState } from '../../../shared/types/content'

/** What marketing can write: articles, each product's note, each flight's introduction, with state. */
export default defineEventHandler(async (event): Promise<ContentList> => {
  await requireRole(event, 'manager', 'marketing')
  const venue = await getVenue()
  const db = useDb()
  const docs = await db.select().from(tables.contentDocs).where(eq(tables.contentDocs.venueId, venue.id))
  const key = (kind: string, id: number | string | null) => `${kind}:${id}`
  const byKey = new Map(docs.map(d => [key(d.kind, d.kind === 'article' ? d.slug : d.subjectId), d]))
  const state = (kind: string, id: number | string): ContentListState => {
    const d = byKey.get(key(kind, id))
    if (!d) return kind === 'article' ? 'default' : 'none'
    return d.status === 'published' ? (d.draftBody !== d.publishedBody ? 'published-with-changes' : 'published') : 'draft'
  }
  const products = await db.select({ id: tables.products.id, name: tables.products.name, status: tables.products.status }).from(tables.products).where(eq(tables.products.venueId, venue.id))
  const flights = await db.select({ id: tables.flights.id, name: tables.flights.name, version: tables.flights.version, status: tables.flights.status }).from(tables.flights).where(and(eq(tables.flights.venueId, venue.id)))
  return {
    articles: [...(await articleDefaults()).values()].map(a => ({ subject: a.slug, name: byKey.get(key('article', a.slug))?.title || a.title, state: state('article', a.slug) })),
    productNotes: products.filter(p => p.status === 'active').sort((a, b) => a.name.localeCompare(b.name)).map(p => ({ subject: String(p.id), name: p.name, state: state('product_note', p.id) })),
    flightIntros: flights.filter(f => f.status !== 'retired').map(f => ({ subject: String(f.id), name: `${f.name} (v${f.version}, ${f.status})`, state: state('flight_intro', f.id) })),
  }
})
