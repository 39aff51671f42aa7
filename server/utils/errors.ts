/**
 * The ways a route says no, in h3's current form (`status`, `statusText`, `message`). `message` is
 * what people read (the client shows it, and a form shows `data.fields` beside its inputs);
 * `statusText` is the short HTTP reason. Any other status: `throw createError({ status, statusText,
 * message })` where it happens.
 */

/** 404: missing, and also "not yours" (someone else's booking looks like no booking at all). */
export function notFound(message: string): never {
  throw createError({ status: 404, statusText: 'Not found', message })
}

/** 400 with a message per field (field path → message); the overall message defaults to all of them. */
export function invalidFields(fields: Record<string, string>, message = Object.values(fields).join(' ')): never {
  throw createError({ status: 400, statusText: 'Invalid input', message, data: { fields } })
}

/** 409: the request is fine, the state of things does not allow it (a full session, a booking already moved). */
export function conflict(message: string, data?: Record<string, unknown>): never {
  throw createError({ status: 409, statusText: 'Conflict', message, ...(data ? { data } : {}) })
}

/** 413: the request is over its size limit; `fields` names the input that was too big, if one was. */
export function tooLarge(message: string, fields?: Record<string, string>): never {
  throw createError({ status: 413, statusText: 'Too large', message, ...(fields ? { data: { fields } } : {}) })
}
