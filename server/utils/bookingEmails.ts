import { createEvent } from 'ics'
import QRCode from 'qrcode'
import type { Venue } from '../db/schema/venues'
import type { Booking } from '../db/schema/bookings'
import type { TastingSession } from '../db/schema/sessions'
import type { MailMessage } from './mail'
import type { OutboxAttachment } from '../db/schema/mail'
import { formatMoney } from '../../shared/money'
import { cautionLines } from '../../shared/cautions'

/** What every booking e-mail needs to say where and when. */
export interface BookingMailContext {
  venue: Venue
  booking: Pick<Booking, 'id' | 'reference' | 'partySize' | 'amountMinor' | 'amountPaidMinor' | 'amountRefundedMinor' | 'currency' | 'contactName' | 'contactEmail'>
  session: Pick<TastingSession, 'startsAt' | 'durationMinutes'>
  flightName: string
}

/** "Saturday, October 3, 2026 at 2:00 PM EDT": the session's start in the venue's zone, with the zone named. */
export function mailVenueTime(instant: Date, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', { dateStyle: 'full', timeStyle: 'short', timeZone }).format(instant)
    + ` ${new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'short' }).formatToParts(instant).find(p => p.type === 'timeZoneName')?.value ?? timeZone}`
}

const guests = (n: number) => `${n} guest${n === 1 ? '' : 's'}`

function whereAndWhen(c: BookingMailContext): string[] {
  return [
    `Booking reference: ${c.booking.reference}`,
    `Flight: ${c.flightName}`,
    `When: ${mailVenueTime(c.session.startsAt, c.venue.timeZone)} (${c.session.durationMinutes} minutes)`,
    `Where: ${c.venue.name}, ${c.venue.address}`,
    `Party: ${guests(c.booking.partySize)}`,
  ]
}

const signature = (venue: Venue) => ['', `${venue.name}, ${venue.address}`]

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

/** The booking reference as a QR code, for the host to scan at the door. */
async function referenceQrFile(reference: string): Promise<OutboxAttachment> {
  const png = await QRCode.toBuffer(reference, { type: 'png', width: 320, margin: 2, errorCorrectionLevel: 'M' })
  return { filename: `booking-${reference}-qr.png`, contentType: 'image/png', contentBase64: png.toString('base64') }
}

export async function confirmationEmail(c: BookingMailContext): Promise<MailMessage> {
  const link = appLink(`/bookings/${c.booking.id}`)
  const cautions = cautionLines(c.venue)
  return {
    to: c.booking.contactEmail,
    subject: `Booking confirmed: ${c.flightName}, ${mailVenueTime(c.session.startsAt, c.venue.timeZone)}`,
    text: [
      `Hello ${c.booking.contactName},`,
      '',
      'Your seats are booked and paid. We look forward to pouring for you.',
      '',
      ...whereAndWhen(c),
      `Paid: ${formatMoney(c.booking.amountPaidMinor, c.booking.currency)}`,
      '',
      `Bring photo ID: everyone in your party must be ${c.venue.legalAge} or older, and the host checks at the door.`,
      'Show the QR code attached to this e-mail (or tell us the reference) when you arrive. The calendar file adds the session to your calendar.',
      '',
      'Before you come:',
      ...cautions.map(line => `- ${line}`),
      '',
      `You can cancel for a full refund up to ${c.venue.cancellationCutoffHours} hours before the start: ${link}`,
      ...signature(c.venue),
    ].join('\n'),
    attachments: [sessionCalendarFile(c, link), await referenceQrFile(c.booking.reference)],
  }
}

export function cancellationEmail(c: BookingMailContext, why: 'guest' | 'venue'): MailMessage {
  return {
    to: c.booking.contactEmail,
    subject: why === 'venue' ? `Session cancelled: ${c.flightName}, ${mailVenueTime(c.session.startsAt, c.venue.timeZone)}` : `Booking cancelled: ${c.booking.reference}`,
    text: [
      `Hello ${c.booking.contactName},`,
      '',
      why === 'venue'
        ? 'We are sorry: the venue has had to cancel this session. Your booking is cancelled and your payment is being refunded in full.'
        : 'Your booking is cancelled, as you asked. Your payment is being refunded in full.',
      '',
      ...whereAndWhen(c),
      `To be refunded: ${formatMoney(c.booking.amountPaidMinor, c.booking.currency)}`,
      '',
      'We will send another e-mail once the refund has gone through.',
      ...signature(c.venue),
    ].join('\n'),
  }
}

export function refundEmail(c: BookingMailContext): MailMessage {
  return {
    to: c.booking.contactEmail,
    subject: `Refund sent: ${formatMoney(c.booking.amountRefundedMinor, c.booking.currency)} for booking ${c.booking.reference}`,
    text: [
      `Hello ${c.booking.contactName},`,
      '',
      `We have refunded ${formatMoney(c.booking.amountRefundedMinor, c.booking.currency)} to the card you paid with. Banks usually show it within 5 to 10 days.`,
      '',
      ...whereAndWhen(c),
      ...signature(c.venue),
    ].join('\n'),
  }
}

/** The payment arrived after the hold ran out and the seats had gone to other guests. */
export function latePaymentRefundEmail(c: BookingMailContext, reason: string): MailMessage {
  return {
    to: c.booking.contactEmail,
    subject: `We could not keep your seats: booking ${c.booking.reference} refunded`,
    text: [
      `Hello ${c.booking.contactName},`,
      '',
      `Your payment reached us after the time to pay had run out, and ${reason}. So the booking could not go ahead, and we are refunding ${formatMoney(c.booking.amountPaidMinor, c.booking.currency)} in full to the card you paid with.`,
      '',
      ...whereAndWhen(c),
      '',
      `Other sessions may still have seats: ${appLink('/flights')}`,
      ...signature(c.venue),
    ].join('\n'),
  }
}

export function reminderEmail(c: BookingMailContext): MailMessage {
  return {
    to: c.booking.contactEmail,
    subject: `Tomorrow: ${c.flightName} at ${c.venue.name}`,
    text: [
      `Hello ${c.booking.contactName},`,
      '',
      'A reminder that your tasting is tomorrow.',
      '',
      ...whereAndWhen(c),
      '',
      `Bring photo ID: everyone in your party must be ${c.venue.legalAge} or older. Please plan how you will get home; do not drive after your tasting.`,
      `Your booking: ${appLink(`/bookings/${c.booking.id}`)}`,
      ...signature(c.venue),
    ].join('\n'),
  }
}
