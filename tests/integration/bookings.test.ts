import { afterEach, beforeAll, describe, expect, it, inject } from 'vitest'
import Papa from 'papaparse'
import Stripe from 'stripe'
import { Client } from '../support/http'
import { countRows, withDb } from '../support/db'
import { waitForMail } from '../support/mail'
import {
  bookAndPay, bookingBody, bookingRow, checkoutIdOf, fakeEvents, fakeStripe, newGuest, newSession, outboxRows, payCheckout,
  seatsLeft, setStripeFault, signedIn, waitFor, waitForEvent, waitForState,
} from '../support/booking'
import { localSecrets } from '../../scripts/lib/secrets'
import { TEST_CARD_DECLINE } from '../../scripts/fakes/stripe'
import { DEMO_VENUE } from '../../server/demo/data'

const LOCAL_STRIPE_WEBHOOK_SECRET = localSecrets('test').stripeWebhookSecret

let manager: Client
beforeAll(async () => { manager = await signedIn('manager@saltmarsh.test') })
afterEach(async () => { await setStripeFault(null) })

const hoursFromNow = (h: number) => new Date(Date.now() + h * 3_600_000)

describe('holding seats and paying', () => {
  it('holds seats, pays on the fake, is confirmed by the webhook and e-mails a calendar file and a QR code', async () => {
    const session = await newSession(manager, { seats: 6, priceMinor: 3500 })
    const guest = await newGuest('pays')
    const before = Date.now()
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    expect(res.status).toBe(201)
    expect(res.body.checkoutUrl).toMatch(new RegExp(`^${inject('stripeUrl')}/pay/cs_test_`))
    expect(res.body.booking).toMatchObject({ state: 'held', partySize: 2, amountMinor: 7000, currency: 'USD' })
    expect(res.body.booking.reference).toMatch(/^[0-9A-HJKMNP-TV-Z]{10}$/) // Crockford base32 alphabet
    const held = await bookingRow(res.body.booking.id)
    expect(held.hold_expires_at.getTime() - before).toBeGreaterThan(14 * 60_000) // default hold: 15 minutes (the default)
    expect(held.hold_expires_at.getTime() - before).toBeLessThan(31 * 60_000)
    expect(await seatsLeft(session.id)).toBe(4)

    const checkoutId = checkoutIdOf(res.body.checkoutUrl)
    const cs = await fakeStripe().checkout.sessions.retrieve(checkoutId)
    expect(cs.metadata?.bookingId).toBe(String(res.body.booking.id))
    expect(cs.amount_total).toBe(7000)
    expect(Math.abs(cs.expires_at * 1000 - held.hold_expires_at.getTime())).toBeLessThan(2 * 60_000)

    expect((await payCheckout(checkoutId)).status).toBe(200)
    const row = await waitForState(res.body.booking.id, 'confirmed')
    expect(row.amount_paid_minor).toBe(7000)
    expect(row.payment_intent_id).toMatch(/^pi_/)
    expect(await seatsLeft(session.id)).toBe(4)

    const mail = await waitForMail(guest.email, /Booking confirmed/)
    expect(mail.text).toContain(res.body.booking.reference)
    expect(mail.text).toContain(DEMO_VENUE.address)
    expect(mail.text).toMatch(/Party: 2 guests/)
    expect(mail.text).toContain('$70.00')
    expect(mail.text).toMatch(/[AP]M E[DS]T/) // the venue's zone, America/New_York
    expect(mail.attachments.map(a => a.contentType).sort()).toEqual(['image/png', 'text/calendar'])
    const [stored] = (await outboxRows(guest.email)).filter(m => /Booking confirmed/.test(m.subject))
    const ics = Buffer.from(stored!.attachments!.find(a => a.filename.endsWith('.ics'))!.contentBase64, 'base64').toString('utf8')
    const startUtc = new Date(session.startsAt).toISOString().replace(/[-:]/g, '').replace(/\.\d{3}/, '') // RFC 5545 UTC form
    expect(ics).toContain('BEGIN:VEVENT')
    expect(ics).toContain(`DTSTART:${startUtc}`)
    expect(ics).toContain(DEMO_VENUE.address.split(',')[0]!)
    const png = Buffer.from(stored!.attachments!.find(a => a.filename.endsWith('.png'))!.contentBase64, 'base64')
    expect(png.subarray(0, 8).toString('hex')).toBe('89504e470d0a1a0a') // PNG signature, ISO/IEC 15948
    expect(await countRows('payment_events', 'booking_id = ? AND type = ?', [res.body.booking.id, 'checkout.session.completed'])).toBe(1)

    // The booking page's own downloads: the same calendar entry and the reference as a QR code.
    const calendar = await guest.client.raw(`/bookings/${res.body.booking.id}/calendar.ics`)
    expect(calendar.status).toBe(200)
    expect(calendar.headers.get('content-type')).toBe('text/calendar; charset=utf-8')
    expect(calendar.headers.get('content-disposition')).toMatch(/^attachment; filename=".+\.ics"$/)
    expect(await calendar.text()).toContain(`DTSTART:${startUtc}`)
    const qr = await guest.client.raw(`/bookings/${res.body.booking.id}/qr.svg`)
    expect(qr.status).toBe(200)
    expect(qr.headers.get('content-type')).toBe('image/svg+xml; charset=utf-8')
    expect(qr.headers.get('cache-control')).toBe('no-store') // a private download: kept by no cache (RFC 9111 §5.2.2.5)
    expect(await qr.text()).toContain('<svg')
  })

  it('a replayed event changes nothing', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('replay')
    const paid = await bookAndPay(guest, session.id)
    await waitForMail(guest.email, /Booking confirmed/)
    const event = await waitForEvent('checkout.session.completed', paid.checkoutId)
    const eventsBefore = await countRows('payment_events')
    const rowBefore = await bookingRow(paid.id)
    const res = await fetch(`${inject('stripeUrl')}/__fake/events/${event.id}/redeliver`, { method: 'POST' })
    expect(res.status).toBe(202)
    await waitFor(async () => {
      const again = (await fakeEvents()).find(e => e.id === event.id)!
      return again.delivery.attempts > event.delivery.attempts && again.delivery.status === 'delivered'
    }, 'the redelivery')
    expect(await countRows('payment_events')).toBe(eventsBefore)
    expect(await bookingRow(paid.id)).toEqual(rowBefore)
    expect((await outboxRows(guest.email)).filter(m => /Booking confirmed/.test(m.subject))).toHaveLength(1)
  })

  it('refuses unsigned and wrongly signed webhooks with 400 and writes nothing', async () => {
    const payload = JSON.stringify({ id: 'evt_forged_1', object: 'event', type: 'checkout.session.completed', data: { object: { id: 'cs_test_forged', object: 'checkout.session', payment_status: 'paid', metadata: { bookingId: '1' } } } })
    const post = (headers: Record<string, string>) => fetch(`${inject('appUrl')}/webhooks/stripe`, { method: 'POST', headers: { 'content-type': 'application/json', ...headers }, body: payload })
    const before = await countRows('payment_events')
    expect((await post({})).status).toBe(400)
    expect((await post({ 'stripe-signature': 't=1700000000,v1=deadbeef' })).status).toBe(400)
    const wrongSecret = Stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_not_the_right_one' })
    expect((await post({ 'stripe-signature': wrongSecret })).status).toBe(400)
    expect(await countRows('payment_events')).toBe(before)
    // The same body signed with the right secret is accepted; it names no booking of ours, so nothing changes.
    const right = Stripe.webhooks.generateTestHeaderString({ payload, secret: LOCAL_STRIPE_WEBHOOK_SECRET })
    const ok = await post({ 'stripe-signature': right })
    expect(ok.status).toBe(200)
    expect(await countRows('payment_events', 'provider_event_id = ?', ['evt_forged_1'])).toBe(1)
  })

  it('a declined card keeps the hold; the guest can pay with another card', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('declined')
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 1))
    const checkoutId = checkoutIdOf(res.body.checkoutUrl)
    expect((await payCheckout(checkoutId, TEST_CARD_DECLINE)).status).toBe(402) // Stripe docs: 4000 0000 0000 0002 is declined
    const cs = await fakeStripe().checkout.sessions.retrieve(checkoutId)
    await waitForEvent('payment_intent.payment_failed', cs.payment_intent as string)
    expect((await bookingRow(res.body.booking.id)).state).toBe('held')
    expect(await seatsLeft(session.id)).toBe(7)
    expect((await payCheckout(checkoutId)).status).toBe(200)
    await waitForState(res.body.booking.id, 'confirmed')
  })

  it('if the payment service is down, the hold is released and the guest gets a 503', async () => {
    const session = await newSession(manager, { seats: 3 })
    const guest = await newGuest('down')
    await setStripeFault('error')
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 3))
    expect(res.status).toBe(503)
    expect(res.body.message).toMatch(/nothing was charged/)
    const [row] = await withDb(async c => (await c.query('SELECT state, end_reason FROM bookings WHERE session_id = ?', [session.id]))[0] as any[])
    expect(row).toMatchObject({ state: 'expired', end_reason: 'checkout_failed' })
    expect(await seatsLeft(session.id)).toBe(3)
  })
})

