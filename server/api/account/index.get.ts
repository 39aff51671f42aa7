import { eq } from 'drizzle-orm'
import type { AccountView } from '../../../shared/types/account'

export default defineEventHandler(async (event): Promise<AccountView> => {
  const me = await requireUser(event)
  const [row] = await useDb().select({
    id: tables.users.id,
    name: tables.users.name,
    email: tables.users.email,
    role: tables.users.role,
    dateOfBirth: tables.users.dateOfBirth,
    createdAt: tables.users.createdAt,
    emailVerifiedAt: tables.users.emailVerifiedAt,
  }).from(tables.users).where(eq(tables.users.id, me.id))
  const { emailVerifiedAt, ...rest } = row!
  return { ...rest, createdAt: rest.createdAt.toISOString(), emailConfirmed: emailVerifiedAt !== null }
})
