import { eq } from 'drizzle-orm'
import { ageOn, signUpSchema } from '../../../shared/schemas/auth'

/** Guests create their own account; staff accounts come only from a manager's invitation. */
export default defineEventHandler(async (event) => {
  const input = await readBodyAs(event, signUpSchema)
  const venue = await getVenue()
  const today = new Date().toISOString().slice(0, 10)
  if (ageOn(input.dateOfBirth, today) < venue.legalAge) {
    invalidFields({ dateOfBirth: `You must be at least ${venue.legalAge} to create an account.` })
  }
  const passwordHash = await hashPassword(input.password)
  // The unique index on e-mail decides a race between two sign-ups; no locking read (which
  // deadlocks under concurrent sign-ups with different addresses).
  const taken = (): never => conflict('An account with this e-mail already exists. Sign in, or reset your password.', { fields: { email: 'An account with this e-mail already exists.' } })
  const [existing] = await useDb().select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, input.email))
  if (existing) taken()
  let id: number
  try {
    const [row] = await useDb().insert(tables.users).values({ email: input.email, name: input.name, passwordHash, role: 'guest', dateOfBirth: input.dateOfBirth }).$returningId()
    id = row!.id
  }
  catch (err) {
    if (isDuplicateKey(err)) taken()
    throw err
  }
  const user = { id, name: input.name, email: input.email, role: 'guest' as const }
  await setUserSession(event, { user })
  setResponseStatus(event, 201)
  return { user }
})
