import { beforeAll, describe, expect, inject, it } from 'vitest'
import { Client, uniqueEmail } from '../support/http'
import { countRows, withDb } from '../support/db'
import { inviteStaff, requestPasswordReset, signedIn } from '../support/people'
import { waitForMail } from '../support/mail'
import { bookAndPay, bookingBody, checkoutIdOf, confirmAddress, newGuest, newSession, payCheckout, signedUpGuest, waitForState } from '../support/booking'

// The attack cases of issue 16 on accounts and seats, one `it` per item, each named after it.

let manager: Client
beforeAll(async () => {
  manager = await signedIn('manager')
})

const adult = { name: 'Wren Castillo', password: 'a-long-enough-secret', dateOfBirth: '1990-06-01' }
const mailsTo = async (to: string, subject: RegExp) => {
  const res = await fetch(`${inject('mailUrl')}/messages?to=${encodeURIComponent(to)}`)
  return ((await res.json()) as { subject: string }[]).filter(m => subject.test(m.subject)).length
}
const pause = (ms: number) => new Promise(r => setTimeout(r, ms))

describe('attacks on accounts and seats', () => {
  it('16.2 a copied cookie stops working after sign-out, sign-out of all devices, a password reset, a role change and disabling', async () => {
    // Sign-out ends this device and any copy of its cookie; another device stays signed in.
    const guest = await newGuest('copied')
    const elsewhere = new Client()
    expect((await elsewhere.signIn(guest.email, 'guest-password-1')).status).toBe(200)
    const copy = guest.client.copy()
    expect((await copy.get('/api/account')).status).toBe(200)
    expect((await guest.client.post('/api/auth/signout')).status).toBe(200)
    expect((await copy.get('/api/account')).status).toBe(401)
    expect((await elsewhere.get('/api/account')).status).toBe(200)

    // Sign out of all devices ends every sign-in, copies included.
    const laptop = new Client()
    expect((await laptop.signIn(guest.email, 'guest-password-1')).status).toBe(200)
    const laptopCopy = laptop.copy()
    expect((await elsewhere.post('/api/auth/signout-everywhere')).status).toBe(200)
    for (const c of [elsewhere, laptop, laptopCopy]) expect((await c.get('/api/account')).status).toBe(401)

    // A password reset ends the sign-ins made with the old password; the person who reset is signed in.
    const phone = new Client()
    expect((await phone.signIn(guest.email, 'guest-password-1')).status).toBe(200)
    const phoneCopy = phone.copy()
    const { token } = await requestPasswordReset(guest.email)
    const resetter = new Client()
    expect((await resetter.post('/api/auth/password-reset/confirm', { token, password: 'a-new-password-2' })).status).toBe(200)
    expect((await phoneCopy.get('/api/account')).status).toBe(401)
    expect((await phone.get('/api/account')).status).toBe(401)
    expect((await resetter.get('/api/account')).status).toBe(200)

    // A role change and disabling end a staff member's sign-ins.
    const invited = await inviteStaff(manager, 'host', 'Copied Host')
    const staff = new Client()
    expect((await staff.post('/api/auth/invitation', { token: invited.token, password: 'copied-host-pass-1' })).status).toBe(200)
    const staffId = (await staff.get('/api/account')).body.id as number
    const staffCopy = staff.copy()
    expect((await manager.patch(`/api/staff/${staffId}`, { role: 'marketing' })).status).toBe(200)
    expect((await staffCopy.get('/api/account')).status).toBe(401)
    expect((await staff.get('/api/account')).status).toBe(401)
    const again = new Client()
    expect((await again.signIn(invited.email, 'copied-host-pass-1')).status).toBe(200)
    const againCopy = again.copy()
    expect((await manager.patch(`/api/staff/${staffId}`, { disabled: true })).status).toBe(200)
    expect((await manager.patch(`/api/staff/${staffId}`, { disabled: false })).status).toBe(200)
    // Enabled again, the account still needs a new sign-in: the old cookie's sign-in has ended.
    expect((await againCopy.get('/api/account')).status).toBe(401)
  })

  it('16.3 an unconfirmed account cannot hold seats, 6 parallel holds by one guest stay within the cap, and sign-ups per client are limited', async () => {
    // An account whose address is not confirmed signs in but cannot hold seats.
    const session = await newSession(manager, { seats: 12 })
    const unconfirmed = await signedUpGuest('unconfirmed')
    await waitForMail(unconfirmed.email, /Confirm your e-mail address/)
    expect((await unconfirmed.client.signIn(unconfirmed.email, unconfirmed.password)).status).toBe(200)
    const refused = await unconfirmed.client.post('/api/bookings', bookingBody(session.id, { ...unconfirmed, dateOfBirth: '1990-05-14' }, 2))
    expect(refused.status).toBe(403)
    expect(refused.body.message).toMatch(/Confirm your e-mail address/)
    expect((await unconfirmed.client.get('/api/account')).body.emailConfirmed).toBe(false)
    // The booking page's "send me a new link" sends a second link, which confirms the address.
    expect((await unconfirmed.client.post('/api/account/address-check')).status).toBe(200)
    await confirmAddress(unconfirmed.client, unconfirmed.email, 2)
    expect((await unconfirmed.client.post('/api/bookings', bookingBody(session.id, { ...unconfirmed, dateOfBirth: '1990-05-14' }, 2))).status).toBe(201)

    // Six holds at once in six sessions: the guest's row is locked, so at most three get through.
    const guest = await newGuest('hoarder')
    const sessions = await Promise.all(Array.from({ length: 6 }, () => newSession(manager, { seats: 12 })))
    const holds = await Promise.all(sessions.map(s => guest.client.post('/api/bookings', bookingBody(s.id, guest, 1))))
    expect(holds.filter(r => r.status === 201)).toHaveLength(3)
    expect(holds.filter(r => r.status === 409).map(r => r.body.message)).toEqual(Array(3).fill(expect.stringMatching(/waiting for payment/)))
    expect(await countRows('bookings', 'user_id = (SELECT id FROM users WHERE email = ?) AND state = ?', [guest.email, 'held'])).toBe(3)

    // Unpaid seats together are capped too (PARTY_MAX = 10, shared/bookings.ts).
    const big = await newGuest('big-hoarder')
    expect((await big.client.post('/api/bookings', bookingBody(sessions[0]!.id, big, 6))).status).toBe(201)
    expect((await big.client.post('/api/bookings', bookingBody(sessions[1]!.id, big, 4))).status).toBe(201)
    const over = await big.client.post('/api/bookings', bookingBody(sessions[2]!.id, big, 1))
    expect(over.status).toBe(409)
    expect(over.body.message).toMatch(/more than 10/)

    // One client may sign up 10 times an hour (LIMITS.signUpPerClient); the 11th is refused.
    const farm = new Client()
    for (let i = 0; i < 10; i++) expect((await farm.post('/api/auth/signup', { ...adult, email: uniqueEmail(`farm${i}`) })).status).toBe(202)
    const eleventh = await farm.post('/api/auth/signup', { ...adult, email: uniqueEmail('farm10') })
    expect(eleventh.status).toBe(429)
    expect(Number(eleventh.headers.get('retry-after'))).toBeGreaterThan(0)
  })

  it('16.4 made-up links are refused before any password is hashed, hashes run a few at a time, and link tries are limited', async () => {
    // Fifty sign-ins at once keep the hashing queue full: some wait, the rest are turned away with 503.
    const bogus = 'x'.repeat(43)
    const [signIns, links] = await Promise.all([
      Promise.all(Array.from({ length: 50 }, (_, i) => new Client().signIn(uniqueEmail(`flood${i}`), 'some-password-guess'))),
      // Meanwhile made-up reset and invitation links are answered at once: they never wait for a hash.
      pause(30).then(() => Promise.all(Array.from({ length: 10 }, (_, i) => new Client().post(i % 2 ? '/api/auth/invitation' : '/api/auth/password-reset/confirm', { token: bogus, password: 'new-password-123' })))),
    ])
    const statuses = signIns.map(r => r.status)
    expect(statuses.every(s => s === 401 || s === 503), statuses.join(',')).toBe(true)
    expect(statuses.filter(s => s === 503).length).toBeGreaterThan(0)
    expect(links.map(r => r.status)).toEqual(Array(10).fill(400))

    // A known e-mail at sign-up is not hashed either: the answer comes back before any work is done.
    const known = await newGuest('known')
    expect((await new Client().post('/api/auth/signup', { ...adult, email: known.email })).status).toBe(202)

    // One client may try e-mailed links 20 times an hour (LIMITS.linkPerClient).
    const guesser = new Client()
    for (let i = 0; i < 20; i++) expect((await guesser.post('/api/auth/password-reset/confirm', { token: bogus, password: 'new-password-123' })).status).toBe(400)
    expect((await guesser.post('/api/auth/password-reset/confirm', { token: bogus, password: 'new-password-123' })).status).toBe(429)
    expect((await guesser.post('/api/auth/invitation', { token: bogus, password: 'new-password-123' })).status).toBe(429)
  })

  it('16.9 sign-up and reset answer alike for known and unknown addresses, and one inbox gets at most 3 reset e-mails an hour', async () => {
    const known = await newGuest('discover')
    const fresh = uniqueEmail('discover-new')
    const taken = await new Client().post('/api/auth/signup', { ...adult, email: known.email })
    const created = await new Client().post('/api/auth/signup', { ...adult, email: fresh })
    expect(taken.status).toBe(created.status)
    expect(taken.body.message.replace(known.email, '<address>')).toBe(created.body.message.replace(fresh, '<address>'))
    // Neither answer signs anybody in: the e-mailed link does that.
    expect(taken.headers.getSetCookie().length).toBe(created.headers.getSetCookie().length)
    await waitForMail(known.email, /already have an account/)
    await waitForMail(fresh, /Confirm your e-mail address/)

    const unknown = uniqueEmail('discover-nobody')
    const a = await new Client().post('/api/auth/password-reset', { email: known.email })
    const b = await new Client().post('/api/auth/password-reset', { email: unknown })
    expect([a.status, b.status]).toEqual([200, 200])
    expect(a.body).toEqual(b.body)

    // Eight requests from eight clients for one address: the answer is the same each time, the inbox gets 3.
    const flood = await Promise.all(Array.from({ length: 8 }, () => new Client().post('/api/auth/password-reset', { email: known.email })))
    expect(flood.map(r => r.status)).toEqual(Array(8).fill(200))
    await waitForMail(known.email, /Reset your/, { count: 3 })
    await pause(1500)
    expect(await mailsTo(known.email, /Reset your/)).toBe(3)

    // One client may ask for 10 resets an hour (LIMITS.resetRequestPerClient).
    const asker = new Client()
    for (let i = 0; i < 10; i++) expect((await asker.post('/api/auth/password-reset', { email: uniqueEmail(`ask${i}`) })).status).toBe(200)
    expect((await asker.post('/api/auth/password-reset', { email: uniqueEmail('ask10') })).status).toBe(429)
  })

  it('16.10 a stranger\'s failed sign-ins do not lock the owner out', async () => {
    const owner = await newGuest('owner')
    const ownerHome = new Client()
    // Twelve failures from one stranger's address, then more from others.
    const stranger = new Client()
    const tries = []
    for (let i = 0; i < 12; i++) tries.push((await stranger.signIn(owner.email, `wrong-guess-${i}`)).status)
    expect(tries.slice(0, 5)).toEqual(Array(5).fill(401))
    expect(tries.slice(5)).toEqual(Array(7).fill(429))
    for (let i = 0; i < 8; i++) expect((await new Client().signIn(owner.email, `other-guess-${i}`)).status).toBe(401)
    // The owner, from their own address and with the right password, signs in.
    expect((await ownerHome.signIn(owner.email, 'guest-password-1')).status).toBe(200)
    // The stranger is still waiting, even with a right guess.
    expect((await stranger.signIn(owner.email, 'guest-password-1')).status).toBe(429)
  })

  it('16.15 booking e-mails go only to the account\'s confirmed address, and names refuse line breaks', async () => {
    const guest = await newGuest('mail-target')
    const victim = uniqueEmail('victim')
    const session = await newSession(manager, { seats: 8 })
    const res = await guest.client.post('/api/bookings', { ...bookingBody(session.id, guest, 2), contactEmail: victim })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect((await payCheckout(checkoutIdOf(res.body.checkoutUrl))).status).toBe(200)
    await waitForState(res.body.booking.id, 'confirmed')
    await waitForMail(guest.email, /confirmed/i)
    expect(res.body.booking.contactEmail).toBe(guest.email)
    expect(await countRows('outbox', 'to_address = ?', [victim])).toBe(0)

    const broken = 'Ann\nVisit our site for a prize'
    const signUp = await new Client().post('/api/auth/signup', { ...adult, name: broken, email: uniqueEmail('linebreak') })
    expect(signUp.status).toBe(400)
    expect(signUp.body.data.fields.name).toMatch(/one line/)
    const other = await newSession(manager, { seats: 8 })
    const booking = await guest.client.post('/api/bookings', { ...bookingBody(other.id, guest, 1), contactName: 'Ann\r\nBcc: x@example.test' })
    expect(booking.status).toBe(400)
    expect(booking.body.data.fields.contactName).toMatch(/one line/)
    const invite = await manager.post('/api/staff', { name: 'New\u2028Host', email: uniqueEmail('linebreak-staff'), role: 'host' })
    expect(invite.status).toBe(400)
    expect(invite.body.data.fields.name).toMatch(/one line/)
  })

  it('16.16c a host cannot record check-ins on a past day\'s session after the grace period; a manager can', async () => {
    const host = await signedIn('host')
    const hostId = (await host.get('/api/account')).body.id as number
    const session = await newSession(manager, { seats: 8 })
    expect((await manager.patch(`/api/sessions/${session.id}`, { hostId })).status).toBe(200)
    const party = await bookAndPay(await newGuest('late-door'), session.id, 2)
    // The session started two days ago (75 minutes long, DOOR_GRACE_HOURS = 6 after its end).
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [new Date(Date.now() - 48 * 3_600_000), session.id]))
    const byHost = await host.post(`/api/bookings/${party.id}/check-in`, { seated: 2, idsSeen: 2 })
    expect(byHost.status).toBe(409)
    expect(byHost.body.message).toMatch(/Ask a manager/)
    expect((await host.post(`/api/bookings/${party.id}/no-show`)).status).toBe(409)
    expect((await manager.post(`/api/bookings/${party.id}/check-in`, { seated: 2, idsSeen: 2 })).status).toBe(200)
  })
})
