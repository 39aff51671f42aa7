/**
 * The current time, one value for the server's render and the browser's hydration (so the two
 * agree on "14 minutes left"), then ticking in the browser.
 */
export function useNow(everyMs = 15_000) {
  const now = useState('now', () => Date.now())
  let timer: ReturnType<typeof setInterval> | undefined
  onMounted(() => {
    now.value = Date.now()
    timer = setInterval(() => { now.value = Date.now() }, everyMs)
  })
  onBeforeUnmount(() => clearInterval(timer))
  return now
}
