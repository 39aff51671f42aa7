/**
 * At most HASHES_AT_ONCE password hashes (scrypt, deliberately slow) run at a time, so a burst of
 * sign-ups or link confirmations cannot take every core from the pages. Others wait their turn; past
 * HASH_QUEUE_MAX waiting the request is turned away with 503 and Retry-After.
 */
const HASHES_AT_ONCE = 2
const HASH_QUEUE_MAX = 32

let running = 0
const waiting: (() => void)[] = []

function busy(): never {
  throw createError({ status: 503, statusText: 'Busy', message: 'We are busy right now. Please try again in a few seconds.', data: { retryAfterSeconds: 5 } })
}

/** True when a hash asked for now would be turned away. */
export const hashQueueFull = () => running >= HASHES_AT_ONCE && waiting.length >= HASH_QUEUE_MAX

async function withHashSlot<T>(work: () => Promise<T>): Promise<T> {
  if (running >= HASHES_AT_ONCE) {
    if (waiting.length >= HASH_QUEUE_MAX) busy()
    await new Promise<void>(resolve => waiting.push(resolve))
  }
  else running++
  try { return await work() }
  finally {
    const next = waiting.shift()
    if (next) next()
    else running--
  }
}

export const hashPasswordBounded = (password: string) => withHashSlot(() => hashPassword(password))
export const verifyPasswordBounded = (hash: string, password: string) => withHashSlot(() => verifyPassword(hash, password))
