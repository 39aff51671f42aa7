import type { HostDay, HostParty, HostSession } from '#shared/types/host'

/** The host's day for a venue-local date, and every door action on it (each refreshes the day). */
export function useHostDay(date: Ref<string>) {
  const day = useFetch<HostDay>(() => `/api/days/${encodeURIComponent(date.value)}`, { key: 'host-day' })
  const { busy, message, error, run } = useAction()
  // Plain string URLs: the typed route inference of $fetch is too deep for these templates.
  const post = (url: string, body?: Record<string, unknown>) => $fetch(url, { method: 'POST', body })
  const act = async (fn: () => Promise<unknown>, done: string) => (await run(fn, done, () => day.refresh())) !== null

  return {
    day: day.data,
    pending: day.pending,
    message,
    error,
    busy,
    refresh: day.refresh,
    checkIn: (p: HostParty, seated: number, idsSeen: number, reason?: string) => act(() => post(`/api/bookings/${p.id}/check-in`, { seated, idsSeen, ...(reason ? { reason } : {}) }), `${p.contactName}: ${seated} seated.`),
    turnAway: (p: HostParty, reason: string) => act(() => post(`/api/bookings/${p.id}/turn-away`, { reason }), `${p.contactName}'s party turned away. You can undo this on their row until the session ends.`),
    noShow: (p: HostParty) => act(() => post(`/api/bookings/${p.id}/no-show`), `${p.contactName}'s party marked as not coming. You can undo this on their row until the session ends.`),
    undo: (p: HostParty, reason?: string) => act(() => post(`/api/bookings/${p.id}/undo-door`, reason ? { reason } : {}), `${p.contactName}'s party is back on the list to come.`),
    walkIn: (s: HostSession, body: { contactName: string, partySize: number, idsSeen: number, notes?: string }) => act(() => post(`/api/sessions/${s.id}/walk-ins`, body), `${body.contactName}: ${body.partySize} walk-in guest${body.partySize === 1 ? '' : 's'} seated.`),
  }
}
