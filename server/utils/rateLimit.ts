import type { H3Event } from 'h3'

/**
 * Request budgets kept in this process's memory: `max` uses per key in a sliding `windowMs`. The
 * map is pruned as it goes and capped (MAX_KEYS), oldest first, so a flood of new keys cannot grow
 * it without end. The app runs as one process; several would
 * each keep their own budgets.
 */
const MAX_KEYS = 50_000
const uses = new Map<string, number[]>()

export interface Budget { max: number, windowMs: number }

/** Limits on the account routes: named here, documented in DEVELOPERS.md ("Limits on the account routes"). */
export const LIMITS = {
  /** Sign-ups from one client. */
  signUpPerClient: { max: 10, windowMs: 3_600_000 },
  /** Reset requests from one client (each may send an e-mail). */
  resetRequestPerClient: { max: 10, windowMs: 3_600_000 },
  /** E-mails of one kind (reset link, address check, "you already have an account") to one address. */
  mailPerAddress: { max: 3, windowMs: 3_600_000 },
  /** Tries of one-time links (reset, invitation, address check) from one client. */
  linkPerClient: { max: 20, windowMs: 3_600_000 },
  /**
   * Guests' observations from one client address: a full room of guests on the venue's one Wi-Fi
   * (40 seats × 6 pours) shares an address, so the bound sits above that.
   */
  observationPerClient: { max: 240, windowMs: 3_600_000 },
  /** Bot-check challenges fetched from one client address (each pour page asks for one; a retry for another). */
  challengePerClient: { max: 600, windowMs: 3_600_000 },
} as const satisfies Record<string, Budget>

/** Spends one use of the budget; false (and nothing spent) when it is used up. */
export function spend(key: string, budget: Budget, now = Date.now()): boolean {
  const since = now - budget.windowMs
  const list = (uses.get(key) ?? []).filter(t => t > since)
  if (list.length >= budget.max) {
    uses.set(key, list)
    return false
  }
  list.push(now)
  uses.delete(key)
  uses.set(key, list)
  if (uses.size > MAX_KEYS) uses.delete(uses.keys().next().value!)
  return true
}

/** 429 with Retry-After when this client has used up the route's budget. */
export function limitClient(event: H3Event, name: keyof typeof LIMITS, message: string): void {
  const budget = LIMITS[name]
  if (spend(`${name}:${clientAddress(event)}`, budget)) return
  const seconds = Math.ceil(budget.windowMs / 1000)
  setResponseHeader(event, 'Retry-After', seconds)
  throw createError({ status: 429, statusText: 'Too many requests', message, data: { retryAfterSeconds: seconds } })
}
