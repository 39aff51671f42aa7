import { idParam } from '../../../../shared/schemas/common'
import { walkInSchema } from '../../../../shared/schemas/host'

/**
 * Seats a walk-in party in seats left, with every ID checked: a booking made at the door (paid at
 * the bar), checked in at once. The session row is locked, so a walk-in never takes a booked seat.
 */
export default defineEventHandler(async (event) => {
  // The role first, before the address or the body is read: a stranger learns nothing from them.
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const input = await readBodyAs(event, walkInSchema)
  const { user, venue, session } = await requireSessionHost(event, id)
  assertSessionDay(session, venue, user)
  const { bookingId, staleCheckouts } = await bookingTransaction(async (tx) => {
    const locked = await lockSessionRow(tx, id)
    const now = new Date()
    const { count, staleCheckouts } = await lockedSeatCount(tx, locked, now)
    const left = count.seatsLeft
    if (input.partySize > left) conflict(left ? `Only ${left} seat${left === 1 ? '' : 's'} left.` : 'No seats left in this session.', { seatsLeft: left })
    const [row] = await tx.insert(tables.bookings).values({
      venueId: venue.id, sessionId: id, userId: user.id, reference: newBookingReference(), state: 'checked_in', source: 'walk_in',
      partySize: input.partySize, contactName: input.contactName, contactEmail: '', contactPhone: '', notes: input.notes,
      ageConfirmed: true, unitPriceMinor: locked.priceMinor, amountMinor: locked.priceMinor * input.partySize, currency: locked.currency,
      holdExpiresAt: now, confirmedAt: now, checkedInAt: now,
    }).$returningId()
    await recordWalkIn(tx, row!.id, user.id, input.partySize, input.idsSeen)
    return { bookingId: row!.id, staleCheckouts }
  })
  void expireCheckoutSessions(staleCheckouts)
  setResponseStatus(event, 201)
  return { id: bookingId }
})
