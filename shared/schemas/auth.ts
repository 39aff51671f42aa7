import { z } from './zod'
import { emailField, isoDateField, passwordField, personNameField, tokenField } from './common'

/** Age in whole years on a given day (UTC calendar dates). */
export function ageOn(dateOfBirth: string, onDay: string): number {
  const [by, bm, bd] = dateOfBirth.split('-').map(Number) as [number, number, number]
  const [y, m, d] = onDay.split('-').map(Number) as [number, number, number]
  return y - by - (m < bm || (m === bm && d < bd) ? 1 : 0)
}

export const signUpSchema = z.object({
  name: personNameField,
  email: emailField,
  password: passwordField,
  dateOfBirth: isoDateField.refine(s => s >= '1900-01-01' && s <= new Date().toISOString().slice(0, 10), { error: 'Enter your real date of birth.' }),
})

export const signInSchema = z.object({
  email: emailField,
  password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }).max(200, { error: 'That password is too long.' }),
})

export const resetRequestSchema = z.object({ email: emailField })

export const setPasswordSchema = z.object({ token: tokenField, password: passwordField })

export const addressCheckSchema = z.object({ token: tokenField })
