import { eq } from 'drizzle-orm'
import type { MessageAnswer } from '../../../shared/types/account'

/** Sends the signed-in guest a new link to confirm their address (a few an hour at most). */
export default defineEventHandler(async (event): Promise<MessageAnswer> => {
  const user = await requireRole(event, 'guest')
  const [row] = await useDb().select().from(tables.users).where(eq(tables.users.id, user.id))
  if (row!.emailVerifiedAt) conflict('Your address is already confirmed.')
  if (!await sendAddressCheck(row!)) {
    throw createError({ status: 429, statusText: 'Too many requests', message: `We have sent several links to ${row!.email} in the last hour. Look for them in your inbox (and the spam folder), or try again later.` })
  }
  return { message: `We have sent a new link to ${row!.email}. Open it to confirm your address.` }
})
