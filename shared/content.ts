export const CONTENT_KINDS = ['product_note', 'flight_intro', 'article'] as const
export type ContentKind = (typeof CONTENT_KINDS)[number]
export const CONTENT_STATUSES = ['draft', 'published'] as const
export type ContentStatus = (typeof CONTENT_STATUSES)[number]
export const REVISION_ACTIONS = ['save', 'publish', 'unpublish', 'restore'] as const
export const IMAGE_ROLES = ['photo', 'label'] as const
export type ImageRole = (typeof IMAGE_ROLES)[number]
/** Largest upload accepted, bytes (8 MiB: a phone photo at full resolution fits). */
export const IMAGE_MAX_BYTES = 8 * 1024 * 1024
export const IMAGE_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const
