import { ROLE_LABELS, type Role } from '../../shared/roles'

/** Issues an invitation token and queues its e-mail in the caller's transaction; returns the link. */
export async function queueInvitation(tx: Tx, opts: { userId: number, email: string, name: string, role: Role, invitedBy: { id?: number, name: string } }): Promise<string> {
  const venue = await getVenue()
  const ttlMs = useRuntimeConfig().tokens.inviteHours * 3_600_000
  const token = await issueToken(tx, { userId: opts.userId, purpose: 'invite', ttlMs, createdById: opts.invitedBy.id })
  const link = appLink(`/welcome?token=${token}`)
  await queueMail(tx, invitationEmail({ venue, to: opts.email, name: opts.name, role: ROLE_LABELS[opts.role].toLowerCase(), link, ttlMs, invitedBy: opts.invitedBy.name }))
  return link
}
