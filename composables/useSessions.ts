import type { SessionStatus } from '#shared/sessions'

export interface SessionRow {
  id: number
  flightId: number
  flightName: string
  flightVersion: number
  startsAt: string
  startsLocal: string
  endsAt: string
  durationMinutes: number
  seats: number
  priceMinor: number
  currency: string
  hostId: number | null
  hostName: string | null
  bookingCutoffMinutes: number
  bookingClosesAt: string
  status: SessionStatus
  seriesId: string | null
}

/** Upcoming sessions in a range of venue-local dates, and the manager's changes to them. */
export function useSessions(range: Ref<{ from: string, to: string }>) {
  const list = useFetch<SessionRow[]>('/api/sessions', { key: 'sessions', query: range, default: () => [] })
  const message = ref('')
  const error = ref('')
  async function patch(s: SessionRow, body: Record<string, unknown>, done: string) {
    message.value = ''
    error.value = ''
    try {
      await $fetch(`/api/sessions/${s.id}`, { method: 'PATCH', body })
      message.value = done
      await refreshNuxtData('sessions')
    }
    catch (err) {
      error.value = readServerError(err).message
    }
  }
  return { ...list, message, error, patch }
}
