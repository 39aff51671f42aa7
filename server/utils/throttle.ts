import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'
import { eq, inArray, sql } from 'drizzle-orm'

/**
 * Failed sign-ins slow down whoever makes them, never the account's owner elsewhere (OWASP
 * Authentication Cheat Sheet, "account lockout": a lock that anyone can trigger is a denial of
 * service). Three counters, each over a sliding window:
 *
 * - one client at one account (`pair`): after `throttle.accountMax` failures that client must wait
 *   before its next try, 30 s, then twice as long after each further failure, up to
 *   `throttle.maxDelayMinutes` (429 with Retry-After);
 * - one client across accounts (`ip`, password spraying): the same after `throttle.ipMax` failures;
 * - one account from everywhere (`account`): after ACCOUNT_WIDE_FREE failures each attempt is
 *   answered a little later (100 ms, doubling, at most ACCOUNT_WAIT_MAX_MS) but never refused, so
 *   the owner with the right password still gets in while strangers fail elsewhere.
 */
const FIRST_DELAY_MS = 30_000
const ACCOUNT_WIDE_FREE = 10
const ACCOUNT_FIRST_WAIT_MS = 100
const ACCOUNT_WAIT_MAX_MS = 2_000

export interface ThrottleKeys { account: string, pair: string, ip: string }

export function throttleKeys(event: H3Event, email: string): ThrottleKeys {
  const ip = clientAddress(event)
  return { account: `account:${email}`, pair: `pair:${createHash('sha256').update(`${email}\n${ip}`).digest('hex')}`, ip: `ip:${ip}` }
}

/** The delay after the `over`-th failure beyond the free ones (1-based). */
const delayMs = (over: number, maxMs: number) => Math.min(maxMs, FIRST_DELAY_MS * 2 ** Math.min(over - 1, 20))

function tooMany(seconds: number, scope: 'pair' | 'ip'): never {
  const when = seconds < 90 ? `${seconds} second${seconds === 1 ? '' : 's'}` : `${Math.ceil(seconds / 60)} minutes`
  const what = scope === 'pair' ? 'at this account from your network' : 'from your network'
  throw createError({
    status: 429,
    statusText: 'Too many attempts',
    message: `Too many failed sign-ins ${what}. Try again in ${when}, or reset your password.`,
    data: { retryAfterSeconds: seconds },
  })
}

/** 429 while this client must wait; otherwise waits briefly if the account as a whole is being guessed at. */
export async function assertNotThrottled(event: H3Event, keys: ThrottleKeys): Promise<void> {
  const rows = await useDb().select().from(tables.signInThrottle).where(inArray(tables.signInThrottle.key, [keys.account, keys.pair, keys.ip]))
  const now = Date.now()
  const windowMs = useRuntimeConfig().throttle.windowMinutes * 60_000
  for (const row of rows) {
    if (row.key === keys.account) continue
    if (row.lockedUntil && row.lockedUntil.getTime() > now) {
      const seconds = Math.ceil((row.lockedUntil.getTime() - now) / 1000)
      setResponseHeader(event, 'Retry-After', seconds)
      tooMany(seconds, row.key === keys.pair ? 'pair' : 'ip')
    }
  }
  const account = rows.find(r => r.key === keys.account)
  if (account && now - account.windowStartedAt.getTime() <= windowMs && account.failures > ACCOUNT_WIDE_FREE) {
    const wait = Math.min(ACCOUNT_WAIT_MAX_MS, ACCOUNT_FIRST_WAIT_MS * 2 ** Math.min(account.failures - ACCOUNT_WIDE_FREE - 1, 10))
    await new Promise(r => setTimeout(r, wait))
  }
}

/**
 * Counts a failure on each counter. One upsert per counter and no locking read: a locking read of
 * a row that does not exist yet takes a gap lock, and sign-ins failing at once then deadlock.
 */
export async function recordSignInFailure(keys: ThrottleKeys): Promise<void> {
  const { throttle } = useRuntimeConfig()
  const windowMs = throttle.windowMinutes * 60_000
  const maxDelay = throttle.maxDelayMinutes * 60_000
  const t = tables.signInThrottle
  const db = useDb()
  const counters = [[keys.account, Number.POSITIVE_INFINITY], [keys.pair, throttle.accountMax], [keys.ip, throttle.ipMax]] as const
  for (const [key, free] of counters) {
    const now = new Date()
    const windowStart = new Date(now.getTime() - windowMs)
    // MariaDB applies the assignments in order: `failures` reads the window as it was.
    await db.insert(t).values({ key, failures: 1, windowStartedAt: now, lockedUntil: null }).onDuplicateKeyUpdate({
      set: {
        failures: sql`if(${t.windowStartedAt} < ${windowStart}, 1, ${t.failures} + 1)`,
        windowStartedAt: sql`if(${t.windowStartedAt} < ${windowStart}, ${now}, ${t.windowStartedAt})`,
      },
    })
    if (!Number.isFinite(free)) continue
    const [row] = await db.select({ failures: t.failures }).from(t).where(eq(t.key, key))
    if (row && row.failures >= free) {
      await db.update(t).set({ lockedUntil: new Date(now.getTime() + delayMs(row.failures - free + 1, maxDelay)) }).where(eq(t.key, key))
    }
  }
}

/** A right password clears the account's counters and this client's at it (not the client's spraying count). */
export async function clearAccountThrottle(keys: Pick<ThrottleKeys, 'account'> & Partial<ThrottleKeys>): Promise<void> {
  await useDb().delete(tables.signInThrottle).where(inArray(tables.signInThrottle.key, [keys.account, ...(keys.pair ? [keys.pair] : [])]))
}
