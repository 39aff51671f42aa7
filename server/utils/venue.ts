import { asc } from 'drizzle-orm'
import type { Venue } from '../db/schema/venues'

/** The venue (one per installation for now; the tables already carry venue_id). */
export async function getVenue(): Promise<Venue> {
  const [venue] = await useDb().select().from(tables.venues).orderBy(asc(tables.venues.id)).limit(1)
  if (!venue) throw createError({ status: 503, statusText: 'Not set up', message: 'The venue has not been set up yet.' })
  return venue
}

export function appLink(path: string): string {
  return new URL(path, useRuntimeConfig().appUrl).toString()
}
