import { and, asc, desc, eq, isNull } from 'drizzle-orm'
import type { ImageView } from '../../shared/types/content'

/**
 * The photo the venue's public pages lead with (home, link previews): the newest photo the venue
 * uploaded of itself (an image with no product), else the first pour's photo of its newest
 * published flight that has one, else null.
 */
export async function venuePhoto(venueId: number): Promise<ImageView | null> {
  const db = useDb()
  const i = tables.images
  const [own] = await db.select().from(i).where(and(eq(i.venueId, venueId), isNull(i.productId), eq(i.role, 'photo'))).orderBy(desc(i.id)).limit(1)
  if (own) return imageView(own)
  const pours = await db.select({ flightId: tables.flightPours.flightId, productId: tables.flightPours.productId })
    .from(tables.flightPours)
    .innerJoin(tables.flights, eq(tables.flights.id, tables.flightPours.flightId))
    .where(and(eq(tables.flights.venueId, venueId), eq(tables.flights.status, 'published')))
    .orderBy(desc(tables.flights.publishedAt), desc(tables.flights.id), asc(tables.flightPours.position))
  if (!pours.length) return null
  const photos = await productPhotos(venueId, [...new Set(pours.map(p => p.productId))])
  for (const p of pours) {
    const photo = photos.get(p.productId)
    if (photo?.role === 'photo') return photo
  }
  return null
}
