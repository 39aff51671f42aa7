import { createHash, randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { and, eq, isNull, sql } from 'drizzle-orm'
import { addressCheckSchema, setPasswordSchema } from '../../shared/schemas/auth'
import type { CurrentUser } from './auth'

type Purpose = 'invite' | 'reset' | 'verify'

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

const ASK_AGAIN: Record<Purpose, string> = {
  invite: 'Ask your manager to send a new invitation.',
  reset: 'Ask for a new password reset link.',
  verify: 'Sign in and ask for a new confirmation link.',
}

/**
 * Spends a token inside the caller's transaction: unknown → 400, used or expired → 410, each with
 * a message that tells the person what to do next. Other open tokens of the same purpose die too.
 */
async function consumeToken(tx: Tx, raw: string, purpose: Purpose): Promise<number> {
  const [row] = await tx.select().from(tables.authTokens)
    .where(and(eq(tables.authTokens.tokenHash, hashToken(raw)), eq(tables.authTokens.purpose, purpose)))
    .for('update')
  return spendToken(tx, row, purpose)
}

/** The same answers as spending the token, without spending it: run before any slow work. */
async function checkToken(raw: string, purpose: Purpose): Promise<void> {
  const [row] = await useDb().select().from(tables.authTokens)
    .where(and(eq(tables.authTokens.tokenHash, hashToken(raw)), eq(tables.authTokens.purpose, purpose)))
  usableToken(row, purpose)
}

function usableToken(row: typeof tables.authTokens.$inferSelect | undefined, purpose: Purpose): asserts row is typeof tables.authTokens.$inferSelect {
  const ask = ASK_AGAIN[purpose]
  if (!row) invalidFields({ token: 'This link is not valid.' }, `This link is not valid. ${ask}`)
  if (row.usedAt) throw createError({ status: 410, statusText: 'Link used', message: `This link has already been used. ${ask}`, data: { fields: { token: 'This link has already been used.' } } })
  if (row.expiresAt.getTime() <= Date.now()) throw createError({ status: 410, statusText: 'Link expired', message: `This link has expired. ${ask}`, data: { fields: { token: 'This link has expired.' } } })
}

async function spendToken(tx: Tx, row: typeof tables.authTokens.$inferSelect | undefined, purpose: Purpose): Promise<number> {
  usableToken(row, purpose)
  const now = new Date()
  await tx.update(tables.authTokens).set({ usedAt: now })
    .where(and(eq(tables.authTokens.userId, row.userId), eq(tables.authTokens.purpose, purpose), isNull(tables.authTokens.usedAt)))
  return row.userId
}

/**
 * The whole "choose a password from a one-time link" step shared by invitations and resets:
 * spend the token and store the hash in one transaction, then sign the person in.
 */
export async function setPasswordFromLink(event: H3Event, purpose: 'invite' | 'reset'): Promise<CurrentUser> {
  const { token, password } = await readBodyAs(event, setPasswordSchema)
  limitClient(event, 'linkPerClient', 'Too many tries of e-mailed links from your network. Please try again in an hour.')
  // A stranger's made-up or spent token is refused before the slow hash is computed.
  await checkToken(token, purpose)
  const passwordHash = await hashPasswordBounded(password)
  const user = await useDb().transaction(async (tx) => {
    const userId = await consumeToken(tx, token, purpose)
    // A new password ends every sign-in made with the old one; the link also proves the address.
    await tx.update(tables.users).set({ passwordHash, sessionVersion: sql`${tables.users.sessionVersion} + 1`, emailVerifiedAt: sql`coalesce(${tables.users.emailVerifiedAt}, current_timestamp(3))` }).where(eq(tables.users.id, userId))
    const [row] = await tx.select().from(tables.users).where(eq(tables.users.id, userId))
    return row!
  })
  if (user.disabled) throw createError({ status: 403, statusText: 'Account disabled', message: 'This account has been disabled. Ask the venue manager.' })
  await clearAccountThrottle(throttleKeys(event, user.email))
  return startUserSession(event, user)
}

/** A guest opens the address-check link: the address counts as confirmed and they are signed in. */
export async function confirmAddressFromLink(event: H3Event): Promise<CurrentUser> {
  const { token } = await readBodyAs(event, addressCheckSchema)
  limitClient(event, 'linkPerClient', 'Too many tries of e-mailed links from your network. Please try again in an hour.')
  const user = await useDb().transaction(async (tx) => {
    const userId = await consumeToken(tx, token, 'verify')
    await tx.update(tables.users).set({ emailVerifiedAt: sql`coalesce(${tables.users.emailVerifiedAt}, current_timestamp(3))` }).where(eq(tables.users.id, userId))
    const [row] = await tx.select().from(tables.users).where(eq(tables.users.id, userId))
    return row!
  })
  if (user.disabled || !user.passwordHash) throw createError({ status: 403, statusText: 'Account disabled', message: 'This account has been disabled. Ask the venue manager.' })
  return startUserSession(event, user)
}