describe('holds that run out', () => {
  it('the sweep releases a hold past its time and closes its payment page', async () => {
    const session = await newSession(manager, { seats: 4 })
    const guest = await newGuest('runout')
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 3))
    expect(await seatsLeft(session.id)).toBe(1)
    await withDb(c => c.query('UPDATE bookings SET hold_expires_at = ? WHERE id = ?', [new Date(Date.now() - 1000), res.body.booking.id]))
    const row = await waitForState(res.body.booking.id, 'expired')
    expect(row.end_reason).toBe('hold_expired')
    expect(await seatsLeft(session.id)).toBe(4)
    const checkoutId = checkoutIdOf(res.body.checkoutUrl)
    expect((await fakeStripe().checkout.sessions.retrieve(checkoutId)).status).toBe('expired')
    expect((await payCheckout(checkoutId)).status).toBe(409)
  })

  it('an expiry event from the payment service releases the seats', async () => {
    const session = await newSession(manager, { seats: 4 })
    const guest = await newGuest('expired-event')
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 4))
    expect(await seatsLeft(session.id)).toBe(0)
    const checkoutId = checkoutIdOf(res.body.checkoutUrl)
    await fakeStripe().checkout.sessions.expire(checkoutId)
    await waitForState(res.body.booking.id, 'expired')
    expect(await seatsLeft(session.id)).toBe(4)
  })

  it('an expiry event that arrives after the payment changes nothing (events may come in any order)', async () => {
    const session = await newSession(manager)
    const paid = await bookAndPay(await newGuest('expired-after-paid'), session.id, 2)
    const payload = JSON.stringify({
      id: `evt_out_of_order_${paid.id}`, object: 'event', type: 'checkout.session.expired', api_version: Stripe.API_VERSION, created: Math.floor(Date.now() / 1000),
      data: { object: { id: paid.checkoutId, object: 'checkout.session', status: 'expired', payment_status: 'unpaid', metadata: { bookingId: String(paid.id) } } },
    })
    const res = await fetch(`${inject('appUrl')}/webhooks/stripe`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'stripe-signature': Stripe.webhooks.generateTestHeaderString({ payload, secret: LOCAL_STRIPE_WEBHOOK_SECRET }) },
      body: payload,
    })
    expect(res.status).toBe(200)
    expect(await res.json()).toMatchObject({ duplicate: false, outcome: 'nothing to do: booking is confirmed' })
    expect((await bookingRow(paid.id)).state).toBe('confirmed')
    expect(await seatsLeft(session.id)).toBe(6)
  })

  it('a payment that arrives after the hold ran out is refunded at once, even while the seats are free', async () => {
    const session = await newSession(manager, { seats: 2 })
    const guest = await newGuest('late-free')
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    await setStripeFault('error') // the sweep cannot close the payment page
    await withDb(c => c.query('UPDATE bookings SET hold_expires_at = ? WHERE id = ?', [new Date(Date.now() - 1000), res.body.booking.id]))
    await waitForState(res.body.booking.id, 'expired')
    await setStripeFault(null)
    expect((await payCheckout(checkoutIdOf(res.body.checkoutUrl))).status).toBe(200)
    const row = await waitFor(async () => {
      const r = await bookingRow(res.body.booking.id)
      return r.refunded_at ? r : null
    }, 'the late payment to be refunded')
    expect(row).toMatchObject({ state: 'expired', end_reason: 'late_payment_no_seats', amount_paid_minor: 7000, amount_refunded_minor: 7000 })
    expect(await seatsLeft(session.id)).toBe(2)
    await waitForMail(guest.email, /could not keep your seats/)
  })

  it('a payment that arrives after the hold ran out and the seats were taken is refunded, never overbooked', async () => {
    const session = await newSession(manager, { seats: 2 })
    const late = await newGuest('late-full')
    const res = await late.client.post('/api/bookings', bookingBody(session.id, late, 2))
    await setStripeFault('error')
    await withDb(c => c.query('UPDATE bookings SET hold_expires_at = ? WHERE id = ?', [new Date(Date.now() - 1000), res.body.booking.id]))
    await waitForState(res.body.booking.id, 'expired')
    await setStripeFault(null)
    await bookAndPay(await newGuest('took-seats'), session.id, 2)
    expect((await payCheckout(checkoutIdOf(res.body.checkoutUrl))).status).toBe(200)
    const row = await waitFor(async () => {
      const r = await bookingRow(res.body.booking.id)
      return r.refunded_at ? r : null
    }, 'the late payment to be refunded')
    expect(row).toMatchObject({ state: 'expired', end_reason: 'late_payment_no_seats', amount_paid_minor: 7000, amount_refunded_minor: 7000 })
    expect((await fakeStripe().refunds.retrieve(row.refund_id)).amount).toBe(7000)
    await waitForMail(late.email, /could not keep your seats/)
    const taken = await withDb(async c => (await c.query(`SELECT COALESCE(SUM(party_size), 0) AS n FROM bookings WHERE session_id = ? AND state IN ('held', 'confirmed', 'checked_in')`, [session.id]))[0] as any[])
    expect(Number(taken[0].n)).toBe(2)
  })
})

