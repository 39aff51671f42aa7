import type { z } from 'zod'

/** Field path → first message, the shape every 400 answers with and every form shows. */
export type FieldErrors = Record<string, string>

export function fieldErrorsFromZod(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {}
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.map(String).join('.') : '_'
    if (!(key in out)) out[key] = issue.message
  }
  return out
}
