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

  const RETURN_KEY = 'larmoir-return-to'
  const isLocalPath = (p?: string | null): p is string => Boolean(p && p.startsWith('/') && !p.startsWith('//'))

  async function afterAuth(redirect?: string) {
    await session.fetch()
    await navigateTo(isLocalPath(redirect) ? redirect : homeFor(role.value))
  }

  /** Where a new guest was heading when they signed up; the address-check link brings them back there (same browser). */
  function rememberReturn(redirect?: string) {
    if (isLocalPath(redirect)) localStorage.setItem(RETURN_KEY, redirect)
    else localStorage.removeItem(RETURN_KEY)
  }

  function takeReturn(): string | undefined {
    const to = localStorage.getItem(RETURN_KEY)
    localStorage.removeItem(RETURN_KEY)
    return isLocalPath(to) ? to : undefined
  }

  /** Signs out this device; `everywhere` ends the account's sign-ins on every device. */
  async function signOut(everywhere = false) {
    await $fetch(everywhere ? '/api/auth/signout-everywhere' : '/api/auth/signout', { method: 'POST' })
    await session.fetch()
    await navigateTo('/signin')
  }

  return { user, role, isStaff, homeFor, afterAuth, rememberReturn, takeReturn, signOut }
})