describe('what the booking form must get right', () => {
  it('refuses a booker under the legal drinking age with a clear 400', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('young')
    const dob = new Date(Date.now() - 20 * 365.25 * 86_400_000).toISOString().slice(0, 10) // about 20 years old
    await withDb(c => c.query('UPDATE users SET date_of_birth = ? WHERE email = ?', [dob, guest.email]))
    const before = await countRows('bookings')
    const res = await guest.client.post('/api/bookings', { ...bookingBody(session.id, guest), dateOfBirth: dob })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.dateOfBirth).toMatch(/21 or older/)
    expect(await countRows('bookings')).toBe(before)
  })

  it('refuses a date of birth that differs from the account', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('dob-mismatch')
    const res = await guest.client.post('/api/bookings', { ...bookingBody(session.id, guest), dateOfBirth: '1970-01-01' })
    expect(res.status).toBe(400)
    expect(res.body.data.fields.dateOfBirth).toMatch(/not the date of birth on your account/)
  })

  it('requires the age and ID confirmation', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('no-confirm')
    for (const ageConfirmed of [false, undefined]) {
      const res = await guest.client.post('/api/bookings', { ...bookingBody(session.id, guest), ageConfirmed })
      expect(res.status).toBe(400)
      expect(Object.keys(res.body.data.fields)).toEqual(['ageConfirmed'])
    }
  })

  it('answers 400 with a message per bad field and writes nothing', async () => {
    const guest = await newGuest('bad-input')
    const before = await countRows('bookings')
    const res = await guest.client.post('/api/bookings', { sessionId: 'x', partySize: 0, contactName: '', contactEmail: 'nope', contactPhone: 'call me', dateOfBirth: '2001-02-30', ageConfirmed: 'yes' })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['ageConfirmed', 'contactName', 'contactPhone', 'dateOfBirth', 'partySize', 'sessionId'])
    const tooMany = await guest.client.post('/api/bookings', { ...bookingBody(1, guest), partySize: 11 })
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.data.fields.partySize).toMatch(/1 to 10/)
    const notJson = await guest.client.request('POST', '/api/bookings', '{', { 'content-type': 'application/json' })
    expect(notJson.status).toBe(400)
    expect(await countRows('bookings')).toBe(before)
  })

  it('refuses more guests than seats left with a 409 that says how many are left', async () => {
    const session = await newSession(manager, { seats: 3 })
    const a = await newGuest('seats-a')
    expect((await a.client.post('/api/bookings', bookingBody(session.id, a, 2))).status).toBe(201)
    const b = await newGuest('seats-b')
    const res = await b.client.post('/api/bookings', bookingBody(session.id, b, 2))
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/Only 1 seat left/)
    expect(res.body.data.seatsLeft).toBe(1)
  })

  it('lets one guest keep at most three unpaid holds at a time', async () => {
    const sessions = [await newSession(manager, { seats: 10 }), await newSession(manager, { seats: 10 }), await newSession(manager, { seats: 10 })]
    const fourthSession = await newSession(manager, { seats: 10 })
    const guest = await newGuest('hoarder')
    for (const s of sessions) expect((await guest.client.post('/api/bookings', bookingBody(s.id, guest, 1))).status).toBe(201)
    const fourth = await guest.client.post('/api/bookings', bookingBody(fourthSession.id, guest, 1))
    expect(fourth.status).toBe(409)
    expect(fourth.body.message).toMatch(/already have 3 bookings waiting for payment/)
    expect(await seatsLeft(fourthSession.id)).toBe(10)
    // Asking again for a session it already holds is no new hold: the limit does not stand in the way.
    const again = await guest.client.post('/api/bookings', bookingBody(sessions[0]!.id, guest, 1))
    expect(again.status).toBe(200)
  })

  it('refuses a session past its booking cut-off', async () => {
    const session = await newSession(manager, { hoursAhead: 3, bookingCutoffMinutes: 240 })
    const guest = await newGuest('cutoff')
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 1))
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/closed 240 minutes before/)
  })
})

