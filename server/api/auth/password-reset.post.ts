import type { MessageAnswer } from '../../../shared/types/account'
import { resetRequestSchema } from '../../../shared/schemas/auth'

/**
 * Always the same answer, as fast either way: the account is looked up and the link sent after
 * answering, so neither the words nor the timing reveal which addresses have accounts.
 */
export default defineEventHandler(async (event): Promise<MessageAnswer> => {
  const { email } = await readBodyAs(event, resetRequestSchema)
  limitClient(event, 'resetRequestPerClient', 'Too many reset requests from your network. Please try again in an hour.')
  afterResponse('password reset request', () => sendPasswordReset(email))
  return { message: 'If an account exists for that address, a reset link is on its way. Check your inbox.' }
})
