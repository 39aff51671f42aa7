import type { MessageAnswer } from '../../../shared/types/account'
import { ageOn, signUpSchema } from '../../../shared/schemas/auth'

/**
 * Guests create their own account; staff accounts come only from a manager's invitation. The answer
 * is the same whether or not the address already has an account (the e-mail tells the difference),
 * and the password is hashed only after answering, so neither the words nor the timing give it away.
 */
export default defineEventHandler(async (event): Promise<MessageAnswer> => {
  const input = await readBodyAs(event, signUpSchema)
  const venue = await getVenue()
  const today = new Date().toISOString().slice(0, 10)
  if (ageOn(input.dateOfBirth, today) < venue.legalAge) {
    invalidFields({ dateOfBirth: `You must be at least ${venue.legalAge} to create an account.` })
  }
  limitClient(event, 'signUpPerClient', 'Too many sign-ups from your network. Please try again in an hour.')
  if (hashQueueFull()) throw createError({ status: 503, statusText: 'Busy', message: 'We are busy right now. Please try again in a few seconds.' })
  afterResponse('sign-up', () => registerGuest(input))
  setResponseStatus(event, 202)
  return { message: `Check your e-mail: we have sent a message to ${input.email} with the next step.` }
})