describe('asking again for a session the guest already holds', () => {
  const holdsOf = (sessionId: number, email: string) => withDb(async (c) => {
    const [rows] = await c.query('SELECT b.id, b.state FROM bookings b JOIN users u ON u.id = b.user_id WHERE b.session_id = ? AND u.email = ?', [sessionId, email])
    return rows as { id: number, state: string }[]
  })

  it('answers with the live hold and its payment page: one booking, one set of seats', async () => {
    const session = await newSession(manager, { seats: 6 })
    const guest = await newGuest('twice')
    const first = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    expect(first.status).toBe(201)
    const second = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    expect(second.status).toBe(200)
    expect(second.body.booking.id).toBe(first.body.booking.id)
    expect(second.body.checkoutUrl).toBe(first.body.checkoutUrl)
    expect(second.body.resumed).toBe(true)
    expect(first.body.resumed).toBe(false)
    expect(await holdsOf(session.id, guest.email)).toEqual([{ id: first.body.booking.id, state: 'held' }])
    expect(await seatsLeft(session.id)).toBe(4)
    // Two at once for a session not yet held (a double tap) end the same way: one hold, one payment page.
    const other = await newSession(manager, { seats: 6 })
    const both = await Promise.all([0, 1].map(() => guest.client.post('/api/bookings', bookingBody(other.id, guest, 2))))
    expect(both.map(r => r.status).sort()).toEqual([200, 201])
    expect(both[0]!.body.booking.id).toBe(both[1]!.body.booking.id)
    expect(both[0]!.body.checkoutUrl).toBe(both[1]!.body.checkoutUrl)
    expect(await holdsOf(other.id, guest.email)).toHaveLength(1)
  })

  it('a different party size is a 409 that names the hold; after giving it back a new one is made', async () => {
    const session = await newSession(manager, { seats: 6 })
    const guest = await newGuest('twice-other-size')
    const first = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    const bigger = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 3))
    expect(bigger.status).toBe(409)
    expect(bigger.body.message).toMatch(/already holding 2 seats/)
    expect(bigger.body.data.booking.id).toBe(first.body.booking.id)
    expect(await holdsOf(session.id, guest.email)).toHaveLength(1)
    expect((await guest.client.post(`/api/bookings/${first.body.booking.id}/release`)).status).toBe(200)
    const again = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 3))
    expect(again.status).toBe(201)
    expect(again.body.booking.id).not.toBe(first.body.booking.id)
    expect(await seatsLeft(session.id)).toBe(3)
  })

  it('the booking page is never stored, so Back from the payment page asks the server again', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('no-store')
    const page = await guest.client.raw(`/book/${session.id}`)
    expect(page.status).toBe(200)
    expect(page.headers.get('cache-control')).toBe('no-store') // RFC 9111 §5.2.2.5: no part of the response is stored
  })

  it('a hold whose time ran out is not resumed', async () => {
    const session = await newSession(manager, { seats: 6 })
    const guest = await newGuest('twice-ran-out')
    const first = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    await withDb(c => c.query('UPDATE bookings SET hold_expires_at = ? WHERE id = ?', [new Date(Date.now() - 1000), first.body.booking.id]))
    const again = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    expect(again.status).toBe(201)
    expect(again.body.booking.id).not.toBe(first.body.booking.id)
  })

  it('the guest\'s bookings can be read for one session (the booking page looks for a live hold there)', async () => {
    const [a, b] = [await newSession(manager), await newSession(manager)]
    const guest = await newGuest('per-session')
    const onA = await guest.client.post('/api/bookings', bookingBody(a.id, guest, 2))
    await guest.client.post('/api/bookings', bookingBody(b.id, guest, 1))
    const list = await guest.client.get(`/api/bookings?sessionId=${a.id}`)
    expect(list.status).toBe(200)
    expect(list.body.map((x: { id: number }) => x.id)).toEqual([onA.body.booking.id])
    expect(list.body[0]).toMatchObject({ state: 'held', canRelease: true, partySize: 2, contactPhone: '+1 207 555 0100' })
    expect((await guest.client.get('/api/bookings')).body).toHaveLength(2)
    expect((await guest.client.get('/api/bookings?sessionId=x')).status).toBe(400)
  })
})

