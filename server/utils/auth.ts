import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import type { Role } from '../../shared/roles'

export interface CurrentUser { id: number, name: string, email: string, role: Role }

/**
 * The signed-in user, re-read from the database on every call so that a disabled account or a
 * changed role takes effect at once. 401 when nobody is signed in.
 */
export async function requireUser(event: H3Event): Promise<CurrentUser> {
  const session = await getUserSession(event)
  const id = session.user?.id
  if (!id) throw createError({ status: 401, statusText: 'Sign in first', message: 'Sign in to continue.' })
  const [row] = await useDb().select().from(tables.users).where(eq(tables.users.id, id)).limit(1)
  if (!row || row.disabled || !row.passwordHash) {
    await clearUserSession(event)
    throw createError({ status: 401, statusText: 'Signed out', message: 'Your session has ended. Sign in again.' })
  }
  const user: CurrentUser = { id: row.id, name: row.name, email: row.email, role: row.role }
  if (session.user?.role !== user.role || session.user?.name !== user.name) await setUserSession(event, { user })
  return user
}

/** Guards a route by role: 401 for anonymous, 403 for a signed-in user of another role. */
export async function requireRole(event: H3Event, ...roles: Role[]): Promise<CurrentUser> {
  const user = await requireUser(event)
  if (!roles.includes(user.role)) {
    throw createError({ status: 403, statusText: 'Not allowed', message: 'Your role does not allow this.' })
  }
  return user
}

export function sessionUserOf(row: { id: number, name: string, email: string, role: Role }): CurrentUser {
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
