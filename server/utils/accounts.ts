import { eq } from 'drizzle-orm'
import type { z } from 'zod'
import type { signUpSchema } from '../../shared/schemas/auth'
import type { User } from '../db/schema/users'

/**
 * Work that a route does after it has answered, so that the answer (and how long it takes) is the
 * same whether or not the address has an account. Failures are logged; the person was already told
 * to look in their inbox.
 */
export function afterResponse(what: string, work: () => Promise<unknown>): void {
  setImmediate(() => {
    work().catch(err => console.error(`[accounts] ${what} failed:`, (err as Error).message))
  })
}

/** One e-mail of `kind` to `address` unless that address has had LIMITS.mailPerAddress of them this hour. */
const mayMail = (kind: string, address: string) => spend(`mail:${kind}:${address}`, LIMITS.mailPerAddress)

/** Issues an address-check link for a guest and queues its e-mail (at most a few an hour per address). */
export async function sendAddressCheck(user: Pick<User, 'id' | 'email' | 'name'>): Promise<boolean> {
  if (!mayMail('verify', user.email)) return false
  const venue = await getVenue()
  const ttlMs = useRuntimeConfig().tokens.verifyHours * 3_600_000
  await useDb().transaction(async (tx) => {
    const token = await issueToken(tx, { userId: user.id, purpose: 'verify', ttlMs })
    await queueMail(tx, addressCheckEmail({ venue, to: user.email, name: user.name, link: appLink(`/verify-email?token=${token}`), ttlMs }))
  })
  kickOutbox()
  return true
}

/**
 * A sign-up, after the answer: a new address gets its account (unconfirmed) and a link to confirm
 * it; an address that has an account gets a note saying so (or, for a guest who never confirmed, a
 * fresh link). Nothing about the existing account changes.
 */
export async function registerGuest(input: z.output<typeof signUpSchema>): Promise<void> {
  const db = useDb()
  const [existing] = await db.select().from(tables.users).where(eq(tables.users.email, input.email))
  if (existing) return answerTakenAddress(existing)
  const passwordHash = await hashPasswordBounded(input.password)
  let id: number
  try {
    const [row] = await db.insert(tables.users).values({ email: input.email, name: input.name, passwordHash, role: 'guest', dateOfBirth: input.dateOfBirth }).$returningId()
    id = row!.id
  }
  catch (err) {
    // Two sign-ups with one address at once: the unique index lets one in; the other is told as above.
    if (!isDuplicateKey(err)) throw err
    const [winner] = await db.select().from(tables.users).where(eq(tables.users.email, input.email))
    if (winner) await answerTakenAddress(winner)
    return
  }
  await sendAddressCheck({ id, email: input.email, name: input.name })
}

async function answerTakenAddress(user: User): Promise<void> {
  if (user.role === 'guest' && !user.emailVerifiedAt && user.passwordHash && !user.disabled) {
    await sendAddressCheck(user)
    return
  }
  if (!mayMail('exists', user.email)) return
  const venue = await getVenue()
  await useDb().transaction(tx => queueMail(tx, accountExistsEmail({ venue, to: user.email, name: user.name, signInLink: appLink('/signin'), resetLink: appLink('/forgot-password') })))
  kickOutbox()
}

/** A reset request, after the answer: a link for an account that can sign in, nothing otherwise. */
export async function sendPasswordReset(email: string): Promise<void> {
  const [user] = await useDb().select().from(tables.users).where(eq(tables.users.email, email)).limit(1)
  if (!user || user.disabled || !user.passwordHash || !mayMail('reset', user.email)) return
  const venue = await getVenue()
  const ttlMs = useRuntimeConfig().tokens.resetMinutes * 60_000
  await useDb().transaction(async (tx) => {
    const token = await issueToken(tx, { userId: user.id, purpose: 'reset', ttlMs })
    await queueMail(tx, passwordResetEmail({ venue, to: user.email, name: user.name, link: appLink(`/reset-password?token=${token}`), ttlMs }))
  })
  kickOutbox()
}
