import type { SessionRow } from '#shared/types/sessions'

/** Upcoming sessions in a range of venue-local dates, and the manager's changes to them. */
export function useSessions(range: Ref<{ from: string, to: string }>) {
  const list = useFetch<SessionRow[]>('/api/sessions', { key: 'sessions', query: range, default: () => [] })
  const { message, error, run } = useAction()
  const patch = (s: SessionRow, body: Record<string, unknown>, done: string) => run(
    () => $fetch(`/api/sessions/${s.id}`, { method: 'PATCH', body }),
    done,
    () => refreshNuxtData('sessions'),
  )
  return { ...list, message, error, patch }
}
