import type { StaffRole } from '#shared/roles'

export interface StaffMember {
  id: number
  name: string
  email: string
  role: StaffRole
  disabled: boolean
  invitationPending: boolean
  createdAt: string
}

/** The manager's staff list and the actions on it; every change refreshes the list. */
export function useStaff() {
  const list = useFetch<StaffMember[]>('/api/staff', { key: 'staff', default: () => [] })
  const message = ref('')
  const error = ref('')

  // Plain string URLs: the typed route inference of $fetch is too deep for these templates.
  const send = (url: string, options: { method: 'PATCH' | 'POST', body?: Record<string, unknown> }) => $fetch(url, options)

  async function run(action: () => Promise<unknown>, done: string) {
    message.value = ''
    error.value = ''
    try {
      await action()
      message.value = done
      await refreshNuxtData('staff')
    }
    catch (err) {
      error.value = readServerError(err).message
    }
  }

  return {
    ...list,
    message,
    error,
    setRole: (m: StaffMember, role: StaffRole) => run(() => send(`/api/staff/${m.id}`, { method: 'PATCH', body: { role } }), `${m.name} is now ${role}.`),
    setDisabled: (m: StaffMember, disabled: boolean) => run(() => send(`/api/staff/${m.id}`, { method: 'PATCH', body: { disabled } }), disabled ? `${m.name} can no longer sign in.` : `${m.name} can sign in again.`),
    resendInvitation: (m: StaffMember) => run(() => send(`/api/staff/${m.id}/invitation`, { method: 'POST' }), `A new invitation is on its way to ${m.email}.`),
  }
}
