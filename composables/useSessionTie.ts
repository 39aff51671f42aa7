/**
 * The card's session (`?s=` on a session card's address) as a query suffix for links between the
 * pour pages, read in the browser after hydration: the server-rendered page is the same for every
 * visitor (it may be cached whole), so the links gain it only once the page runs.
 */
export function useSessionTie() {
  const tie = ref('')
  onMounted(() => {
    const s = Number(useRoute().query.s)
    if (Number.isInteger(s) && s > 0) tie.value = `?s=${s}`
  })
  return tie
}
