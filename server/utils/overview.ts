import { and, asc, count, desc, eq, gt, gte, isNotNull, isNull, lt, or, sql, type SQL } from 'drizzle-orm'
import { DateTime } from 'luxon'
import type { Venue } from '../db/schema/venues'
import type { ManagerOverview, OverviewDay, OverviewSession } from '../../shared/types/reports'

/**
 * When mail counts as stuck: a message still waiting after this many tries (the sender backs off
 * 30 s, 1 min, 2 min…, so about three and a half minutes in) or this long after it was written.
 * The product's own thresholds, no outside source.
 */
const STUCK_AFTER_ATTEMPTS = 3
const STUCK_AFTER_MINUTES = 10

/** Days of the coming week shown after today. */
const WEEK_DAYS = 7

/** Guests seated at the door in a session, as a correlated subquery. */
function checkedInSql() {
  const b = tables.bookings
  const c = tables.checkIns
  return sql<number>`(select coalesce(sum(${c.seated}), 0) from ${c} inner join ${b} on ${b.id} = ${c.bookingId} where ${b.sessionId} = ${tables.tastingSessions.id} and ${c.outcome} = 'arrived')`.mapWith(Number)
}

/** Sessions starting in [from, to), with seats taken and guests seated. */
async function overviewSessions(venue: Venue, from: Date, to: Date, now: Date): Promise<OverviewSession[]> {
  const s = tables.tastingSessions
  const db = useDb()
  const rows = await db.select({ s, flightName: tables.flights.name, hostName: tables.users.name, checkedIn: checkedInSql() })
    .from(s)
    .innerJoin(tables.flights, eq(tables.flights.id, s.flightId))
    .leftJoin(tables.users, eq(tables.users.id, s.hostId))
    .where(and(eq(s.venueId, venue.id), gte(s.startsAt, from), lt(s.startsAt, to)))
    .orderBy(asc(s.startsAt))
  // Seats by the one seat rule (shared/seats.ts), as every other screen counts them.
  const counts = await loadSeatCounts(db, rows.map(r => r.s), now)
  return rows.map(r => ({
    id: r.s.id,
    flightName: r.flightName,
    startsAt: r.s.startsAt.toISOString(),
    durationMinutes: r.s.durationMinutes,
    status: r.s.status,
    hostName: r.hostName,
    seats: r.s.seats,
    seatsTaken: counts.get(r.s.id)?.seatsTaken ?? 0,
    seatsLeft: counts.get(r.s.id)?.seatsLeft ?? r.s.seats,
    checkedIn: r.checkedIn,
  }))
}

/** Seats offered and taken, leaving cancelled sessions out. */
function seatTotals(list: OverviewSession[]) {
  const live = list.filter(x => x.status !== 'cancelled')
  return { seats: live.reduce((n, x) => n + x.seats, 0), seatsTaken: live.reduce((n, x) => n + x.seatsTaken, 0) }
}

/** Card payments taken and refunds sent in [from, to), in the venue's currency. */
async function takings(venue: Venue, from: Date, to: Date) {
  const b = tables.bookings
  // A payment's moment: when it confirmed the booking; a late payment that found no seats has no
  // confirmation and counts from its hold, minutes earlier.
  const paidAt = sql`coalesce(${b.confirmedAt}, ${b.createdAt})`
  const mine: SQL[] = [eq(b.venueId, venue.id), eq(b.currency, venue.currency)]
  const [paid] = await useDb().select({ minor: sql<number>`coalesce(sum(${b.amountPaidMinor}), 0)`.mapWith(Number), n: count() }).from(b)
    .where(and(...mine, gt(b.amountPaidMinor, 0), gte(paidAt, from), lt(paidAt, to)))
  const [refunded] = await useDb().select({ minor: sql<number>`coalesce(sum(${b.amountRefundedMinor}), 0)`.mapWith(Number), n: count() }).from(b)
    .where(and(...mine, gt(b.amountRefundedMinor, 0), isNotNull(b.refundedAt), gte(b.refundedAt, from), lt(b.refundedAt, to)))
  const paidMinor = paid?.minor ?? 0
  const refundedMinor = refunded?.minor ?? 0
  return { paidMinor, payments: paid?.n ?? 0, refundedMinor, refunds: refunded?.n ?? 0, netMinor: paidMinor - refundedMinor }
}

