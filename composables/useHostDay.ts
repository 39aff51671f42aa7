import type { HostDay } from '~~/server/utils/hostDay'

export type HostSession = HostDay['sessions'][number]
export type HostParty = HostSession['parties'][number]

/** The host's day for a venue-local date, and every door action on it (each refreshes the day). */
export function useHostDay(date: Ref<string>) {
  const day = useFetch<HostDay>(() => `/api/days/${encodeURIComponent(date.value)}`, { key: 'host-day' })
  const message = ref('')
  const error = ref('')
  const busy = ref(false)
  // Plain string URLs: the typed route inference of $fetch is too deep for these templates.
  const post = (url: string, body?: Record<string, unknown>) => $fetch(url, { method: 'POST', body })

  async function act(fn: () => Promise<unknown>, done: string) {
    busy.value = true
    message.value = ''
    error.value = ''
    try {
      await fn()
      message.value = done
      await day.refresh()
      return true
    }
    catch (err) {
      error.value = readServerError(err).message
      return false
    }
    finally {
      busy.value = false
    }
  }

  return {
    day: day.data,
    pending: day.pending,
    message,
    error,
    busy,
    refresh: day.refresh,
    checkIn: (p: HostParty, seated: number, idsSeen: number, reason?: string) => act(() => post(`/api/bookings/${p.id}/check-in`, { seated, idsSeen, ...(reason ? { reason } : {}) }), `${p.contactName}: ${seated} seated.`),
    turnAway: (p: HostParty, reason: string) => act(() => post(`/api/bookings/${p.id}/turn-away`, { reason }), `${p.contactName}'s party turned away.`),
    noShow: (p: HostParty) => act(() => post(`/api/bookings/${p.id}/no-show`), `${p.contactName}'s party marked as not coming.`),
    walkIn: (s: HostSession, body: { contactName: string, partySize: number, idsSeen: number, notes?: string }) => act(() => post(`/api/sessions/${s.id}/walk-ins`, body), `${body.contactName}: ${body.partySize} walk-in guest${body.partySize === 1 ? '' : 's'} seated.`),
  }
}