describe('my bookings', () => {
  it('another guest\'s booking answers 404, like a missing one', async () => {
    const session = await newSession(manager)
    const owner = await newGuest('owner')
    const paid = await bookAndPay(owner, session.id)
    const other = await newGuest('nosy')
    expect((await other.client.get(`/api/bookings/${paid.id}`)).status).toBe(404)
    expect((await other.client.post(`/api/bookings/${paid.id}/cancel`)).status).toBe(404)
    expect((await other.client.post(`/api/bookings/${paid.id}/release`)).status).toBe(404)
    expect((await other.client.get('/api/bookings')).body).toEqual([])
    expect((await owner.client.get('/api/bookings')).body.map((b: { id: number }) => b.id)).toEqual([paid.id])
    expect((await owner.client.get(`/api/bookings/${paid.id}`)).body).toMatchObject({ state: 'confirmed', canCancel: true, reference: paid.reference })
    expect((await other.client.get('/api/bookings/999999')).status).toBe(404)
  })

  it('cancelling before the cut-off refunds on the payment service, releases the seats and e-mails twice', async () => {
    const session = await newSession(manager, { seats: 4 })
    const guest = await newGuest('cancels')
    const paid = await bookAndPay(guest, session.id, 2)
    expect(await seatsLeft(session.id)).toBe(2)
    const res = await guest.client.post(`/api/bookings/${paid.id}/cancel`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ state: 'refunded', amountRefundedMinor: 7000 })
    const row = await bookingRow(paid.id)
    expect(row).toMatchObject({ state: 'refunded', end_reason: 'guest_cancelled' })
    const refund = await fakeStripe().refunds.retrieve(row.refund_id)
    expect(refund).toMatchObject({ amount: 7000, payment_intent: row.payment_intent_id, status: 'succeeded' })
    expect(await seatsLeft(session.id)).toBe(4)
    await waitForMail(guest.email, /Booking cancelled/)
    await waitForMail(guest.email, /Refund sent: \$70\.00/)
    // Not on the diagram: a refunded booking cannot be cancelled again, nor its hold given back.
    expect((await guest.client.post(`/api/bookings/${paid.id}/cancel`)).status).toBe(409)
    expect((await guest.client.post(`/api/bookings/${paid.id}/release`)).status).toBe(409)
    await new Promise(r => setTimeout(r, 1500)) // the refund webhook arrives too; it must not refund or e-mail again
    expect((await outboxRows(guest.email)).filter(m => /Refund sent/.test(m.subject))).toHaveLength(1)
  })

  it('a refund the payment service refused is made by the sweep once the service is back', async () => {
    const session = await newSession(manager, { seats: 4 })
    const guest = await newGuest('refund-retry')
    const paid = await bookAndPay(guest, session.id, 2)
    await setStripeFault('error')
    try {
      expect((await guest.client.post(`/api/bookings/${paid.id}/cancel`)).status).toBe(200)
    }
    finally { await setStripeFault(null) }
    expect(await bookingRow(paid.id)).toMatchObject({ state: 'cancelled', refunded_at: null })
    expect(await seatsLeft(session.id)).toBe(4)
    // The sweep tries again a minute after the last try: that minute, passed in the row.
    await withDb(c => c.query('UPDATE bookings SET updated_at = ? WHERE id = ?', [new Date(Date.now() - 120_000), paid.id]))
    const row = await waitFor(async () => {
      const r = await bookingRow(paid.id)
      return r.refunded_at ? r : null
    }, 'the sweep to make the refund')
    expect(row).toMatchObject({ state: 'refunded', amount_refunded_minor: 7000 })
    expect((await fakeStripe().refunds.retrieve(row.refund_id)).amount).toBe(7000)
  })

  it('after the cut-off, cancelling is a 409 that states the policy', async () => {
    const session = await newSession(manager, { hoursAhead: 10 })
    const guest = await newGuest('late-cancel')
    const paid = await bookAndPay(guest, session.id, 1)
    const res = await guest.client.post(`/api/bookings/${paid.id}/cancel`)
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/up to 24 hours before the start/)
    // Told to contact the venue, the guest is given its phone and e-mail.
    expect(res.body.message).toContain(DEMO_VENUE.phone)
    expect(res.body.message).toContain(DEMO_VENUE.email)
    expect((await bookingRow(paid.id)).state).toBe('confirmed')
    expect((await guest.client.get(`/api/bookings/${paid.id}`)).body.canCancel).toBe(false)
  })

  it('a guest can give back seats they hold without paying', async () => {
    const session = await newSession(manager, { seats: 2 })
    const guest = await newGuest('gives-back')
    const res = await guest.client.post('/api/bookings', bookingBody(session.id, guest, 2))
    expect((await guest.client.post(`/api/bookings/${res.body.booking.id}/cancel`)).status).toBe(409)
    const released = await guest.client.post(`/api/bookings/${res.body.booking.id}/release`)
    expect(released.status).toBe(200)
    expect(released.body).toMatchObject({ state: 'expired', canRelease: false, endReason: 'hold_released' })
    expect(await seatsLeft(session.id)).toBe(2)
    expect((await fakeStripe().checkout.sessions.retrieve(checkoutIdOf(res.body.checkoutUrl))).status).toBe('expired')
  })

  it('sends one reminder the day before', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('reminded')
    const paid = await bookAndPay(guest, session.id, 1)
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [hoursFromNow(24.5), session.id]))
    await waitForMail(guest.email, /^Tomorrow:/)
    await new Promise(r => setTimeout(r, 2500)) // two more sweeps
    expect((await outboxRows(guest.email)).filter(m => /^Tomorrow:/.test(m.subject))).toHaveLength(1)
    expect((await bookingRow(paid.id)).reminder_sent_at).toBeInstanceOf(Date)
  })
})

