import type { H3Event } from 'h3'
import { eq, inArray } from 'drizzle-orm'

/**
 * Failed sign-ins are counted per account and per client address in a window; past the limit the
 * key is locked for a while and every attempt (right password or not) answers 429 with the time
 * left, so guessing is slow and the user knows when to try again.
 */
export function throttleKeys(event: H3Event, email: string): { account: string, ip: string } {
  const ip = clientAddress(event)
  return { account: `account:${email}`, ip: `ip:${ip}` }
}

function tooMany(seconds: number, scope: 'account' | 'ip'): never {
  const minutes = Math.max(1, Math.ceil(seconds / 60))
  const what = scope === 'account' ? 'for this account' : 'from your network'
  throw createError({
    status: 429,
    statusText: 'Too many attempts',
    message: `Too many failed sign-ins ${what}. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or reset your password.`,
    data: { retryAfterSeconds: seconds },
  })
}

export async function assertNotThrottled(event: H3Event, keys: { account: string, ip: string }): Promise<void> {
  const rows = await useDb().select().from(tables.signInThrottle).where(inArray(tables.signInThrottle.key, [keys.account, keys.ip]))
  const now = Date.now()
  for (const row of rows) {
    if (row.lockedUntil && row.lockedUntil.getTime() > now) {
      const seconds = Math.ceil((row.lockedUntil.getTime() - now) / 1000)
      setResponseHeader(event, 'Retry-After', seconds)
      tooMany(seconds, row.key === keys.account ? 'account' : 'ip')
    }
  }
}

export async function recordSignInFailure(keys: { account: string, ip: string }): Promise<void> {
  const { throttle } = useRuntimeConfig()
  const windowMs = throttle.windowMinutes * 60_000
  const lockMs = throttle.lockMinutes * 60_000
  await useDb().transaction(async (tx) => {
    for (const [key, max] of [[keys.account, throttle.accountMax], [keys.ip, throttle.ipMax]] as const) {
      const now = new Date()
      const [row] = await tx.select().from(tables.signInThrottle).where(eq(tables.signInThrottle.key, key)).for('update')
      if (!row) {
        await tx.insert(tables.signInThrottle).values({ key, failures: 1, windowStartedAt: now, lockedUntil: max <= 1 ? new Date(now.getTime() + lockMs) : null })
        continue
      }
      const fresh = now.getTime() - row.windowStartedAt.getTime() > windowMs
      const failures = fresh ? 1 : row.failures + 1
      await tx.update(tables.signInThrottle).set({
        failures: failures >= max ? 0 : failures,
        windowStartedAt: fresh || failures >= max ? now : row.windowStartedAt,
        lockedUntil: failures >= max ? new Date(now.getTime() + lockMs) : row.lockedUntil,
      }).where(eq(tables.signInThrottle.key, key))
    }
  })
}

export async function clearAccountThrottle(accountKey: string): Promise<void> {
  await useDb().delete(tables.signInThrottle).where(eq(tables.signInThrottle.key, accountKey))
}
