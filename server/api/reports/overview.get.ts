import { and, count, eq, isNull, sql } from 'drizzle-orm'
import type { ManagerOverview } from '../../../shared/types/reports'

/** The manager's first screen: who works here, who has signed up, what is on the list, mail health. */
export default defineEventHandler(async (event): Promise<ManagerOverview> => {
  await requireRole(event, 'manager')
  const db = useDb()
  const venue = await getVenue()
  const byRole = await db.select({ role: tables.users.role, n: count() }).from(tables.users)
    .where(eq(tables.users.disabled, false)).groupBy(tables.users.role)
  const [pending] = await db.select({ n: count() }).from(tables.users).where(and(isNull(tables.users.passwordHash), sql`${tables.users.role} <> 'guest'`))
  const [products] = await db.select({ n: count() }).from(tables.products).where(and(eq(tables.products.venueId, venue.id), eq(tables.products.status, 'active')))
  const mail = await db.select({ status: tables.outbox.status, n: count() }).from(tables.outbox).groupBy(tables.outbox.status)
  const people = Object.fromEntries(byRole.map(r => [r.role, r.n])) as Record<string, number>
  const outbox = Object.fromEntries(mail.map(r => [r.status, r.n])) as Record<string, number>
  return {
    staff: { manager: people.manager ?? 0, host: people.host ?? 0, marketing: people.marketing ?? 0, invitationsPending: pending?.n ?? 0 },
    guests: people.guest ?? 0,
    activeProducts: products?.n ?? 0,
    outbox: { pending: outbox.pending ?? 0, sent: outbox.sent ?? 0, failed: outbox.failed ?? 0 },
  }
})
