import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import { eq, lt, sql } from 'drizzle-orm'
import type { Role } from '../../shared/roles'

export interface CurrentUser { id: number, name: string, email: string, role: Role }

type UserRow = typeof tables.users.$inferSelect
/** The account row `requireUser` read for a request, so that a route needs not read it again. */
const accountRows = new WeakMap<H3Event, UserRow>()

/** The signed-in account's row as `requireUser` read it in this request (call after it). */
export function signedInAccount(event: H3Event): Pick<UserRow, 'dateOfBirth' | 'emailVerifiedAt'> | undefined {
  return accountRows.get(event)
}

/**
 * The signed-in user, re-read from the database on every call so that a disabled account or a
 * changed role takes effect at once. 401 when nobody is signed in, and when the cookie's sign-in
 * has ended: signed out on its device (a copy of the cookie dies with it), or sealed with an older
 * session version than the account's (sign out of all devices, a new password, a role change).
 */
export async function requireUser(event: H3Event): Promise<CurrentUser> {
  const session = await getUserSession(event)
  const id = session.user?.id
  if (!id) throw createError({ status: 401, statusText: 'Sign in first', message: 'Sign in to continue.' })
  const sid = session.secure?.sid ?? ''
  const [found] = await useDb().select({ row: tables.users, ended: tables.signedOutSessions.sessionId }).from(tables.users)
    .leftJoin(tables.signedOutSessions, eq(tables.signedOutSessions.sessionId, sid))
    .where(eq(tables.users.id, id)).limit(1)
  const row = found?.row
  if (!row || row.disabled || !row.passwordHash || !sid || found.ended || session.secure?.version !== row.sessionVersion) {
    await clearUserSession(event)
    throw createError({ status: 401, statusText: 'Signed out', message: 'Your session has ended. Sign in again.' })
  }
  accountRows.set(event, row)
  const user: CurrentUser = { id: row.id, name: row.name, email: row.email, role: row.role }
  if (session.user?.role !== user.role || session.user?.name !== user.name) await setUserSession(event, { user })
  return user
}

/**
 * Signs the person in on this device with a fresh cookie (never one carried over from before, so a
 * planted cookie cannot become a session): a new sign-in id and the account's session version.
 */
export async function startUserSession(event: H3Event, row: { id: number, name: string, email: string, role: Role, sessionVersion: number }): Promise<CurrentUser> {
  const user = sessionUserOf(row)
  await replaceUserSession(event, { user, secure: { sid: randomBytes(16).toString('base64url'), version: row.sessionVersion } })
  return user
}

/** Ends this device's sign-in: its cookie is cleared and any copy of it is refused from now on. */
export async function endThisSession(event: H3Event): Promise<void> {
  const session = await getUserSession(event)
  const sid = session.secure?.sid
  if (session.user?.id && sid) {
    const now = new Date()
    const maxAgeMs = Number(useRuntimeConfig().session.maxAge) * 1000
    const db = useDb()
    await db.delete(tables.signedOutSessions).where(lt(tables.signedOutSessions.expiresAt, now))
    await db.insert(tables.signedOutSessions).values({ sessionId: sid, userId: session.user.id, expiresAt: new Date(now.getTime() + maxAgeMs) })
      .onDuplicateKeyUpdate({ set: { sessionId: sid } })
  }
  await clearUserSession(event)
}

/** Ends every sign-in of the account, on every device (inside the caller's transaction if given). */
export async function endAllSessions(userId: number, tx: Tx | Db = useDb()): Promise<void> {
  await tx.update(tables.users).set({ sessionVersion: sql`${tables.users.sessionVersion} + 1` }).where(eq(tables.users.id, userId))
}

/** Guards a route by role: 401 for anonymous, 403 for a signed-in user of another role. */
export async function requireRole(event: H3Event, ...roles: Role[]): Promise<CurrentUser> {
  const user = await requireUser(event)
  if (!roles.includes(user.role)) {
    throw createError({ status: 403, statusText: 'Not allowed', message: 'Your role does not allow this.' })
  }
  return user
}

function sessionUserOf(row: { id: number, name: string, email: string, role: Role }): CurrentUser {
  return { id: row.id, name: row.name, email: row.email, role: row.role }
}

/** The signed-in user if any (public routes that show staff more); never throws. */
export async function optionalUser(event: H3Event): Promise<CurrentUser | null> {
  const session = await getUserSession(event)
  if (!session.user?.id) return null
  try { return await requireUser(event) }
  catch { return null }
}

export const isStaffRole = (role: Role | undefined | null) => role === 'manager' || role === 'host' || role === 'marketing'
