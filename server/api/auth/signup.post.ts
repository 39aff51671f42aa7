import { eq } from 'drizzle-orm'
import { ageOn, signUpSchema } from '../../../shared/schemas/auth'

/** Guests create their own account; staff accounts come only from a manager's invitation. */
export default defineEventHandler(async (event) => {
  const input = await readBodyAs(event, signUpSchema)
  const venue = await getVenue()
  const today = new Date().toISOString().slice(0, 10)
  if (ageOn(input.dateOfBirth, today) < venue.legalAge) {
    throw createError({ statusCode: 400, statusMessage: 'Invalid input', message: `You must be at least ${venue.legalAge} to create an account.`, data: { fields: { dateOfBirth: `You must be at least ${venue.legalAge} to create an account.` } } })
  }
  const taken = () => createError({ statusCode: 409, statusMessage: 'Already registered', message: 'An account with this e-mail already exists. Sign in, or reset your password.', data: { fields: { email: 'An account with this e-mail already exists.' } } })
  const [existing] = await useDb().select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, input.email))
  if (existing) throw taken()
  const passwordHash = await hashPassword(input.password)
  // The unique e-mail index settles a race between two sign-ups of one address; a locking read of
  // a missing row would take a gap lock and deadlock concurrent sign-ups of different addresses.
  const [row] = await useDb().insert(tables.users).values({ email: input.email, name: input.name, passwordHash, role: 'guest', dateOfBirth: input.dateOfBirth }).$returningId()
    .catch((err: { errno?: number, cause?: { errno?: number } }) => {
      if ((err.errno ?? err.cause?.errno) === 1062) throw taken() // ER_DUP_ENTRY
      throw err
    })
  const user = { id: row!.id, name: input.name, email: input.email, role: 'guest' as const }
  await setUserSession(event, { user })
  setResponseStatus(event, 201)
  return { user }
})
