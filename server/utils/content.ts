import { and, desc, eq, inArray, isNull } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { ContentKind } from '../../shared/content'
import type { ContentDoc } from '../db/schema/content'
import { renderNote } from '../../shared/markdown'
import { contentParams } from '../../shared/schemas/content'
import type { ContentDocView, ContentRevision, RenderedText } from '../../shared/types/content'

/** A shipped article; `updated` (YYYY-MM-DD, front matter) is when its text last changed, for the sitemap. */
export interface ArticleDefault { slug: string, title: string, summary: string, body: string, updated: string | null }

/** The default articles shipped in content/articles, parsed once (front matter: title, summary, updated). */
let defaults: Promise<Map<string, ArticleDefault>> | undefined
export function articleDefaults(): Promise<Map<string, ArticleDefault>> {
  defaults ??= (async () => {
    const storage = useStorage('assets:articles')
    const out = new Map<string, ArticleDefault>()
    for (const key of await storage.getKeys()) {
      if (!key.endsWith('.md')) continue
      const raw = String(await storage.getItem(key) ?? '')
      const m = raw.match(/^---\n([\s\S]*?)\n---\n?([\s\S]*)$/)
      const meta = Object.fromEntries((m?.[1] ?? '').split('\n').map(l => l.split(/:\s*/, 2) as [string, string]).filter(([k, v]) => k && v))
      const slug = key.replace(/\.md$/, '').split(':').pop()!
      out.set(slug, { slug, title: meta.title ?? slug, summary: meta.summary ?? '', body: (m?.[2] ?? raw).trim(), updated: /^\d{4}-\d{2}-\d{2}$/.test(meta.updated ?? '') ? meta.updated! : null })
    }
    return out
  })()
  return defaults
}

/** Which thing a note is about, checked against the venue: a product, a flight, or an article. */
export async function resolveSubject(venueId: number, kind: ContentKind, subject: string): Promise<{ subjectId: number | null, slug: string | null, label: string, default?: ArticleDefault }> {
  const db = useDb()
  if (kind === 'article') {
    const def = (await articleDefaults()).get(subject)
    if (!def) notFound('No such article.')
    return { subjectId: null, slug: subject, label: def.title, default: def }
  }
  const id = Number(subject)
  if (!Number.isInteger(id) || id <= 0) invalidFields({ subject: 'The id must be a whole number.' })
  const table = kind === 'product_note' ? tables.products : tables.flights
  const [row] = await db.select({ id: table.id, name: table.name }).from(table).where(and(eq(table.id, id), eq(table.venueId, venueId)))
  if (!row) notFound(kind === 'product_note' ? 'No such product.' : 'No such flight.')
  return { subjectId: id, slug: null, label: row.name }
}

export async function findDoc(tx: Tx | Db, venueId: number, kind: ContentKind, s: { subjectId: number | null, slug: string | null }, lock = false): Promise<ContentDoc | undefined> {
  const where = and(eq(tables.contentDocs.venueId, venueId), eq(tables.contentDocs.kind, kind),
    s.subjectId === null ? isNull(tables.contentDocs.subjectId) : eq(tables.contentDocs.subjectId, s.subjectId),
    s.slug === null ? isNull(tables.contentDocs.slug) : eq(tables.contentDocs.slug, s.slug))
  const q = tx.select().from(tables.contentDocs).where(where)
  const [doc] = lock ? await q.for('update') : await q
  return doc
}

/** The editor's view of a note or article: its draft, what is published, and its state. */
export function docView(doc: ContentDoc | undefined, subject: Awaited<ReturnType<typeof resolveSubject>>): ContentDocView {
  const def = subject.default
  return {
    id: doc?.id ?? null,
    label: subject.label,
    title: doc?.title ?? def?.title ?? '',
    draftBody: doc?.draftBody ?? def?.body ?? '',
    publishedBody: doc ? doc.publishedBody : (def?.body ?? null),
    status: doc?.status ?? (def ? 'published' : 'draft'),
    publishedAt: doc?.publishedAt?.toISOString() ?? null,
    updatedAt: doc?.updatedAt?.toISOString() ?? null,
    /** Articles: true while the shipped default is what guests see. */
    isDefault: Boolean(def && !doc),
    defaultBody: def?.body ?? null,
  }
}

