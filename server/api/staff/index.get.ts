import { asc, ne } from 'drizzle-orm'
import type { StaffMember } from '../../../shared/types/account'

/** Staff accounts (not guests), for the manager's staff page. */
export default defineEventHandler(async (event): Promise<StaffMember[]> => {
  await requireRole(event, 'manager')
  const rows = await useDb().select({
    id: tables.users.id,
    name: tables.users.name,
    email: tables.users.email,
    role: tables.users.role,
    disabled: tables.users.disabled,
    passwordHash: tables.users.passwordHash,
    createdAt: tables.users.createdAt,
  }).from(tables.users).where(ne(tables.users.role, 'guest')).orderBy(asc(tables.users.name))
  return rows.map(({ passwordHash, ...r }) => ({ ...r, createdAt: r.createdAt.toISOString(), invitationPending: passwordHash === null }))
})
