/**
 * Solves the observation form's bot check off the page's main thread (a dedicated worker, same
 * origin, allowed by the page's script-src 'self'): the ~16,000 hashes and their promises would
 * otherwise hold the pour page's main thread for seconds on a slow phone.
 * Message in: { token, bits }; out: { counter } or { error }.
 */
import { solveChallenge } from '../shared/observationChallenge'

/** The worker's own scope (the project's TypeScript has the DOM's types, not the worker's). */
const scope = globalThis as unknown as { postMessage: (message: unknown) => void, addEventListener: (type: 'message', listener: (e: MessageEvent<{ token: string, bits: number }>) => void) => void }

scope.addEventListener('message', (e) => {
  solveChallenge(e.data.token, e.data.bits).then(
    counter => scope.postMessage({ counter }),
    (err: unknown) => scope.postMessage({ error: err instanceof Error ? err.message : String(err) }),
  )
})
