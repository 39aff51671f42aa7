import { solveChallenge, type ObservationChallenge } from '#shared/observationChallenge'
import type { ObservationFields } from '#shared/observations'
import type { ObservationSaved, PourObservations } from '#shared/types/observations'

interface Solved { token: string, counter: number, readyAt: number }

/**
 * The bot check solved in a worker, so the page stays responsive while it runs; on the page's own
 * thread where a worker cannot start (an old browser, a blocked script), as before.
 */
function solveOffThread(token: string, bits: number): Promise<number> {
  if (typeof Worker === 'undefined') return solveChallenge(token, bits)
  return new Promise<number>((resolve, reject) => {
    let worker: Worker
    try {
      worker = new Worker(new URL('../workers/observationChallenge.worker.ts', import.meta.url), { type: 'module' })
    }
    catch {
      return resolve(solveChallenge(token, bits))
    }
    worker.onmessage = (e: MessageEvent<{ counter?: number, error?: string }>) => {
      worker.terminate()
      if (typeof e.data.counter === 'number') resolve(e.data.counter)
      else reject(new Error(e.data.error ?? 'The bot check could not be solved.'))
    }
    worker.onerror = (e) => {
      e.preventDefault()
      worker.terminate()
      resolve(solveChallenge(token, bits))
    }
    worker.postMessage({ token, bits })
  })
}

/**
 * The guest's side of recording a glass on the pour page. Everything here runs in the browser after
 * hydration (the page's HTML is the same for every visitor and may be cached whole): the card's
 * session (`?s=`), the bot check (fetched and solved in the background as soon as the page opens),
 * this device's earlier entries and the comparison.
 */
export function useObservation(flightId: number, position: number) {
  const sessionId = ref<number | null>(null)
  const view = ref<PourObservations | null>(null)
  const loadError = ref('')
  /** How long the last bot check took to solve in this browser, ms (shown to nobody; tests read it). */
  const solveMs = ref<number | null>(null)
  let solving: Promise<Solved> | null = null

  function startChallenge(): Promise<Solved> {
    const started = performance.now()
    const p = (async () => {
      const c = await $fetch<ObservationChallenge>('/api/observations/challenge')
      const fetchedAt = Date.now()
      const counter = await solveOffThread(c.token, c.bits)
      solveMs.value = Math.round(performance.now() - started)
      return { token: c.token, counter, readyAt: fetchedAt + c.waitMs + 250 }
    })()
    solving = p
    p.catch((err) => {
      if (solving === p) solving = null
      if (err instanceof Error && /secure/.test(err.message)) loadError.value = err.message
    })
    return p
  }

  async function load() {
    loadError.value = ''
    try {
      view.value = await $fetch<PourObservations>(`/api/flights/${flightId}/pours/${position}/observations`, { query: sessionId.value ? { s: sessionId.value } : {} })
    }
    catch (err) {
      loadError.value = readServerError(err).message
    }
  }

  onMounted(() => {
    const s = Number(useRoute().query.s)
    sessionId.value = Number.isInteger(s) && s > 0 ? s : null
    void load()
    void startChallenge()
  })

  /** Sends one glass; a bot check that ran out or was spent is fetched and solved once more. Throws the server's error for the form. */
  async function send(fields: ObservationFields, website: string): Promise<ObservationSaved> {
    for (let attempt = 0; ; attempt++) {
      const solved = await (solving ?? startChallenge())
      const wait = solved.readyAt - Date.now()
      if (wait > 0) await new Promise(r => setTimeout(r, wait))
      solving = null
      try {
        const saved = await $fetch<ObservationSaved>('/api/observations', {
          method: 'POST',
          body: { flightId, position, sessionId: sessionId.value, ...fields, challenge: { token: solved.token, counter: solved.counter }, website },
        })
        await load()
        void startChallenge()
        return saved
      }
      catch (err) {
        const reason = (err as { data?: { data?: { challenge?: string } } }).data?.data?.challenge
        if (attempt === 0 && (reason === 'expired' || reason === 'reused' || reason === 'too_fast' || reason === 'forged')) {
          void startChallenge()
          continue
        }
        // A refused field spends nothing: the same answer goes with the corrected form.
        if ((err as { statusCode?: number }).statusCode === 400) solving = Promise.resolve(solved)
        else if (!solving) void startChallenge()
        throw err
      }
    }
  }

  return { sessionId, view, loadError, solveMs, send, reload: load }
}
