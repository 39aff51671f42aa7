import { z } from './zod'

export const emailField = z.string({ error: 'Enter your e-mail address.' })
  .trim().toLowerCase().max(254, { error: 'That e-mail address is too long.' })
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }))

export const PASSWORD_MIN = 10
export const passwordField = z.string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN, { error: `Use at least ${PASSWORD_MIN} characters for the password.` })
  .max(200, { error: 'Use at most 200 characters for the password.' })

/** Line breaks and tabs (U+0085, U+2028 and U+2029 included): a name is one line of an e-mail or a list. */
const LINE_BREAKS = /[\t\n\v\f\r\u0085\u2028\u2029]/

export const personNameField = z.string({ error: 'Enter a name.' })
  .refine(s => !LINE_BREAKS.test(s), { error: 'Write the name on one line, without line breaks or tabs.' })
  .trim().min(1, { error: 'Enter a name.' }).max(120, { error: 'Use at most 120 characters for the name.' })

/** A calendar date typed as YYYY-MM-DD that really exists (no 2023-02-30). */
export const isoDateField = z.string({ error: 'Enter a date as YYYY-MM-DD.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Enter a date as YYYY-MM-DD.' })
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`)
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s
  }, { error: 'That date does not exist.' })

export const idParam = z.object({
  id: z.coerce.number({ error: 'The id must be a number.' }).int({ error: 'The id must be a whole number.' }).positive({ error: 'The id must be positive.' }),
})

/** One-time link tokens are 32 random bytes in base64url. */
export const tokenField = z.string({ error: 'The link is incomplete.' }).regex(/^[\w-]{43}$/, { error: 'This link is not valid. Ask for a new one.' })
