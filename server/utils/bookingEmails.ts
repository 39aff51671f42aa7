import { eq } from 'drizzle-orm'
import { createEvent } from 'ics'
import QRCode from 'qrcode'
import type { Venue } from '../db/schema/venues'
import type { Booking } from '../db/schema/bookings'
import type { TastingSession } from '../db/schema/sessions'
import type { MailMessage } from './mail'
import type { OutboxAttachment } from '../db/schema/mail'
import { renderEmail, type EmailBlock } from './emailLayout'
import { formatMoney } from '../../shared/money'
import { formatDuration, formatLongDay, formatTime, formatZoneName, type VenueClock } from '../../shared/dates'
import { cancelCutoffSentence, cancelDeadline } from '../../shared/bookings'
import { cautionLines } from '../../shared/cautions'
import { standardDrinksLine } from '../../shared/utils/drinks'
import { venueContactText } from '../../shared/venueContact'
import { flightTotals } from '../../shared/science'

/** What every booking e-mail needs to say where and when. */
export interface BookingMailContext {
  venue: Venue
  booking: Pick<Booking, 'id' | 'reference' | 'partySize' | 'amountMinor' | 'amountPaidMinor' | 'amountRefundedMinor' | 'currency' | 'contactName' | 'contactEmail'>
  session: Pick<TastingSession, 'startsAt' | 'durationMinutes' | 'flightId'>
  flightName: string
}

const clockOf = (venue: Pick<Venue, 'timeZone' | 'locale'>): VenueClock => ({ timeZone: venue.timeZone, locale: venue.locale })

/** "Saturday, October 3, 2026, 2:00 PM EDT": an instant in the venue's zone and locale, with the zone named. */
export function mailVenueTime(instant: Date, venue: Pick<Venue, 'timeZone' | 'locale'>): string {
  const clock = clockOf(venue)
  return `${formatLongDay(instant, clock)}, ${formatTime(instant, clock)} ${formatZoneName(instant, clock)}`
}

const guests = (n: number) => `${n} guest${n === 1 ? '' : 's'}`
const money = (c: BookingMailContext, minor: number) => formatMoney(minor, c.booking.currency, c.venue.locale)

function whereAndWhen(c: BookingMailContext): [string, string][] {
  return [
    ['Reference', c.booking.reference],
    ['Flight', c.flightName],
    ['When', `${mailVenueTime(c.session.startsAt, c.venue)} (${formatDuration(c.session.durationMinutes)})`],
    ['Where', `${c.venue.name}, ${c.venue.address}`],
    ['Party', guests(c.booking.partySize)],
  ]
}

/** The message in both parts, with the venue's contact below, to the booking's contact. */
function bookingMail(c: BookingMailContext, subject: string, heading: string, blocks: EmailBlock[], attachments?: OutboxAttachment[]): MailMessage {
  return { to: c.booking.contactEmail, subject, ...renderEmail({ venue: c.venue, subject, heading, greeting: `Hello ${c.booking.contactName},`, blocks }), attachments }
}

/** The cut-off of this booking's session, and what to do on either side of it. */
function cutoffNotice(c: BookingMailContext, now = new Date()): EmailBlock {
  const deadline = cancelDeadline(c.session.startsAt, c.venue.cancellationCutoffHours)
  const sentence = cancelCutoffSentence(deadline, clockOf(c.venue), now)
  const next = deadline.getTime() > now.getTime()
    ? 'Until then you can cancel on your booking page for a full refund.'
    : `To change your plans, contact ${venueContactText(c.venue)}.`
  return { kind: 'notice', text: `${sentence} ${next}` }
}

/** An iCalendar event for the session (RFC 5545), times in UTC so every calendar places it right. */
export function sessionCalendarFile(c: BookingMailContext, link: string): OutboxAttachment {
  const { error, value } = createEvent({
    productId: 'larmoir/bookings',
    uid: `booking-${c.booking.reference}@larmoir`,
    start: c.session.startsAt.getTime(),
    startInputType: 'utc',
    startOutputType: 'utc',
    duration: { minutes: c.session.durationMinutes },
    title: `${c.flightName} at ${c.venue.name}`,
    description: `Booking ${c.booking.reference} for ${guests(c.booking.partySize)}. Bring photo ID: everyone must be ${c.venue.legalAge} or older. ${link}`,
    location: `${c.venue.name}, ${c.venue.address}`,
    status: 'CONFIRMED',
    busyStatus: 'BUSY',
    url: link,
  })
  if (error || !value) throw new Error(`calendar file: ${error?.message ?? 'empty'}`)
  return { filename: `booking-${c.booking.reference}.ics`, contentType: 'text/calendar; charset=utf-8; method=PUBLISH', contentBase64: Buffer.from(value, 'utf8').toString('base64') }
}

/**
 * The booking reference as a QR code for the host to scan at the door: a PNG the HTML shows
 * inline by its content id (RFC 2392), so it appears in the message rather than as a download.
 */
async function doorCode(reference: string): Promise<{ block: EmailBlock, image: OutboxAttachment }> {
  const png = await QRCode.toBuffer(reference, { type: 'png', width: 320, margin: 2, errorCorrectionLevel: 'M' })
  const cid = `qr-${reference.toLowerCase()}@larmoir`
  return {
    block: { kind: 'code', reference, qrCid: cid, caption: 'Show this code, or tell the host the reference, when you arrive.' },
    image: { filename: `booking-${reference}-qr.png`, contentType: 'image/png', contentBase64: png.toString('base64'), cid },
  }
}