describe('the manager', () => {
  it('cancels a whole session: every paid booking refunded and told, holds released', async () => {
    const session = await newSession(manager, { seats: 8 })
    const a = await newGuest('session-a')
    const b = await newGuest('session-b')
    const c = await newGuest('session-c')
    const paidA = await bookAndPay(a, session.id, 2)
    const paidB = await bookAndPay(b, session.id, 3)
    const hold = await c.client.post('/api/bookings', bookingBody(session.id, c, 1))
    const res = await manager.post(`/api/sessions/${session.id}/cancel`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ bookingsCancelled: 2, refunded: 2, refundsPending: 0, holdsReleased: 1 })
    expect(await bookingRow(paidA.id)).toMatchObject({ state: 'refunded', end_reason: 'session_cancelled', amount_refunded_minor: 7000 })
    expect(await bookingRow(paidB.id)).toMatchObject({ state: 'refunded', amount_refunded_minor: 10500 })
    expect(await bookingRow(hold.body.booking.id)).toMatchObject({ state: 'expired', end_reason: 'session_cancelled' })
    for (const g of [a, b]) {
      await waitForMail(g.email, /Session cancelled/)
      await waitForMail(g.email, /Refund sent/)
    }
    expect((await manager.post(`/api/sessions/${session.id}/cancel`)).status).toBe(409)
    const again = await newGuest('session-d')
    expect((await again.client.post('/api/bookings', bookingBody(session.id, again, 1))).status).toBe(409)
  })

  it('sees fill rate and takings per session, and exports the bookings as CSV', async () => {
    const session = await newSession(manager, { seats: 10, priceMinor: 4250 })
    const guest = await newGuest('csv')
    const quoted = { ...guest, name: 'Kit "Kestrel" O\'Hara, Jr.' }
    await bookAndPay(quoted, session.id, 2)
    const formula = { ...(await newGuest('csv-formula')), name: '=HYPERLINK("x")' }
    await bookAndPay(formula, session.id, 1)
    const day = new Intl.DateTimeFormat('en-CA', { timeZone: DEMO_VENUE.timeZone }).format(new Date(session.startsAt)) // en-CA formats as YYYY-MM-DD

    const report = await manager.get(`/api/reports/bookings?from=${day}&to=${day}`)
    expect(report.status).toBe(200)
    const row = report.body.sessions.find((s: { session: { id: number } }) => s.session.id === session.id)
    expect(row).toMatchObject({ seatsTaken: 3, fillRate: 0.3, paidMinor: 12750, refundedMinor: 0, revenueMinor: 12750 })
    expect(row.bookings).toHaveLength(2)

    const csv = await manager.get<string>(`/reports/bookings.csv?from=${day}&to=${day}`)
    expect(csv.status).toBe(200)
    expect(csv.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(csv.headers.get('content-disposition')).toMatch(/attachment; filename="bookings-/)
    const parsed = Papa.parse<Record<string, string>>(csv.body, { header: true, skipEmptyLines: true })
    expect(parsed.errors).toEqual([])
    const mine = parsed.data.filter(r => r['Session id'] === String(session.id))
    expect(mine).toHaveLength(2)
    expect(mine.find(r => r.Guest === quoted.name)).toMatchObject({ Party: '2', State: 'Confirmed', Paid: '85.00', Refunded: '0.00', Currency: 'USD' })
    expect(mine.find(r => r.Guest?.includes('HYPERLINK'))!.Guest).toBe(`'${formula.name}`) // OWASP: CSV injection
    expect(mine[0]!['Session start']).toBe(new Intl.DateTimeFormat('sv-SE', { timeZone: DEMO_VENUE.timeZone, dateStyle: 'short', timeStyle: 'short' }).format(new Date(session.startsAt))) // sv-SE formats as YYYY-MM-DD HH:MM

    const bad = await manager.get('/api/reports/bookings?from=2026-13-01&to=x')
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['from', 'to'])
  })
})