/** The route's doc key from its params: /api/content/<kind>/<subject>. */
export async function contentTarget(event: H3Event) {
  const user = await requireRole(event, 'manager', 'marketing')
  const { kind, subject } = await readParamsAs(event, contentParams)
  const venue = await getVenue()
  return { user, venue, kind, subject: await resolveSubject(venue.id, kind, subject) }
}

/** Creates the doc on first save (articles start from their file) and records a revision. */
export async function writeDoc(tx: Tx, venueId: number, kind: ContentKind, subject: Awaited<ReturnType<typeof resolveSubject>>, userId: number, change: { title?: string, draftBody?: string, publish?: boolean, unpublish?: boolean, action: 'save' | 'publish' | 'unpublish' | 'restore' }) {
  let doc = await findDoc(tx, venueId, kind, subject, true)
  if (!doc) {
    const [row] = await tx.insert(tables.contentDocs).values({
      venueId, kind, subjectId: subject.subjectId, slug: subject.slug, title: subject.default?.title ?? '', draftBody: subject.default?.body ?? '',
      publishedBody: subject.default?.body ?? null, publishedTitle: subject.default?.title ?? null,
      status: subject.default ? 'published' : 'draft', publishedAt: subject.default ? new Date() : null, updatedById: userId,
    }).$returningId()
    doc = (await tx.select().from(tables.contentDocs).where(eq(tables.contentDocs.id, row!.id)))[0]!
  }
  const title = change.title ?? doc.title
  const draftBody = change.draftBody ?? doc.draftBody
  await tx.update(tables.contentDocs).set({
    title,
    draftBody,
    updatedById: userId,
    ...(change.publish ? { publishedBody: draftBody, publishedTitle: title, status: 'published' as const, publishedAt: new Date() } : {}),
    ...(change.unpublish ? { publishedBody: null, publishedTitle: null, status: 'draft' as const, publishedAt: null } : {}),
  }).where(eq(tables.contentDocs.id, doc.id))
  await tx.insert(tables.contentRevisions).values({ docId: doc.id, action: change.action, title, body: draftBody, authorId: userId })
  return doc.id
}

/** Published notes for products or flights, rendered once (HTML, structure, text) for guests and cards. */
export async function publishedNotes(venueId: number, kind: 'product_note' | 'flight_intro', ids: number[]): Promise<Map<number, RenderedText>> {
  if (!ids.length) return new Map()
  const rows = await useDb().select({ subjectId: tables.contentDocs.subjectId, body: tables.contentDocs.publishedBody }).from(tables.contentDocs)
    .where(and(eq(tables.contentDocs.venueId, venueId), eq(tables.contentDocs.kind, kind), eq(tables.contentDocs.status, 'published'), inArray(tables.contentDocs.subjectId, ids)))
  return new Map(rows.filter(r => r.subjectId !== null && r.body).map(r => [r.subjectId!, renderNote(r.body!)]))
}

export async function revisionsOf(docId: number): Promise<ContentRevision[]> {
  const rows = await useDb().select({ id: tables.contentRevisions.id, action: tables.contentRevisions.action, title: tables.contentRevisions.title, body: tables.contentRevisions.body, createdAt: tables.contentRevisions.createdAt, author: tables.users.name })
    .from(tables.contentRevisions).leftJoin(tables.users, eq(tables.users.id, tables.contentRevisions.authorId))
    .where(eq(tables.contentRevisions.docId, docId)).orderBy(desc(tables.contentRevisions.id)).limit(200)
  return rows.map(r => ({ ...r, createdAt: r.createdAt.toISOString() }))
}
