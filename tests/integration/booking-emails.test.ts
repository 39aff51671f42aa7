import { beforeAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import type { ParsedMail } from 'mailparser'
import type { StoredMail } from '../../scripts/fakes/mail'
import { Client, uniqueEmail } from '../support/http'
import { withDb } from '../support/db'
import { parseMail, rawMail, setMailFault, waitForMail } from '../support/mail'
import {
  bookAndPay, bookingBody, checkoutIdOf, newGuest, newSession, payCheckout, setStripeFault, signedIn, waitFor, waitForState,
} from '../support/booking'
import { fixedCautionLines } from '../../shared/cautions'
import type { PublicVenue } from '../../shared/types/venue'

// The sender address of runtimeConfig.smtp.from in nuxt.config.ts; the tests set no NUXT_SMTP_FROM.
const CONFIGURED_SENDER = 'no-reply@larmoir.test'
const PNG_SIGNATURE = '89504e470d0a1a0a' // ISO/IEC 15948, the first eight bytes of every PNG

let manager: Client
let venue: PublicVenue
beforeAll(async () => {
  manager = await signedIn('manager@saltmarsh.test')
  venue = (await new Client().get('/api/venue')).body
  // What the checks below compare against must be there to compare.
  expect(venue.email).toMatch(/@/)
  expect(venue.phone).toMatch(/\d{3}/)
  expect(venue.locale).toBe('en-US')
})

/** HTML as a reader of the source would see the venue's details: & written as &amp;. */
const inHtml = (s: string) => s.replace(/&/g, '&amp;')

/** What every e-mail of the venue must be: its name and reply address, a text and an HTML part, its contact below. */
async function expectVenueMail(mail: StoredMail): Promise<ParsedMail> {
  const parsed = await parseMail(mail)
  const source = await rawMail(mail)
  expect(parsed.from?.value).toEqual([{ name: venue.name, address: CONFIGURED_SENDER }])
  expect(parsed.replyTo?.value).toEqual([{ name: venue.name, address: venue.email }])
  expect(source).toMatch(/^Content-Type: multipart\/alternative;/m)
  expect(parsed.text?.trim().length).toBeGreaterThan(40)
  expect(typeof parsed.html).toBe('string')
  const html = parsed.html as string
  expect(html).toMatch(/^<!doctype html>/i)
  for (const contact of [venue.phone, venue.email]) {
    expect(parsed.text).toContain(contact)
    expect(html).toContain(inHtml(contact))
  }
  expect(html).toContain(inHtml(venue.name))
  return parsed
}

/** The QR image the HTML shows: an <img src="cid:…"> whose part is an inline PNG with that content id. */
function inlineQr(parsed: ParsedMail) {
  const html = parsed.html as string
  const cid = /<img\b[^>]*\bsrc="cid:([^"]+)"/.exec(html)?.[1]
  expect(cid, 'an image by content id in the HTML').toBeTruthy()
  const part = parsed.attachments.find(a => a.cid === cid)
  expect(part, `a part with content id ${cid}`).toBeTruthy()
  expect(part).toMatchObject({ contentType: 'image/png', contentDisposition: 'inline', related: true })
  expect(part!.content.subarray(0, 8).toString('hex')).toBe(PNG_SIGNATURE)
  return part!
}

/** The cut-off instant of a session as the venue's clock reads it, by luxon rather than the app's own formatter. */
function localCutoff(startsAt: string) {
  const at = DateTime.fromISO(startsAt).minus({ hours: venue.cancellationCutoffHours }).setZone(venue.timeZone).setLocale('en-US')
  return { day: at.toFormat('ccc, LLL d'), time: at.toFormat('h:mm a'), at }
}

