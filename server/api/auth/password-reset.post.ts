import type { MessageAnswer } from '../../../shared/types/account'
import { eq } from 'drizzle-orm'
import { resetRequestSchema } from '../../../shared/schemas/auth'

/** Always the same answer, so the form does not reveal which addresses have accounts. */
export default defineEventHandler(async (event): Promise<MessageAnswer> => {
  const { email } = await readBodyAs(event, resetRequestSchema)
  const [user] = await useDb().select().from(tables.users).where(eq(tables.users.email, email)).limit(1)
  if (user && !user.disabled && user.passwordHash) {
    const venue = await getVenue()
    const ttlMs = useRuntimeConfig().tokens.resetMinutes * 60_000
    await useDb().transaction(async (tx) => {
      const token = await issueToken(tx, { userId: user.id, purpose: 'reset', ttlMs })
      await queueMail(tx, passwordResetEmail({ venue, to: user.email, name: user.name, link: appLink(`/reset-password?token=${token}`), ttlMs }))
    })
    kickOutbox()
  }
  return { message: 'If an account exists for that address, a reset link is on its way. Check your inbox.' }
})
