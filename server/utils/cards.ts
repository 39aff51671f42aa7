import { randomUUID } from 'node:crypto'
import { and, asc, eq, inArray } from 'drizzle-orm'
import { renderCardsPdf, type CardFonts } from '../cards/cardPdf'
import { buildFlightCard, type CardRoomInput } from '../../shared/cards'
import type { CardPaper } from '../../shared/paper'
import type { FlightCard } from '../../shared/types/cards'
import type { Venue } from '../db/schema/venues'
import type { TastingSession } from '../db/schema/sessions'
import { formatShortDayWithYear, formatTime } from '../../shared/dates'

let fonts: Promise<CardFonts> | undefined

/** The shipped Lora files, read once from the server's bundled assets. */
export function cardFonts(): Promise<CardFonts> {
  fonts ??= (async () => {
    const storage = useStorage('assets:fonts')
    const read = async (name: string) => {
      const raw = await storage.getItemRaw(name)
      if (!raw) throw new Error(`font ${name} is missing from the server bundle`)
      return Buffer.from(raw as ArrayBuffer)
    }
    return {
      regular: await read('lora-latin-400-normal.woff'),
      semibold: await read('lora-latin-600-normal.woff'),
      italic: await read('lora-latin-400-italic.woff'),
      semiboldItalic: await read('lora-latin-600-italic.woff'),
    }
  })()
  return fonts
}

/**
 * The card of one flight as staff print it; guest names, session and the room's air come from the
 * caller (the venue's usual air by default). The pours are computed in that same air.
 */
export async function flightCard(venue: Venue, flightId: number, extra: { guestName?: string | null, sessionLabel?: string | null, room?: CardRoomInput } = {}): Promise<FlightCard> {
  const room = extra.room ?? venueRoom(venue)
  const view = await flightView(venue, await loadFlight(venue, flightId), room.air)
  return buildFlightCard({ venue, flight: view, publicUrl: appLink(`/pour/${flightId}`), guestName: extra.guestName, sessionLabel: extra.sessionLabel, room })
}

/**
 * One card per seated guest of a session (confirmed parties, and checked-in ones by the number
 * actually seated), in party order. With `names`, each card says whom it was poured for. The pours
 * assume the host's reading of the room for this session, if there is one yet.
 */
export async function sessionCards(venue: Venue, session: TastingSession, names: boolean): Promise<FlightCard[]> {
  const base = await flightCard(venue, session.flightId, { sessionLabel: `${formatShortDayWithYear(session.startsAt, venue)}, ${formatTime(session.startsAt, venue)}`, room: sessionRoom(venue, session) })
  const parties = await useDb().select({ b: tables.bookings, c: tables.checkIns }).from(tables.bookings)
    .leftJoin(tables.checkIns, eq(tables.checkIns.bookingId, tables.bookings.id))
    .where(and(eq(tables.bookings.sessionId, session.id), inArray(tables.bookings.state, ['confirmed', 'checked_in'])))
    .orderBy(asc(tables.bookings.contactName))
  const cards: FlightCard[] = []
  for (const { b, c } of parties) {
    const seats = b.state === 'checked_in' && c?.outcome === 'arrived' ? c.seated : b.partySize
    for (let i = 0; i < seats; i++) {
      const guestName = names ? (i === 0 ? b.contactName : `${b.contactName}'s party (${i + 1} of ${seats})`) : null
      cards.push({ ...base, guestName })
    }
  }
  return cards
}

export interface CardJob { id: string, ownerId: number, status: 'running' | 'done' | 'failed', done: number, total: number, pdf?: Buffer, error?: string, fileName: string, createdAt: number }
const jobs = new Map<string, CardJob>()
/** Finished PDFs are kept this long for download, then dropped. */
const JOB_TTL_MS = 15 * 60_000

/** Starts making a session's cards as one PDF in the background; progress is read from the job. */
export function startCardJob(ownerId: number, cards: FlightCard[], paper: CardPaper, fileName: string): CardJob {
  for (const [k, j] of jobs) if (Date.now() - j.createdAt > JOB_TTL_MS) jobs.delete(k)
  const job: CardJob = { id: randomUUID(), ownerId, status: 'running', done: 0, total: cards.length, fileName, createdAt: Date.now() }
  jobs.set(job.id, job)
  void (async () => {
    try {
      job.pdf = await renderCardsPdf(cards, { paper, fonts: await cardFonts(), onCard: (done) => { job.done = done } })
      job.status = 'done'
    }
    catch (err) {
      job.status = 'failed'
      job.error = (err as Error).message
    }
  })()
  return job
}

export function findCardJob(id: string, user: CurrentUser): CardJob {
  const job = jobs.get(id)
  if (!job || (job.ownerId !== user.id && user.role !== 'manager')) notFound('No such print job (finished ones are kept for 15 minutes).')
  return job
}
