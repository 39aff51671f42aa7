/**
 * The bot check on a guest's observation, both sides of it: the server signs a random challenge, the
 * browser finds a counter whose SHA-256 with the challenge starts with CHALLENGE_BITS zero bits
 * (about 2^CHALLENGE_BITS tries), the server checks it with one hash. Needs no outside service; it
 * costs a person's phone about a second, and a flood of entries that many seconds each. WebCrypto
 * (`crypto.subtle`) runs the same in the browser and in Node.
 */

/**
 * Zero bits the answer's hash starts with: 2^14 ≈ 16 000 hashes on average. Measured in Debian's
 * Chromium on this project's shared 2-core machine (load about 6), batches of 256: 18–30 µs a hash,
 * median 0.4 s and mean 0.5 s over 40 challenges (15 bits: median 0.5 s, mean 0.7 s). A mid-range
 * phone is a few times slower, about a second (estimate, no source); the page solves it in the
 * background while the guest looks at the glass.
 */
export const CHALLENGE_BITS = 14
/** A challenge is good for this long after it was issued (a guest may take a while over the glass). */
export const CHALLENGE_TTL_MS = 30 * 60_000
/** An answer sooner than this after the challenge is not a person's: nobody looks at a glass and taps four choices in under 2 s. */
export const CHALLENGE_MIN_MS = 2_000

/** What GET /api/observations/challenge answers. */
export interface ObservationChallenge {
  token: string
  bits: number
  /** Milliseconds from now before an answer is taken, and until the challenge expires. */
  waitMs: number
  expiresInMs: number
}

/** Leading zero bits of a hash. */
export function leadingZeroBits(bytes: Uint8Array): number {
  let n = 0
  for (const b of bytes) {
    if (b === 0) {
      n += 8
      continue
    }
    return n + Math.clz32(b) - 24
  }
  return n
}

const encoder = new TextEncoder()
async function hashOf(token: string, counter: number): Promise<Uint8Array> {
  // WebCrypto exists only in a secure context (https, or localhost); the page says so if it is missing.
  if (!globalThis.crypto?.subtle) throw new Error('This page needs a secure (https) connection to send what you saw.')
  return new Uint8Array(await globalThis.crypto.subtle.digest('SHA-256', encoder.encode(`${token}:${counter}`)))
}

/** True when `counter` answers `token` at `bits`. */
export async function answers(token: string, counter: number, bits: number): Promise<boolean> {
  return leadingZeroBits(await hashOf(token, counter)) >= bits
}

/** Finds the smallest answering counter, hashing `batch` counters at once (WebCrypto is asynchronous, so batches keep it busy). */
export async function solveChallenge(token: string, bits: number, batch = 256): Promise<number> {
  for (let start = 0; ; start += batch) {
    const hashes = await Promise.all(Array.from({ length: batch }, (_, i) => hashOf(token, start + i)))
    const hit = hashes.findIndex(h => leadingZeroBits(h) >= bits)
    if (hit >= 0) return start + hit
  }
}