describe('the confirmation e-mail', () => {
  it('comes in the venue\'s name, as HTML and text, with the QR inline, the calendar attached, the cut-off and the cautions', async () => {
    const session = await newSession(manager, { hoursAhead: venue.cancellationCutoffHours + 5 })
    const guest = await newGuest('mail-confirm')
    const paid = await bookAndPay(guest, session.id, 2)
    const mail = await waitForMail(guest.email, /Booking confirmed/)
    const parsed = await expectVenueMail(mail)
    const html = parsed.html as string

    expect(parsed.text).toContain(paid.reference)
    expect(html).toContain(paid.reference)
    const qr = inlineQr(parsed)
    expect(qr.content.length).toBeGreaterThan(200)
    const files = parsed.attachments.filter(a => a.contentDisposition === 'attachment')
    expect(files.map(a => a.contentType)).toEqual(['text/calendar'])
    expect(files[0]!.content.toString('utf8')).toContain('BEGIN:VEVENT')

    // The cut-off of this session, in the venue's zone, about five hours away.
    const cut = localCutoff(session.startsAt)
    const sentence = new RegExp(`Online cancellation closes at ${cut.day}, ${cut.time.replace(/\s/g, '\\s')} E[DS]T, that is in [56] hours\\.`)
    expect(parsed.text).toMatch(sentence)
    expect(html).toMatch(sentence)

    // The cautions: the flight's standard drinks and the fixed block, in both parts.
    expect(parsed.text).toMatch(/This flight holds \d+(\.\d)? standard drinks? per guest \(one US standard drink = 14 g of ethanol\)\./)
    for (const line of fixedCautionLines(venue)) {
      expect(parsed.text).toContain(line)
      expect(html).toContain(line)
    }
  })

  it('says online cancellation has already closed for a session inside the cut-off, with the venue to contact', async () => {
    const session = await newSession(manager, { hoursAhead: Math.max(3, venue.cancellationCutoffHours - 10) })
    const guest = await newGuest('mail-closed')
    await bookAndPay(guest, session.id, 1)
    const parsed = await expectVenueMail(await waitForMail(guest.email, /Booking confirmed/))
    expect(parsed.text).toContain('Online cancellation for this session has already closed: this booking cannot be cancelled online.')
    expect(parsed.text).not.toMatch(/cancel for a full refund up to/)
    expect(parsed.text).toMatch(new RegExp(`contact .*${venue.phone.replace(/[+]/g, '\\+')}`))
  })

  it('escapes what the guest typed: a name with markup is text in the HTML', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('mail-escape')
    const marked = { ...guest, name: 'Ana <b>"Bold"</b> & <img src=x onerror=alert(1)>' }
    await bookAndPay(marked, session.id, 1)
    const parsed = await parseMail(await waitForMail(guest.email, /Booking confirmed/))
    const html = parsed.html as string
    expect(parsed.text).toContain(marked.name)
    expect(html).not.toContain('<b>')
    expect(html).not.toContain('<img src=x')
    expect(html).toContain('Ana &lt;b&gt;&quot;Bold&quot;&lt;/b&gt; &amp; &lt;img src=x onerror=alert(1)&gt;')
  })
})