/** Standard drinks per guest of the session's flight: its pours and each product's current ABV, through the glass model's totals. */
async function flightStandardDrinks(venue: Venue, flightId: number): Promise<number | null> {
  const pours = await useDb().select({ productId: tables.flightPours.productId, volumeMl: tables.flightPours.volumeMl })
    .from(tables.flightPours).where(eq(tables.flightPours.flightId, flightId))
  if (!pours.length) return null
  const products = new Map((await loadProducts(venue.id, { ids: [...new Set(pours.map(p => p.productId))] })).map(p => [p.id, p]))
  const rows = pours.flatMap((p) => {
    const product = products.get(p.productId)
    return product ? [{ volumeMl: p.volumeMl, abvPctVol: product.current.abvPctVol }] : []
  })
  return flightTotals(rows, venue.standardDrinkGrams).standardDrinks
}

/** The cautions of responsible service (shared/cautions.ts), led by the flight's standard drinks. */
async function cautionsBlock(c: BookingMailContext, title: string): Promise<EmailBlock> {
  const drinks = await flightStandardDrinks(c.venue, c.session.flightId)
  return { kind: 'list', title, items: cautionLines(c.venue, { standardDrinksLine: drinks === null ? null : standardDrinksLine('flight', drinks, c.venue) }) }
}

export async function confirmationEmail(c: BookingMailContext): Promise<MailMessage> {
  const link = appLink(`/bookings/${c.booking.id}`)
  const code = await doorCode(c.booking.reference)
  return bookingMail(c, `Booking confirmed: ${c.flightName}, ${mailVenueTime(c.session.startsAt, c.venue)}`, 'You\'re booked', [
    { kind: 'text', text: 'Your seats are booked and paid. We look forward to pouring for you.' },
    code.block,
    { kind: 'facts', rows: [...whereAndWhen(c), ['Paid', money(c, c.booking.amountPaidMinor)]] },
    cutoffNotice(c),
    { kind: 'text', text: `Bring photo ID: everyone in your party must be ${c.venue.legalAge} or older, and the host checks at the door. The calendar file attached adds the session to your calendar.` },
    { kind: 'action', label: 'See your booking', href: link },
    await cautionsBlock(c, 'Before you come'),
  ], [sessionCalendarFile(c, link), code.image])
}

export function cancellationEmail(c: BookingMailContext, why: 'guest' | 'venue'): MailMessage {
  const subject = why === 'venue' ? `Session cancelled: ${c.flightName}, ${mailVenueTime(c.session.startsAt, c.venue)}` : `Booking cancelled: ${c.booking.reference}`
  return bookingMail(c, subject, why === 'venue' ? 'Session cancelled' : 'Booking cancelled', [
    {
      kind: 'text',
      text: why === 'venue'
        ? 'We are sorry: the venue has had to cancel this session. Your booking is cancelled and your payment is being refunded in full.'
        : 'Your booking is cancelled, as you asked. Your payment is being refunded in full.',
    },
    { kind: 'facts', rows: [...whereAndWhen(c), ['To be refunded', money(c, c.booking.amountPaidMinor)]] },
    { kind: 'text', text: 'We will send another e-mail once the refund has gone through.' },
    ...(why === 'venue' ? [{ kind: 'action', label: 'Choose another session', href: appLink('/flights') } as const] : []),
  ])
}

export function refundEmail(c: BookingMailContext): MailMessage {
  const amount = money(c, c.booking.amountRefundedMinor)
  return bookingMail(c, `Refund sent: ${amount} for booking ${c.booking.reference}`, 'Refund sent', [
    { kind: 'text', text: `We have refunded ${amount} to the card you paid with. Banks usually show it within 5 to 10 days.` },
    { kind: 'facts', rows: whereAndWhen(c) },
  ])
}

/** The payment arrived after the hold ran out, the session's booking cut-off or its start. */
export function latePaymentRefundEmail(c: BookingMailContext, reason: string): MailMessage {
  return bookingMail(c, `We could not keep your seats: booking ${c.booking.reference} refunded`, 'We could not keep your seats', [
    { kind: 'text', text: `Your payment reached us after the time to pay or to book had run out, and ${reason}. So the booking could not go ahead, and we are refunding ${money(c, c.booking.amountPaidMinor)} in full to the card you paid with.` },
    { kind: 'facts', rows: whereAndWhen(c) },
    { kind: 'action', label: 'See other sessions', href: appLink('/flights') },
  ])
}

export async function reminderEmail(c: BookingMailContext): Promise<MailMessage> {
  const code = await doorCode(c.booking.reference)
  return bookingMail(c, `Tomorrow: ${c.flightName} at ${c.venue.name}`, 'See you tomorrow', [
    { kind: 'text', text: 'A reminder that your tasting is tomorrow.' },
    code.block,
    { kind: 'facts', rows: whereAndWhen(c) },
    cutoffNotice(c),
    { kind: 'text', text: `Bring photo ID: everyone in your party must be ${c.venue.legalAge} or older. Please plan how you will get home; do not drive after your tasting.` },
    { kind: 'action', label: 'Your booking', href: appLink(`/bookings/${c.booking.id}`) },
    await cautionsBlock(c, 'Drinking with care'),
  ], [code.image])
}
