export const CONTENT_KINDS = ['product_note', 'flight_intro', 'article'] as const
export type ContentKind = (typeof CONTENT_KINDS)[number]
export const CONTENT_STATUSES = ['draft', 'published'] as const
export type ContentStatus = (typeof CONTENT_STATUSES)[number]
export const REVISION_ACTIONS = ['save', 'publish', 'unpublish', 'restore'] as const
export const IMAGE_ROLES = ['photo', 'label'] as const
export type ImageRole = (typeof IMAGE_ROLES)[number]
/** Largest upload accepted, bytes (8 MiB: a phone photo at full resolution fits). */
export const IMAGE_MAX_BYTES = 8 * 1024 * 1024
/**
 * Most pixels an uploaded image may have, width × height: a decoded image takes 4 bytes a pixel,
 * so 40 megapixels is 160 MB in memory while it is read; phones save 12–24 MP photos by default
 * (common practice, no source).
 */
export const IMAGE_MAX_PIXELS = 40_000_000
/**
 * The only widths the /media route makes of an uploaded image, px, and the one quality of each
 * format it makes: the image provider asks for the smallest of these at least as wide as the page
 * wants (1× and 2× of every `sizes` on the pages, 1200 for link previews), and the server snaps any
 * other width up the same way, so a stranger cannot fill the disk with odd sizes.
 */
export const IMAGE_WIDTHS = [64, 96, 128, 160, 192, 256, 320, 400, 480, 640, 800, 1024, 1200, 1600, 2400] as const
export const IMAGE_VARIANT_QUALITY = { webp: 80, jpeg: 82 } as const
export type ImageVariantFormat = keyof typeof IMAGE_VARIANT_QUALITY

/** The allowed width a request for `width` px gets: the smallest at least as wide, else the widest. */
export function snapImageWidth(width: number): number {
  return IMAGE_WIDTHS.find(w => w >= width) ?? IMAGE_WIDTHS[IMAGE_WIDTHS.length - 1]!
}
export const IMAGE_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const
