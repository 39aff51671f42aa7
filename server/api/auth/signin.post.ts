import { eq } from 'drizzle-orm'
import { signInSchema } from '../../../shared/schemas/auth'

/** A hash of a random password, verified when the e-mail is unknown so both paths take as long. */
let decoyHash: Promise<string> | undefined

export default defineEventHandler(async (event) => {
  const input = await readBodyAs(event, signInSchema)
  const keys = throttleKeys(event, input.email)
  await assertNotThrottled(event, keys)

  const [row] = await useDb().select().from(tables.users).where(eq(tables.users.email, input.email)).limit(1)
  decoyHash ??= hashPassword(crypto.randomUUID())
  const ok = row?.passwordHash
    ? await verifyPasswordBounded(row.passwordHash, input.password)
    : (await verifyPasswordBounded(await decoyHash, input.password), false)

  if (!row || !ok) {
    await recordSignInFailure(keys)
    throw createError({ status: 401, statusText: 'Wrong e-mail or password', message: 'That e-mail and password do not match an account.' })
  }
  if (row.disabled) {
    throw createError({ status: 403, statusText: 'Account disabled', message: 'This account has been disabled. Ask the venue manager.' })
  }
  await clearAccountThrottle(keys)
  return { user: await startUserSession(event, row) }
})
