import { asc, eq, inArray } from 'drizzle-orm'
import { DEMO_BOOKINGS, DEMO_GUESTS } from '../demo/bookings'

/** Demo guests and their bookings on the first demo sessions, inside the seeding transaction. */
export async function seedDemoBookings(tx: Tx, venueId: number): Promise<number> {
  await tx.insert(tables.users).values(DEMO_GUESTS.map(g => ({ email: g.email, name: g.name, role: 'guest' as const, dateOfBirth: g.dateOfBirth, passwordHash: null, emailVerifiedAt: new Date() })))
  const guests = await tx.select().from(tables.users).where(inArray(tables.users.email, DEMO_GUESTS.map(g => g.email)))
  const byEmail = new Map(guests.map(g => [g.email, g.id]))
  const sessions = await tx.select().from(tables.tastingSessions).where(eq(tables.tastingSessions.venueId, venueId)).orderBy(asc(tables.tastingSessions.startsAt)).limit(10)
  const now = new Date()
  const rows = DEMO_BOOKINGS.flatMap((d) => {
    const s = sessions[d.session]
    const g = DEMO_GUESTS[d.guest]!
    if (!s) return []
    const amount = s.priceMinor * d.partySize
    const refunded = d.state === 'refunded'
    return [{
      venueId, sessionId: s.id, userId: byEmail.get(g.email)!, reference: newBookingReference(), state: d.state, partySize: d.partySize,
      contactName: g.name, contactEmail: g.email, contactPhone: g.phone, ageConfirmed: true,
      unitPriceMinor: s.priceMinor, amountMinor: amount, currency: s.currency, holdExpiresAt: now,
      amountPaidMinor: amount, amountRefundedMinor: refunded ? amount : 0, confirmedAt: now,
      cancelledAt: refunded ? now : null, refundedAt: refunded ? now : null, endReason: refunded ? 'guest_cancelled' as const : null,
    }]
  })
  if (rows.length) await tx.insert(tables.bookings).values(rows)
  return rows.length
}
