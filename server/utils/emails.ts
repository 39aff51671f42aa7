import type { Venue } from '../db/schema/venues'
import type { MailMessage } from './mail'
import { renderEmail } from './emailLayout'

const hoursText = (ms: number) => {
  const h = Math.round(ms / 3_600_000)
  return h >= 1 ? `${h} hour${h === 1 ? '' : 's'}` : `${Math.round(ms / 60_000)} minutes`
}

export function invitationEmail(opts: { venue: Venue, to: string, name: string, role: string, link: string, ttlMs: number, invitedBy: string }): MailMessage {
  const subject = `You're invited to ${opts.venue.name} on Larmoir`
  return {
    to: opts.to,
    subject,
    ...renderEmail({
      venue: opts.venue,
      subject,
      heading: 'You\'re invited',
      greeting: `Hello ${opts.name},`,
      blocks: [
        { kind: 'text', text: `${opts.invitedBy} has added you to ${opts.venue.name} as ${opts.role}. Choose your password with this link to finish setting up your account.` },
        { kind: 'action', label: 'Choose your password', href: opts.link },
        { kind: 'text', text: `The link works once and expires in ${hoursText(opts.ttlMs)}. If it has expired, ask for a new invitation.` },
      ],
    }),
  }
}

/** An account e-mail to one person: its subject, heading, greeting and blocks in the venue's layout. */
function accountEmail(venue: Venue, to: string, subject: string, body: Omit<Parameters<typeof renderEmail>[0], 'venue' | 'subject'>): MailMessage {
  return { to, subject, ...renderEmail({ venue, subject, ...body }) }
}

export function passwordResetEmail(opts: { venue: Venue, to: string, name: string, link: string, ttlMs: number }): MailMessage {
  const subject = `Reset your ${opts.venue.name} password`
  return accountEmail(opts.venue, opts.to, subject, {
    heading: 'Reset your password',
    greeting: `Hello ${opts.name},`,
    blocks: [
      { kind: 'text', text: 'Someone (we hope you) asked to reset the password of your account. Choose a new one with this link.' },
      { kind: 'action', label: 'Choose a new password', href: opts.link },
      { kind: 'text', text: `The link works once and expires in ${hoursText(opts.ttlMs)}. If you did not ask for it, ignore this message: your password stays as it is.` },
    ],
  })
}

export function addressCheckEmail(opts: { venue: Venue, to: string, name: string, link: string, ttlMs: number }): MailMessage {
  const subject = `Confirm your e-mail address for ${opts.venue.name}`
  return accountEmail(opts.venue, opts.to, subject, {
    heading: 'Confirm your address',
    greeting: `Hello ${opts.name},`,
    blocks: [
      { kind: 'text', text: `Someone (we hope you) created an account at ${opts.venue.name} with this address. Open the link to confirm it; then you can book tastings.` },
      { kind: 'action', label: 'Confirm my address', href: opts.link },
      { kind: 'text', text: `The link works once and expires in ${hoursText(opts.ttlMs)}. If you did not create an account, ignore this message: nothing will be booked in your name.` },
    ],
  })
}

export function accountExistsEmail(opts: { venue: Venue, to: string, name: string, signInLink: string, resetLink: string }): MailMessage {
  const subject = `You already have an account at ${opts.venue.name}`
  return accountEmail(opts.venue, opts.to, subject, {
    heading: 'You already have an account',
    greeting: `Hello ${opts.name},`,
    blocks: [
      { kind: 'text', text: 'Someone (we hope you) tried to create an account with this address, but it already has one, so nothing was changed. Sign in with your password instead.' },
      { kind: 'action', label: 'Sign in', href: opts.signInLink },
      { kind: 'text', text: 'Forgotten the password? Choose a new one here. If you did not try to sign up, ignore this message.' },
      { kind: 'action', label: 'Reset my password', href: opts.resetLink },
    ],
  })
}
