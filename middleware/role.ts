/**
 * Keeps pages from people who cannot use them: sign in first, then the page's `roles` meta.
 * It only hides pages; every API route checks the role again on the server.
 */
export default defineNuxtRouteMiddleware(async (to) => {
  const { loggedIn, user } = useUserSession()
  if (!loggedIn.value) return navigateTo({ path: '/signin', query: { redirect: to.fullPath } })
  const roles = to.meta.roles
  if (roles && user.value && !roles.includes(user.value.role)) {
    throw createError({ statusCode: 403, statusMessage: 'This page is for other staff roles.', fatal: true })
  }
})
