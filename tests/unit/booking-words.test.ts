import { describe, expect, it } from 'vitest'
import { BOOKING_END_REASONS, bookingEndWords, cancelCutoffSentence, cancelDeadline } from '../../shared/bookings'
import { venueContactText, websiteLabel } from '../../shared/venueContact'
import { renderEmail } from '../../server/utils/emailLayout'

// Expected strings are what Node's ICU data writes for en-US (common practice, no source).
const us = { timeZone: 'America/New_York', locale: 'en-US' }
const now = new Date('2026-12-02T15:00:00Z') // 10:00 in New York
const venue = { name: 'Tide & Tun', address: '1 Quay Row, Port Ashby', phone: '+1 207 555 0101', email: 'hi@tide.test', website: 'https://tide.test/' }

describe('the cancellation cut-off in words', () => {
  it('names the local instant and how far it is', () => {
    const starts = new Date('2026-12-03T20:00:00Z') // 3:00 PM in New York the next day
    const deadline = cancelDeadline(starts, 24)
    expect(deadline.toISOString()).toBe('2026-12-02T20:00:00.000Z')
    expect(cancelCutoffSentence(deadline, us, now)).toBe('Online cancellation closes at Wed, Dec 2, 3:00 PM EST, that is in 5 hours.')
    expect(cancelCutoffSentence(cancelDeadline(new Date('2026-12-12T20:00:00Z'), 24), us, now)).toMatch(/that is in 9 days\.$/)
  })
  it('says it has closed once the cut-off has passed, at the instant and after', () => {
    const closed = 'Online cancellation for this session has already closed: this booking cannot be cancelled online.'
    expect(cancelCutoffSentence(now, us, now)).toBe(closed)
    expect(cancelCutoffSentence(cancelDeadline(new Date('2026-12-02T20:00:00Z'), 24), us, now)).toBe(closed)
  })
})

describe('how a booking ended, in the guest\'s words', () => {
  it('has words for every end reason, paid or not, and none of them blames the clock but the one that ran out', () => {
    for (const reason of BOOKING_END_REASONS) {
      for (const paid of [false, true]) {
        const words = bookingEndWords(reason, paid)
        expect(words.title.length, reason).toBeGreaterThan(3)
        expect(words.text, reason).toMatch(/\.$/)
        if (reason !== 'hold_expired' && reason !== 'late_payment_no_seats') expect(words.text, reason).not.toMatch(/in time|ran out/)
      }
    }
  })
  it('giving the seats back is the guest\'s own act, with nothing charged', () => {
    expect(bookingEndWords('hold_released', false).text).toBe('You gave the seats back before paying, so nothing was charged.')
    expect(bookingEndWords('hold_expired', false).text).toMatch(/time to pay ran out/)
    expect(bookingEndWords('session_cancelled', true).text).toMatch(/refunded in full/)
    expect(bookingEndWords('session_cancelled', false).text).toMatch(/nothing was charged/)
  })
})

describe('the venue\'s contact', () => {
  it('gives phone, e-mail and website, or the address when there are none', () => {
    expect(venueContactText(venue)).toBe('Tide & Tun: +1 207 555 0101, hi@tide.test, tide.test')
    expect(venueContactText({ ...venue, phone: '', website: '' })).toBe('Tide & Tun: hi@tide.test')
    expect(venueContactText({ ...venue, phone: '', email: '', website: '' })).toBe('Tide & Tun, 1 Quay Row, Port Ashby')
    expect(websiteLabel('http://tide.test/visit/')).toBe('tide.test/visit')
  })
})

describe('an e-mail in two parts', () => {
  const mail = renderEmail({
    venue,
    subject: 'Booking <confirmed>',
    heading: 'You\'re booked',
    greeting: 'Hello <b>Ann</b> & "Co",',
    blocks: [
      { kind: 'text', text: 'Line <script>alert(1)</script>' },
      { kind: 'facts', rows: [['Party', '2 <guests>']] },
      { kind: 'code', reference: 'ABC123', qrCid: 'qr-abc123@larmoir', caption: 'Show it.' },
      { kind: 'action', label: 'Open', href: 'javascript:alert(1)' },
      { kind: 'action', label: 'See your booking', href: 'https://tide.test/bookings/1?a=1&b=2' },
    ],
  })
  it('escapes every string in the HTML and keeps it plain in the text', () => {
    expect(mail.html).not.toMatch(/<b>|<script>|<guests>/)
    expect(mail.html).toContain('Hello &lt;b&gt;Ann&lt;/b&gt; &amp; &quot;Co&quot;,')
    expect(mail.html).toContain('<title>Booking &lt;confirmed&gt;</title>')
    expect(mail.text).toContain('Hello <b>Ann</b> & "Co",')
    expect(mail.text).toContain('Party: 2 <guests>')
  })
  it('links only web, mail and phone addresses; the rest stays text', () => {
    expect(mail.html).not.toContain('href="javascript:')
    expect(mail.html).toContain('href="https://tide.test/bookings/1?a=1&amp;b=2"')
    expect(mail.html).toContain('href="tel:+12075550101"')
    expect(mail.html).toContain('href="mailto:hi@tide.test"')
    expect(mail.text).toContain('See your booking: https://tide.test/bookings/1?a=1&b=2')
  })
  it('shows the QR by content id in the HTML and the reference in the text', () => {
    expect(mail.html).toContain('<img src="cid:qr-abc123@larmoir"')
    expect(mail.text).toContain('Your reference: ABC123')
  })
})
