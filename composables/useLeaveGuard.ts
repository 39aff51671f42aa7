/**
 * Asks before work is lost: while `dirty()` is true, leaving for another page of the app asks to
 * confirm, and closing or reloading the tab makes the browser warn (it shows its own words there).
 */
export function useLeaveGuard(dirty: () => boolean, question: string) {
  const stay = () => dirty() && !window.confirm(question)
  onBeforeRouteLeave(() => !stay())
  // Another flight in the same page (/manage/flights/1 → /2) is an update of the route, not a leave.
  onBeforeRouteUpdate((to, from) => to.path === from.path || !stay())
  function warn(event: BeforeUnloadEvent) {
    if (!dirty()) return
    event.preventDefault()
    // Older browsers show the prompt only when returnValue is set.
    event.returnValue = ''
  }
  onMounted(() => window.addEventListener('beforeunload', warn))
  onBeforeUnmount(() => window.removeEventListener('beforeunload', warn))
}
