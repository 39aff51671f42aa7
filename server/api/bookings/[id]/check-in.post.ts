import { idParam } from '../../../../shared/schemas/common'
import { checkInSchema } from '../../../../shared/schemas/host'

/** A party arrives: seat those whose ID was seen; the booking moves to checked in, and its history says who seated them. */
export default defineEventHandler(async (event) => {
  // The role first, before the address or the body is read: a stranger learns nothing from them.
  await requireRole(event, 'host', 'manager')
  const { id } = await readParamsAs(event, idParam)
  const input = await readBodyAs(event, checkInSchema)
  const { user, venue, session } = await requireSessionHost(event, await bookingSessionId(id))
  assertSessionDay(session, venue, user)
  await bookingTransaction(async (tx) => {
    const { booking } = await lockBookingWithSession(tx, id)
    if (input.seated > booking.partySize) invalidFields({ seated: `At most ${booking.partySize}.` }, `This party booked ${booking.partySize}.`)
    if (input.seated < booking.partySize && !input.reason) invalidFields({ reason: 'Say why not everyone is seated (e.g. no ID).' }, 'Say why not everyone in the party is seated.')
    await decideAtDoor(tx, booking, user.id, { event: 'arrive', seated: input.seated, idsSeen: input.idsSeen, reason: input.reason, patch: { checkedInAt: new Date() } })
  })
  return { ok: true }
})
