import { createHmac, hkdfSync, randomBytes, timingSafeEqual } from 'node:crypto'
import type { H3Event } from 'h3'
import { CHALLENGE_BITS, CHALLENGE_MIN_MS, CHALLENGE_TTL_MS, answers, type ObservationChallenge } from '../../shared/observationChallenge'

/**
 * The guest side's defences for observations: the bot check (a signed, expiring, single-use
 * proof-of-work challenge), and the device key (a keyed hash of a random per-browser cookie, so a
 * device can be limited without anything that names it being stored).
 *
 * Both keys are derived from the session password (NUXT_SESSION_PASSWORD, checked at start-up by
 * server/plugins/secrets.ts) with HKDF-SHA-256 (RFC 5869) under their own labels, so neither is a
 * new setting and neither can stand in for the other. Changing the session password makes every
 * outstanding challenge invalid (the page asks for a new one) and gives every device a new key.
 */
function derivedKey(label: string): Buffer {
  const password = String(useRuntimeConfig().session.password ?? '')
  if (password.length < 16) throw new Error('The session password is not set; observations need it for their keys.')
  return Buffer.from(hkdfSync('sha256', password, 'larmoir', label, 32))
}
let keys: { challenge: Buffer, device: Buffer } | undefined
const observationKeys = () => (keys ??= { challenge: derivedKey('observation challenge v1'), device: derivedKey('observation device v1') })

/** The device cookie: random, httpOnly, SameSite=Lax, kept for 400 days (the longest Chromium keeps any cookie). */
export const DEVICE_COOKIE = 'larmoir_device'
const DEVICE_COOKIE_MAX_AGE_S = 400 * 24 * 3600

/** The device's cookie, made and set now if it has none (the challenge route). */
export function ensureDeviceCookie(event: H3Event): string {
  const have = getCookie(event, DEVICE_COOKIE)
  if (have && /^[\w-]{32,64}$/.test(have)) return have
  const value = randomBytes(24).toString('base64url')
  const session = useRuntimeConfig().session.cookie
  setCookie(event, DEVICE_COOKIE, value, {
    httpOnly: true,
    sameSite: 'lax',
    // Secure when the session cookie is (NUXT_SESSION_COOKIE_SECURE).
    secure: session ? Boolean(session.secure) : false,
    path: '/',
    maxAge: DEVICE_COOKIE_MAX_AGE_S,
  })
  return value
}

/** HMAC-SHA-256 of the device's cookie (hex), or null when the browser sent none. Only this is stored. */
export function deviceKeyOf(event: H3Event): string | null {
  const cookie = getCookie(event, DEVICE_COOKIE)
  if (!cookie || !/^[\w-]{32,64}$/.test(cookie)) return null
  return createHmac('sha256', observationKeys().device).update(cookie).digest('hex')
}

interface ChallengeBody { v: 1, id: string, iat: number, bits: number }
const sign = (payload: string) => createHmac('sha256', observationKeys().challenge).update(payload).digest('base64url')

/** A new challenge: a random id and the time, signed; the browser solves it (shared/observationChallenge.ts). */
export function issueObservationChallenge(now = Date.now()): ObservationChallenge {
  const body: ChallengeBody = { v: 1, id: randomBytes(16).toString('base64url'), iat: now, bits: CHALLENGE_BITS }
  const payload = Buffer.from(JSON.stringify(body)).toString('base64url')
  return { token: `${payload}.${sign(payload)}`, bits: CHALLENGE_BITS, waitMs: CHALLENGE_MIN_MS, expiresInMs: CHALLENGE_TTL_MS }
}

/**
 * Answered challenges, by id, until they expire: a second use is refused. In this process's memory
 * (the app runs as one process, as the other limits in server/utils/rateLimit.ts); a restart forgets
 * them, but then at most one more use each, within their 30 minutes. Bounded: the oldest go first.
 */
const USED_MAX = 100_000
const used = new Map<string, number>()
function forgetExpired(now: number) {
  for (const [id, until] of used) {
    if (until > now) break
    used.delete(id)
  }
}

export type ChallengeRefusal = 'forged' | 'expired' | 'too_fast' | 'wrong' | 'reused'
const REFUSALS: Record<ChallengeRefusal, string> = {
  forged: 'The bot check was not issued by this site. Reload the page and try again.',
  expired: 'The bot check ran out (it lasts 30 minutes). Send again: the page fetches a new one.',
  too_fast: 'That was quicker than a person can look at a glass. Wait a moment and send again.',
  wrong: 'The bot check’s answer is wrong. Reload the page and try again.',
  reused: 'This bot check was already used. Send again: the page fetches a new one.',
}

function refuse(reason: ChallengeRefusal): never {
  throw createError({ status: 403, statusText: 'Bot check failed', message: REFUSALS[reason], data: { challenge: reason } })
}

/**
 * Checks the answer and spends the challenge (403 with `data.challenge` naming the reason). A
 * challenge answered too soon is not spent, so the same page can send it again a moment later.
 */
export async function spendObservationChallenge(token: string, counter: number, now = Date.now()): Promise<void> {
  const [payload = '', signature = ''] = token.split('.')
  const expected = Buffer.from(sign(payload))
  const given = Buffer.from(signature)
  if (!payload || given.length !== expected.length || !timingSafeEqual(given, expected)) refuse('forged')
  let body: ChallengeBody
  try { body = JSON.parse(Buffer.from(payload, 'base64url').toString('utf8')) as ChallengeBody }
  catch { refuse('forged') }
  if (body.v !== 1 || typeof body.id !== 'string' || typeof body.iat !== 'number' || body.bits !== CHALLENGE_BITS) refuse('forged')
  if (now > body.iat + CHALLENGE_TTL_MS) refuse('expired')
  if (now < body.iat + CHALLENGE_MIN_MS) refuse('too_fast')
  forgetExpired(now)
  if (used.has(body.id)) refuse('reused')
  if (!(await answers(token, counter, body.bits))) refuse('wrong')
  // Checked again after the await: two requests with one challenge cannot both pass.
  if (used.has(body.id)) refuse('reused')
  used.set(body.id, body.iat + CHALLENGE_TTL_MS)
  if (used.size > USED_MAX) used.delete(used.keys().next().value!)
}
