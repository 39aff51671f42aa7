import { defineStore } from 'pinia'
import type { Role } from '#shared/roles'

/** The signed-in person and the actions that change who that is. */
export const useAccountStore = defineStore('account', () => {
  const session = useUserSession()
  const user = computed(() => session.user.value ?? null)
  const role = computed<Role | null>(() => user.value?.role ?? null)
  const isStaff = computed(() => role.value !== null && role.value !== 'guest')

  /** Where each role starts after signing in. */
  function homeFor(r: Role | null): string {
    if (r === 'manager') return '/manage'
    if (r === 'host') return '/host'
    if (r === 'marketing') return '/manage/content'
    return '/account'
  }

  async function afterAuth(redirect?: string) {
    await session.fetch()
    await navigateTo(redirect && redirect.startsWith('/') && !redirect.startsWith('//') ? redirect : homeFor(role.value))
  }

  async function signOut() {
    await session.clear()
    await navigateTo('/signin')
  }

  return { user, role, isStaff, homeFor, afterAuth, signOut }
})
