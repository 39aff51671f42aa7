import type { Venue } from '../db/schema/venues'
import type { MailMessage } from './mail'

const hoursText = (ms: number) => {
  const h = Math.round(ms / 3_600_000)
  return h >= 1 ? `${h} hour${h === 1 ? '' : 's'}` : `${Math.round(ms / 60_000)} minutes`
}

export function invitationEmail(opts: { venue: Venue, to: string, name: string, role: string, link: string, ttlMs: number, invitedBy: string }): MailMessage {
  return {
    to: opts.to,
    subject: `You're invited to ${opts.venue.name} on Larmoir`,
    text: [
      `Hello ${opts.name},`,
      '',
      `${opts.invitedBy} has added you to ${opts.venue.name} as ${opts.role}.`,
      'Choose your password with this link to finish setting up your account:',
      '',
      opts.link,
      '',
      `The link works once and expires in ${hoursText(opts.ttlMs)}. If it has expired, ask for a new invitation.`,
      '',
      `${opts.venue.name}, ${opts.venue.address}`,
    ].join('\n'),
  }
}

export function passwordResetEmail(opts: { venue: Venue, to: string, name: string, link: string, ttlMs: number }): MailMessage {
  return {
    to: opts.to,
    subject: `Reset your ${opts.venue.name} password`,
    text: [
      `Hello ${opts.name},`,
      '',
      'Someone (we hope you) asked to reset the password of your account. Choose a new one here:',
      '',
      opts.link,
      '',
      `The link works once and expires in ${hoursText(opts.ttlMs)}. If you did not ask for it, ignore this message: your password stays as it is.`,
      '',
      `${opts.venue.name}, ${opts.venue.address}`,
    ].join('\n'),
  }
}
