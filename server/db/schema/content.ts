import { mysqlTable, int, varchar, mysqlEnum, mediumtext, index, uniqueIndex } from 'drizzle-orm/mysql-core'
import { timestamps, utcDatetime } from './common'
import { venues } from './venues'
import { users } from './users'
import { products } from './products'
import { CONTENT_KINDS, CONTENT_STATUSES, IMAGE_ROLES, REVISION_ACTIONS } from '../../../shared/content'

/**
 * Markdown written by marketing: a product's tasting note, a flight's introduction, or an article
 * (articles start from the defaults in content/ and live here once edited). The draft is what the
 * editor shows; the published body is what guests and cards see.
 */
export const contentDocs = mysqlTable('content_docs', {
  id: int('id').autoincrement().primaryKey(),
  venueId: int('venue_id').notNull().references(() => venues.id, { onDelete: 'cascade' }),
  kind: mysqlEnum('kind', CONTENT_KINDS).notNull(),
  /** The product or flight the note belongs to; null for articles. */
  subjectId: int('subject_id'),
  /** Articles only: the file name in content/articles without .md. */
  slug: varchar('slug', { length: 80 }),
  title: varchar('title', { length: 200 }).notNull().default(''),
  draftBody: mediumtext('draft_body').notNull(),
  publishedBody: mediumtext('published_body'),
  publishedTitle: varchar('published_title', { length: 200 }),
  status: mysqlEnum('status', CONTENT_STATUSES).notNull().default('draft'),
  publishedAt: utcDatetime('published_at'),
  updatedById: int('updated_by_id').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('content_docs_subject_uq').on(t.venueId, t.kind, t.subjectId), uniqueIndex('content_docs_slug_uq').on(t.venueId, t.slug)])

/** Every save, publish and restore keeps the text as it was then, and who did it. */
export const contentRevisions = mysqlTable('content_revisions', {
  id: int('id').autoincrement().primaryKey(),
  docId: int('doc_id').notNull().references(() => contentDocs.id, { onDelete: 'cascade' }),
  action: mysqlEnum('action', REVISION_ACTIONS).notNull(),
  title: varchar('title', { length: 200 }).notNull().default(''),
  body: mediumtext('body').notNull(),
  authorId: int('author_id').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [index('content_revisions_doc_idx').on(t.docId, t.id)])

/** Uploaded product photos and label images, re-encoded and stored under generated names. */
export const images = mysqlTable('images', {
  id: int('id').autoincrement().primaryKey(),
  venueId: int('venue_id').notNull().references(() => venues.id, { onDelete: 'cascade' }),
  productId: int('product_id').references(() => products.id, { onDelete: 'cascade' }),
  role: mysqlEnum('role', IMAGE_ROLES).notNull(),
  storedName: varchar('stored_name', { length: 80 }).notNull(),
  mimeType: varchar('mime_type', { length: 40 }).notNull(),
  bytes: int('bytes').notNull(),
  width: int('width').notNull(),
  height: int('height').notNull(),
  altText: varchar('alt_text', { length: 300 }).notNull().default(''),
  uploadedById: int('uploaded_by_id').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('images_stored_name_uq').on(t.storedName), index('images_product_idx').on(t.productId)])

export type ContentDoc = typeof contentDocs.$inferSelect
export type ImageRow = typeof images.$inferSelect
