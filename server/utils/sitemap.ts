import { and, eq, max } from 'drizzle-orm'
import type { Venue } from '../db/schema/venues'

/** One page for search engines: its path and when what it shows last changed. */
export interface SitemapEntry { path: string, lastmod: Date }

const newest = (...dates: (Date | null | undefined)[]) => new Date(Math.max(0, ...dates.filter((d): d is Date => d instanceof Date).map(d => d.getTime())))

/**
 * The venue's public pages: home, the flights list, each published flight, the glass page, the
 * articles list and each published article (an edited copy when published, else the shipped
 * text). Drafts, retired flights and staff pages are never listed.
 */
export async function sitemapEntries(venue: Venue): Promise<SitemapEntry[]> {
  const db = useDb()
  const f = tables.flights
  const docs = tables.contentDocs
  const [flights, intros, articleDocs, [products], [measured], [photos], sessions] = await Promise.all([
    db.select({ id: f.id, updatedAt: f.updatedAt, publishedAt: f.publishedAt }).from(f).where(and(eq(f.venueId, venue.id), eq(f.status, 'published'))),
    db.select({ subjectId: docs.subjectId, publishedAt: docs.publishedAt }).from(docs).where(and(eq(docs.venueId, venue.id), eq(docs.kind, 'flight_intro'), eq(docs.status, 'published'))),
    db.select().from(docs).where(and(eq(docs.venueId, venue.id), eq(docs.kind, 'article'))),
    db.select({ at: max(tables.products.updatedAt) }).from(tables.products).where(eq(tables.products.venueId, venue.id)),
    db.select({ at: max(tables.productMeasurements.createdAt) }).from(tables.productMeasurements)
      .innerJoin(tables.products, eq(tables.products.id, tables.productMeasurements.productId)).where(eq(tables.products.venueId, venue.id)),
    db.select({ at: max(tables.images.createdAt) }).from(tables.images).where(eq(tables.images.venueId, venue.id)),
    db.select({ flightId: tables.tastingSessions.flightId, at: max(tables.tastingSessions.updatedAt) }).from(tables.tastingSessions)
      .where(eq(tables.tastingSessions.venueId, venue.id)).groupBy(tables.tastingSessions.flightId),
  ])
  const introAt = new Map(intros.map(i => [i.subjectId, i.publishedAt]))
  const sessionsAt = new Map(sessions.map(s => [s.flightId, s.at]))
  // A flight's page shows its pours, its introduction and its sessions.
  const flightEntries = flights.sort((a, b) => a.id - b.id)
    .map(fl => ({ path: `/flights/${fl.id}`, lastmod: newest(fl.updatedAt, fl.publishedAt, introAt.get(fl.id), sessionsAt.get(fl.id)) }))
  const byslug = new Map(articleDocs.map(d => [d.slug, d]))
  const articles = [...(await articleDefaults()).values()].flatMap((def) => {
    const doc = byslug.get(def.slug)
    if (doc && (doc.status !== 'published' || !doc.publishedBody)) return []
    const at = doc?.publishedAt ?? (def.updated ? new Date(`${def.updated}T00:00:00Z`) : null)
    return at ? [{ path: `/articles/${def.slug}`, lastmod: at }] : []
  })
  const flightsAt = newest(...flightEntries.map(e => e.lastmod))
  return [
    { path: '/', lastmod: newest(venue.updatedAt, flightsAt, photos?.at) },
    { path: '/flights', lastmod: newest(venue.updatedAt, flightsAt) },
    ...flightEntries,
    { path: '/glass', lastmod: newest(venue.updatedAt, products?.at, measured?.at) },
    ...(articles.length ? [{ path: '/articles', lastmod: newest(...articles.map(a => a.lastmod)) }] : []),
    ...articles,
  ]
}

const escapeXml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&apos;')

/** The sitemap protocol's XML (sitemaps.org, 0.9): absolute locations, lastmod as a W3C datetime in UTC. */
export function sitemapXml(entries: SitemapEntry[]): string {
  const urls = entries.map(e => `  <url>\n    <loc>${escapeXml(appLink(e.path))}</loc>\n    <lastmod>${e.lastmod.toISOString().replace(/\.\d{3}Z$/, 'Z')}</lastmod>\n  </url>`)
  return `<?xml version="1.0" encoding="UTF-8"?>\n<urlset xmlns="http://www.sitemaps.org/schemas/sitemap/0.9">\n${urls.join('\n')}\n</urlset>\n`
}