/** The outbox by status, what is stuck in it, and the newest error among the stuck. */
async function outboxHealth(now: Date): Promise<ManagerOverview['outbox']> {
  const o = tables.outbox
  const db = useDb()
  const byStatus = Object.fromEntries((await db.select({ status: o.status, n: count() }).from(o).groupBy(o.status)).map(r => [r.status, r.n])) as Record<string, number>
  const stuck = or(eq(o.status, 'failed'), and(eq(o.status, 'pending'), or(gte(o.attempts, STUCK_AFTER_ATTEMPTS), lt(o.createdAt, new Date(now.getTime() - STUCK_AFTER_MINUTES * 60_000)))))
  const [stuckCount] = await db.select({ n: count() }).from(o).where(stuck)
  const [newest] = await db.select({ message: o.lastError, subject: o.subject, at: o.updatedAt }).from(o)
    .where(and(stuck, isNotNull(o.lastError))).orderBy(desc(o.updatedAt), desc(o.id)).limit(1)
  return {
    pending: byStatus.pending ?? 0,
    sent: byStatus.sent ?? 0,
    failed: byStatus.failed ?? 0,
    stuck: stuckCount?.n ?? 0,
    stuckAfterAttempts: STUCK_AFTER_ATTEMPTS,
    stuckAfterMinutes: STUCK_AFTER_MINUTES,
    newestError: newest?.message ? { message: newest.message, subject: newest.subject, at: newest.at.toISOString() } : null,
  }
}

/**
 * The manager's first screen, with "today" and "this week" as the venue's calendar days: today's
 * sessions, the seven days after it, takings over the last seven days (today included), the
 * outbox, and the counts of staff, guests and products.
 */
export async function managerOverview(venue: Venue, now = new Date()): Promise<ManagerOverview> {
  const db = useDb()
  const today = DateTime.fromJSDate(now, { zone: venue.timeZone }).startOf('day')
  const tomorrow = today.plus({ days: 1 })
  const weekEnd = tomorrow.plus({ days: WEEK_DAYS })
  const sessions = await overviewSessions(venue, today.toUTC().toJSDate(), weekEnd.toUTC().toJSDate(), now)
  const todays = sessions.filter(x => new Date(x.startsAt) < tomorrow.toJSDate())
  const coming = sessions.filter(x => new Date(x.startsAt) >= tomorrow.toJSDate())
  const days: OverviewDay[] = Array.from({ length: WEEK_DAYS }, (_, i) => {
    const start = tomorrow.plus({ days: i })
    const end = start.plus({ days: 1 })
    const mine = coming.filter(x => new Date(x.startsAt) >= start.toJSDate() && new Date(x.startsAt) < end.toJSDate())
    return { date: start.toISODate()!, startsAt: start.toUTC().toISO()!, sessions: mine, ...seatTotals(mine) }
  })
  const takingsFrom = today.minus({ days: 6 })

  const byRole = await db.select({ role: tables.users.role, n: count() }).from(tables.users)
    .where(eq(tables.users.disabled, false)).groupBy(tables.users.role)
  const [pending] = await db.select({ n: count() }).from(tables.users).where(and(isNull(tables.users.passwordHash), sql`${tables.users.role} <> 'guest'`))
  const [products] = await db.select({ n: count() }).from(tables.products).where(and(eq(tables.products.venueId, venue.id), eq(tables.products.status, 'active')))
  const people = Object.fromEntries(byRole.map(r => [r.role, r.n])) as Record<string, number>

  return {
    generatedAt: now.toISOString(),
    currency: venue.currency,
    today: { date: today.toISODate()!, startsAt: today.toUTC().toISO()!, sessions: todays, ...seatTotals(todays), checkedIn: todays.reduce((n, x) => n + x.checkedIn, 0) },
    week: { from: tomorrow.toISODate()!, to: weekEnd.minus({ days: 1 }).toISODate()!, days, sessions: coming.filter(x => x.status !== 'cancelled').length, ...seatTotals(coming) },
    takings: { from: takingsFrom.toISODate()!, to: today.toISODate()!, ...await takings(venue, takingsFrom.toUTC().toJSDate(), tomorrow.toUTC().toJSDate()) },
    outbox: await outboxHealth(now),
    staff: { manager: people.manager ?? 0, host: people.host ?? 0, marketing: people.marketing ?? 0, invitationsPending: pending?.n ?? 0 },
    guests: people.guest ?? 0,
    activeProducts: products?.n ?? 0,
  }
}
