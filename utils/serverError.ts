import type { FieldErrors } from '#shared/utils/fieldErrors'

interface ServerError { statusCode?: number, data?: { message?: string, data?: { fields?: FieldErrors } } }

/** The message and field errors of a failed $fetch, as the server's 4xx answers shape them. */
export function readServerError(err: unknown): { message: string, fields: FieldErrors } {
  const e = err as ServerError
  const fields = { ...(e.data?.data?.fields ?? {}) }
  const message = e.data?.message ?? 'Something went wrong. Please try again.'
  return { message, fields }
}