describe('every other e-mail of the venue', () => {
  it('cancellation and refund: in the venue\'s name, HTML and text, the reference in the text, and no door code for a booking that is off', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('mail-cancel')
    const paid = await bookAndPay(guest, session.id, 1)
    expect((await guest.client.post(`/api/bookings/${paid.id}/cancel`)).status).toBe(200)
    for (const subject of [/Booking cancelled/, /Refund sent/]) {
      const parsed = await expectVenueMail(await waitForMail(guest.email, subject))
      expect(parsed.text).toContain(paid.reference)
      expect(parsed.html).toContain(paid.reference)
      expect(parsed.html).not.toMatch(/src="cid:/)
    }
  })

  it('the session cancelled by the venue', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('mail-session-off')
    const paid = await bookAndPay(guest, session.id, 1)
    expect((await manager.post(`/api/sessions/${session.id}/cancel`)).status).toBe(200)
    const parsed = await expectVenueMail(await waitForMail(guest.email, /Session cancelled/))
    expect(parsed.text).toContain(paid.reference)
  })

  it('the day-before reminder', async () => {
    const session = await newSession(manager)
    const guest = await newGuest('mail-reminder')
    const paid = await bookAndPay(guest, session.id, 1)
    await withDb(c => c.query('UPDATE tasting_sessions SET starts_at = ? WHERE id = ?', [new Date(Date.now() + 24.5 * 3_600_000), session.id]))
    const parsed = await expectVenueMail(await waitForMail(guest.email, /^Tomorrow:/))
    expect(parsed.text).toContain(paid.reference)
    inlineQr(parsed)
  })

  it('the refund of a payment that came too late', async () => {
    const session = await newSession(manager, { seats: 1 })
    const late = await newGuest('mail-late')
    const res = await late.client.post('/api/bookings', bookingBody(session.id, late, 1))
    await setStripeFault('error') // the sweep cannot close the payment page
    try {
      await withDb(c => c.query('UPDATE bookings SET hold_expires_at = ? WHERE id = ?', [new Date(Date.now() - 1000), res.body.booking.id]))
      await waitForState(res.body.booking.id, 'expired')
    }
    finally { await setStripeFault(null) }
    await bookAndPay(await newGuest('mail-late-taker'), session.id, 1)
    expect((await payCheckout(checkoutIdOf(res.body.checkoutUrl))).status).toBe(200)
    const parsed = await expectVenueMail(await waitForMail(late.email, /could not keep your seats/, { timeoutMs: 15_000 }))
    expect(parsed.text).toContain(res.body.booking.reference)
  })

  it('the account e-mails: an invitation and a password reset', async () => {
    const invitee = uniqueEmail('mail-invitee')
    expect((await manager.post('/api/staff', { name: 'Mail Invitee', email: invitee, role: 'host' })).status).toBe(201)
    const invitation = await expectVenueMail(await waitForMail(invitee, /invited/))
    expect(invitation.text).toMatch(/\/welcome\?token=/)
    expect(invitation.html).toMatch(/<a [^>]*href="https?:\/\/[^"]+\/welcome\?token=[\w-]{43}"/)

    const guest = await newGuest('mail-reset')
    expect((await new Client().post('/api/auth/password-reset', { email: guest.email })).status).toBe(200)
    const reset = await expectVenueMail(await waitForMail(guest.email, /Reset your/))
    expect(reset.text).toMatch(/\/reset-password\?token=/)
    expect(reset.html).toMatch(/<a [^>]*href="https?:\/\/[^"]+\/reset-password\?token=[\w-]{43}"/)
  })

  it('a confirmation queued while the mail server refuses is sent later whole: HTML, inline QR and calendar from the outbox', { timeout: 40_000 }, async () => {
    const session = await newSession(manager)
    const guest = await newGuest('mail-outbox')
    const outbox = () => withDb(async c => (await c.query('SELECT status, attempts, html_body, attachments FROM outbox WHERE to_address = ? AND subject LIKE ?', [guest.email, 'Booking confirmed%']))[0] as any[])
    let reference = ''
    try {
      await setMailFault('reject')
      reference = (await bookAndPay(guest, session.id, 1)).reference
      await waitFor(async () => (await outbox()).some(r => r.attempts >= 1), 'a refused attempt', 15_000)
      const [row] = await outbox()
      expect(row.status).toBe('pending')
      const stored = typeof row.attachments === 'string' ? JSON.parse(row.attachments) : row.attachments
      const cid = /src="cid:([^"]+)"/.exec(row.html_body)?.[1]
      expect(stored.find((a: { cid?: string }) => a.cid === cid)).toMatchObject({ contentType: 'image/png' })
    }
    finally { await setMailFault(null) }
    // The back-off would wait 30 s: bring the next attempt forward instead of waiting.
    await withDb(c => c.query('UPDATE outbox SET next_attempt_at = NOW(3) WHERE to_address = ?', [guest.email]))
    const parsed = await expectVenueMail(await waitForMail(guest.email, /Booking confirmed/))
    expect(parsed.text).toContain(reference)
    inlineQr(parsed)
    expect(parsed.attachments.filter(a => a.contentDisposition === 'attachment').map(a => a.contentType)).toEqual(['text/calendar'])
  })
})
