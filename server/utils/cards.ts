import { randomUUID } from 'node:crypto'
import { and, asc, eq, inArray } from 'drizzle-orm'
import type { CardFonts } from '../cards/cardPdf'
import { cachedCardsPdf } from '../cards/pdfCache'
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
export async function flightCard(venue: Venue, flightId: number, extra: { guestName?: string | null, sessionLabel?: string | null, room?: CardRoomInput, sessionId?: number } = {}): Promise<FlightCard> {
  const room = extra.room ?? venueRoom(venue)
  const view = await flightView(venue, await loadFlight(venue, flightId), room.air)
  // A session's cards carry its id in their address (/pour/{flight}?s={session}), so observations made from them are tied to it.
  return buildFlightCard({ venue, flight: view, publicUrl: appLink(`/pour/${flightId}`), guestName: extra.guestName, sessionLabel: extra.sessionLabel, room, sessionId: extra.sessionId })
}

/**
 * One card per seated guest of a session (confirmed parties, and checked-in ones by the number
 * actually seated), in party order. With `names`, each card says whom it was poured for. The pours
 * assume the host's reading of the room for this session, if there is one yet.
 */
export async function sessionCards(venue: Venue, session: TastingSession, names: boolean): Promise<FlightCard[]> {
  const base = await flightCard(venue, session.flightId, { sessionLabel: `${formatShortDayWithYear(session.startsAt, venue)}, ${formatTime(session.startsAt, venue)}`, room: sessionRoom(venue, session), sessionId: session.id })
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
/**
 * Print jobs live in this server process's memory, not in the database: a restart forgets them, and
 * with several server processes a job is found only on the one that made it. So that memory stays
 * bounded, each person keeps at most CARD_JOBS_PER_USER jobs and the process CARD_JOBS_MAX; a new job
 * pushes out its owner's (then anyone's) oldest finished one, and is refused (429) while the bound is
 * all running jobs. Finished or not, a job is dropped CARD_JOB_TTL_MS after it started.
 */
const jobs = new Map<string, CardJob>()
const CARD_JOBS_PER_USER = 3
const CARD_JOBS_MAX = 20
/** Finished PDFs are kept this long for download, then dropped. */
const CARD_JOB_TTL_MS = 15 * 60_000

function dropExpiredJobs(now = Date.now()): void {
  for (const [k, j] of jobs) if (now - j.createdAt > CARD_JOB_TTL_MS) jobs.delete(k)
}

/** Makes room for one more job among `pool` (oldest first, as the Map keeps them), or says why not. */
function makeRoom(pool: CardJob[], bound: number): boolean {
  const finished = pool.filter(j => j.status !== 'running')
  while (pool.length >= bound && finished.length) {
    const oldest = finished.shift()!
    jobs.delete(oldest.id)
    pool.splice(pool.indexOf(oldest), 1)
  }
  return pool.length < bound
}

/** Starts making a session's cards as one PDF in the background; progress is read from the job. */
export function startCardJob(ownerId: number, cards: FlightCard[], paper: CardPaper, fileName: string): CardJob {
  dropExpiredJobs()
  const busy = (message: string): never => {
    throw createError({ status: 429, statusText: 'Too many print jobs', message, data: { retryAfterSeconds: 10 } })
  }
  if (!makeRoom([...jobs.values()].filter(j => j.ownerId === ownerId), CARD_JOBS_PER_USER)) busy(`You already have ${CARD_JOBS_PER_USER} print jobs running; wait for one to finish.`)
  if (!makeRoom([...jobs.values()], CARD_JOBS_MAX)) busy('The server is printing as many jobs as it takes at once; try again in a moment.')
  const job: CardJob = { id: randomUUID(), ownerId, status: 'running', done: 0, total: cards.length, fileName, createdAt: Date.now() }
  jobs.set(job.id, job)
  void (async () => {
    try {
      job.pdf = await cachedCardsPdf(cards, { paper, fonts: await cardFonts(), onCard: (done) => { job.done = done } })
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
  dropExpiredJobs()
  const job = jobs.get(id)
  if (!job || (job.ownerId !== user.id && user.role !== 'manager')) notFound(`No such print job (a job is kept for ${CARD_JOB_TTL_MS / 60_000} minutes, and only your ${CARD_JOBS_PER_USER} newest).`)
  return job
}
