import { asc, eq } from 'drizzle-orm'
import type { Venue } from '../db/schema/venues'

/**
 * The venue row, kept in this process for VENUE_TTL_MS: nearly every request reads it (the booking
 * POST twice), and it changes only through `updateVenue` here, which drops the kept copy at once. A
 * read that was under way while the venue changed does not store what it read (the generation
 * moved on), so a change is never hidden by an older copy. The TTL only bounds how long a change
 * made outside this process (a restored dump) takes to show. `fresh` reads the database (GET
 * /api/venue does, so the pages and a stopped database are seen as they are).
 */
const VENUE_TTL_MS = 2_000
let kept: { venue: Readonly<Venue>, until: number } | undefined
let generation = 0

/** The venue (one per installation for now; the tables already carry venue_id). */
export async function getVenue(opts: { fresh?: boolean } = {}): Promise<Venue> {
  const now = Date.now()
  if (!opts.fresh && kept && kept.until > now) return kept.venue
  const started = generation
  const [venue] = await useDb().select().from(tables.venues).orderBy(asc(tables.venues.id)).limit(1)
  if (!venue) throw createError({ status: 503, statusText: 'Not set up', message: 'The venue has not been set up yet.' })
  if (started === generation) kept = { venue: Object.freeze(venue), until: now + VENUE_TTL_MS }
  return venue
}

/** Writes to the venue row, the one way it changes: the kept copy is dropped before and after. */
export async function updateVenue(venueId: number, patch: Partial<Omit<Venue, 'id' | 'createdAt' | 'updatedAt'>>): Promise<void> {
  generation++
  kept = undefined
  try { await useDb().update(tables.venues).set(patch).where(eq(tables.venues.id, venueId)) }
  finally {
    generation++
    kept = undefined
  }
}

export function appLink(path: string): string {
  return new URL(path, useRuntimeConfig().appUrl).toString()
}
