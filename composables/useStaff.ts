import type { StaffRole } from '#shared/roles'
import type { StaffMember } from '#shared/types/account'

/** The manager's staff list and the actions on it; every change refreshes the list. */
export function useStaff() {
  const list = useFetch<StaffMember[]>('/api/staff', { key: 'staff', default: () => [] })
  const { message, error, run } = useAction()

  // Plain string URLs: the typed route inference of $fetch is too deep for these templates.
  const send = (url: string, options: { method: 'PATCH' | 'POST', body?: Record<string, unknown> }) => $fetch(url, options)
  const act = (action: () => Promise<unknown>, done: string) => run(action, done, () => refreshNuxtData('staff'))

  return {
    ...list,
    message,
    error,
    setRole: (m: StaffMember, role: StaffRole) => act(() => send(`/api/staff/${m.id}`, { method: 'PATCH', body: { role } }), `${m.name} is now ${role}.`),
    setDisabled: (m: StaffMember, disabled: boolean) => act(() => send(`/api/staff/${m.id}`, { method: 'PATCH', body: { disabled } }), disabled ? `${m.name} can no longer sign in.` : `${m.name} can sign in again.`),
    resendInvitation: (m: StaffMember) => act(() => send(`/api/staff/${m.id}/invitation`, { method: 'POST' }), `A new invitation is on its way to ${m.email}.`),
  }
}
