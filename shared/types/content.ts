import type { ContentStatus, ImageRole } from '../content'

/** A stretch of a note's text in one style. */
export interface TextRun { text: string, bold?: true, italic?: true, code?: true, href?: string }

/**
 * One block of a note as the card PDF lays it out: a paragraph, a heading or a list item (with its
 * marker, "•" or "2."); `depth` is how many lists it sits in, `quote` that it is quoted.
 */
export interface TextBlock { kind: 'paragraph' | 'heading' | 'item', runs: TextRun[], depth: number, marker?: string, quote?: true }

/**
 * Markdown rendered once on the server (shared/markdown.ts, the one renderer): the HTML every page
 * shows, the same text's structure for the PDF, and its plain text.
 */
export interface RenderedText { html: string, text: string, blocks: TextBlock[] }

/** An uploaded image (GET /api/images, and each product's photo on flight views). */
export interface ImageView {
  id: number
  productId: number | null
  role: ImageRole
  /** The stored file's name, served resized under /media. */
  src: string
  mimeType: string
  bytes: number
  width: number
  height: number
  altText: string
}

/** What a page needs to show an uploaded image: its file, its stored size and its words. */
export type ShownImage = Pick<ImageView, 'src' | 'width' | 'height' | 'altText'>

/** A note or article as the editor shows it (GET/PUT /api/content/[kind]/[subject] and its actions). */
export interface ContentDocView {
  id: number | null
  label: string
  title: string
  draftBody: string
  publishedBody: string | null
  status: ContentStatus
  publishedAt: string | null
  updatedAt: string | null
  /** Articles: true while the shipped default is what guests see. */
  isDefault: boolean
  defaultBody: string | null
}

export interface ContentRevision {
  id: number
  action: 'save' | 'publish' | 'unpublish' | 'restore'
  title: string
  body: string
  createdAt: string
  author: string | null
}

export type ContentListState = 'none' | 'default' | 'draft' | 'published' | 'published-with-changes'
export interface ContentListItem { subject: string, name: string, state: ContentListState }
/** What marketing can write (GET /api/content). */
export interface ContentList { articles: ContentListItem[], productNotes: ContentListItem[], flightIntros: ContentListItem[] }

/** An article on the guests' list (GET /api/articles). */
export interface ArticleSummary { slug: string, title: string, summary: string }
/** One published article (GET /api/articles/[slug]). */
export interface ArticleView extends ArticleSummary { html: string }