describe('public pages and role checks', () => {
  it('lists published flights and open sessions with seats left to anyone', async () => {
    const anon = new Client()
    const list = await anon.get('/api/flights/published')
    expect(list.status).toBe(200)
    // Other tests publish flights of their own; the demo's one is there with its sessions.
    const shoreline = list.body.find((f: { name: string }) => f.name === 'Shoreline Flight')
    expect(shoreline).toMatchObject({ pourCount: 6, currency: 'USD' })
    expect(shoreline.priceFromMinor).toBeGreaterThan(0)
    expect(shoreline.nextSessions.length).toBeGreaterThan(0)
    const sessions = await anon.get(`/api/flights/${shoreline.id}/sessions`)
    expect(sessions.status).toBe(200)
    for (const s of sessions.body) {
      expect(new Date(s.bookingClosesAt).getTime()).toBeGreaterThan(Date.now())
      expect(s.seatsLeft).toBeLessThanOrEqual(s.seats)
    }
    const drafts = await manager.get('/api/flights')
    const draft = drafts.body.find((f: { status: string }) => f.status === 'draft')
    expect((await anon.get(`/api/flights/${draft.id}/sessions`)).status).toBe(404)
    expect((await anon.get('/api/flights/abc/sessions')).status).toBe(400)
    expect((await anon.get('/api/sessions/999999/availability')).status).toBe(404)
  })

  const guestRoutes: [string, string][] = [
    ['POST', '/api/bookings'],
    ['GET', '/api/bookings'],
    ['GET', '/api/bookings/1'],
    ['POST', '/api/bookings/1/cancel'],
    ['POST', '/api/bookings/1/release'],
  ]
  const managerRoutes: [string, string][] = [
    ['GET', '/api/reports/bookings'],
    ['GET', '/reports/bookings.csv'],
    ['POST', '/api/sessions/1/cancel'],
  ]

  it.each([...guestRoutes, ...managerRoutes])('%s %s: anonymous 401', async (method, path) => {
    expect((await new Client().request(method, path, method === 'POST' ? {} : undefined)).status).toBe(401)
  })

  it.each(managerRoutes)('%s %s: guest, host and marketing 403', async (method, path) => {
    for (const email of ['guest@saltmarsh.test', 'host@saltmarsh.test', 'marketing@saltmarsh.test']) {
      const res = await (await signedIn(email)).request(method, path, method === 'POST' ? {} : undefined)
      expect(res.status, email).toBe(403)
    }
  })

  it('only guests book: staff get 403', async () => {
    const session = await newSession(manager)
    const res = await manager.post('/api/bookings', bookingBody(session.id, { email: 'manager@saltmarsh.test', name: 'M', dateOfBirth: '1980-01-01' }, 1))
    expect(res.status).toBe(403)
  })
})
