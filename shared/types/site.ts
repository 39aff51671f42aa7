import type { ImageView } from './content'

/**
 * The photo the venue's public pages lead with (GET /api/venue/photo): its own photo of the room
 * (an upload not tied to a product), else a photo of a pour of its newest published flight; null
 * when it has neither.
 */
export interface VenuePhoto { photo: ImageView | null }
