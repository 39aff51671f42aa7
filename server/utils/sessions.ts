import { DateTime } from 'luxon'
import { asc, eq, type SQL } from 'drizzle-orm'
import type { TastingSession } from '../db/schema/sessions'
import type { SessionRow } from '../../shared/types/sessions'

/**
 * Weekly local start times turned into UTC instants in the venue's zone. luxon adds calendar
 * weeks in local time, so 14:00 stays 14:00 across a daylight-saving change; a local time that
 * does not exist (skipped by a spring-forward) is refused rather than silently moved.
 */
export function weeklyStartsUtc(opts: { startDate: string, startTime: string, weeks: number, timeZone: string }): Date[] {
  const first = DateTime.fromISO(`${opts.startDate}T${opts.startTime}`, { zone: opts.timeZone })
  if (!first.isValid) invalidFields({ startDate: 'That start date and time are not valid.' })
  const starts: Date[] = []
  for (let i = 0; i < opts.weeks; i++) {
    const local = first.plus({ weeks: i })
    if (local.toFormat('HH:mm') !== opts.startTime) {
      invalidFields({ startTime: `${opts.startTime} does not exist on ${local.toISODate()} in ${opts.timeZone}.` }, `${local.toISODate()} has no ${opts.startTime} in ${opts.timeZone} (the clocks change that night). Choose another time.`)
    }
    starts.push(local.toUTC().toJSDate())
  }
  return starts
}

function sessionView(s: TastingSession, extra: { flightName: string, flightVersion: number, hostName: string | null }, timeZone: string): SessionRow {
  const local = DateTime.fromJSDate(s.startsAt, { zone: timeZone })
  return {
    id: s.id,
    flightId: s.flightId,
    flightName: extra.flightName,
    flightVersion: extra.flightVersion,
    startsAt: s.startsAt.toISOString(),
    startsLocal: local.toISO({ suppressMilliseconds: true }),
    endsAt: new Date(s.startsAt.getTime() + s.durationMinutes * 60_000).toISOString(),
    durationMinutes: s.durationMinutes,
    seats: s.seats,
    priceMinor: s.priceMinor,
    currency: s.currency,
    hostId: s.hostId,
    hostName: extra.hostName,
    bookingCutoffMinutes: s.bookingCutoffMinutes,
    bookingClosesAt: new Date(s.startsAt.getTime() - s.bookingCutoffMinutes * 60_000).toISOString(),
    status: s.status,
    seriesId: s.seriesId,
  }
}

/** A session's host must be an enabled host or manager of the venue. */
export async function assertHost(venueId: number, hostId: number | null): Promise<void> {
  if (hostId === null) return
  const [host] = await useDb().select().from(tables.users).where(eq(tables.users.id, hostId))
  if (!host || host.disabled || (host.role !== 'host' && host.role !== 'manager')) {
    invalidFields({ hostId: 'Choose an active host or manager.' }, 'Choose an active host or manager to run the session.')
  }
}

/** Sessions with their flight and host names, in one joined query. */
export async function loadSessionViews(where: SQL | undefined, timeZone: string): Promise<SessionRow[]> {
  const rows = await useDb().select({ s: tables.tastingSessions, flightName: tables.flights.name, flightVersion: tables.flights.version, hostName: tables.users.name })
    .from(tables.tastingSessions)
    .innerJoin(tables.flights, eq(tables.flights.id, tables.tastingSessions.flightId))
    .leftJoin(tables.users, eq(tables.users.id, tables.tastingSessions.hostId))
    .where(where)
    .orderBy(asc(tables.tastingSessions.startsAt))
    .limit(2000)
  return rows.map(r => sessionView(r.s, r, timeZone))
}
