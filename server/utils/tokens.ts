import { createHash, randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { and, eq, isNull } from 'drizzle-orm'
import { setPasswordSchema } from '../../shared/schemas/auth'
import type { CurrentUser } from './auth'

type Purpose = 'invite' | 'reset'

const hashToken = (raw: string) => createHash('sha256').update(raw).digest('hex')

/** Issues a one-time link token; only its hash is stored. Returns the raw token for the e-mail. */
export async function issueToken(tx: Tx, opts: { userId: number, purpose: Purpose, ttlMs: number, createdById?: number }): Promise<string> {
  const raw = randomBytes(32).toString('base64url')
  await tx.insert(tables.authTokens).values({
    userId: opts.userId,
    purpose: opts.purpose,
    tokenHash: hashToken(raw),
    expiresAt: new Date(Date.now() + opts.ttlMs),
    createdById: opts.createdById ?? null,
  })
  return raw
}

/**
 * Spends a token inside the caller's transaction: unknown → 400, used or expired → 410, each with
 * a message that tells the person what to do next. Other open tokens of the same purpose die too.
 */
async function consumeToken(tx: Tx, raw: string, purpose: Purpose): Promise<number> {
  const [row] = await tx.select().from(tables.authTokens)
    .where(and(eq(tables.authTokens.tokenHash, hashToken(raw)), eq(tables.authTokens.purpose, purpose)))
    .for('update')
  const ask = purpose === 'invite' ? 'Ask your manager to send a new invitation.' : 'Ask for a new password reset link.'
  if (!row) invalidFields({ token: 'This link is not valid.' }, `This link is not valid. ${ask}`)
  if (row.usedAt) throw createError({ status: 410, statusText: 'Link used', message: `This link has already been used. ${ask}`, data: { fields: { token: 'This link has already been used.' } } })
  if (row.expiresAt.getTime() <= Date.now()) throw createError({ status: 410, statusText: 'Link expired', message: `This link has expired. ${ask}`, data: { fields: { token: 'This link has expired.' } } })
  const now = new Date()
  await tx.update(tables.authTokens).set({ usedAt: now })
    .where(and(eq(tables.authTokens.userId, row.userId), eq(tables.authTokens.purpose, purpose), isNull(tables.authTokens.usedAt)))
  return row.userId
}

/**
 * The whole "choose a password from a one-time link" step shared by invitations and resets:
 * spend the token and store the hash in one transaction, then sign the person in.
 */
export async function setPasswordFromLink(event: H3Event, purpose: Purpose): Promise<CurrentUser> {
  const { token, password } = await readBodyAs(event, setPasswordSchema)
  const passwordHash = await hashPassword(password)
  const user = await useDb().transaction(async (tx) => {
    const userId = await consumeToken(tx, token, purpose)
    await tx.update(tables.users).set({ passwordHash }).where(eq(tables.users.id, userId))
    const [row] = await tx.select().from(tables.users).where(eq(tables.users.id, userId))
    return row!
  })
  if (user.disabled) throw createError({ status: 403, statusText: 'Account disabled', message: 'This account has been disabled. Ask the venue manager.' })
  await clearAccountThrottle(`account:${user.email}`)
  const sessionUser = sessionUserOf(user)
  await setUserSession(event, { user: sessionUser })
  return sessionUser
}
