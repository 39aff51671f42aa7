type FilterText = Record<'productId' | 'glassId' | 'flightId' | 'from' | 'to' | 'source' | 'demo', string>
const KEYS: (keyof FilterText)[] = ['productId', 'glassId', 'flightId', 'from', 'to', 'source', 'demo']

/**
 * The manager's observation filters, kept in the page's address (so a filtered view can be shared
 * and the CSV link matches it), the summary they select, and the venue's calibration switch.
 */
export function useObservationAnalysis() {
  const route = useRoute()
  const query = computed(() => Object.fromEntries(KEYS.flatMap(k => (typeof route.query[k] === 'string' && route.query[k] ? [[k, route.query[k]]] : []))) as Partial<FilterText>)
  const form = reactive<FilterText>({ productId: '', glassId: '', flightId: '', from: '', to: '', source: '', demo: 'include', ...query.value })
  function apply() {
    navigateTo({ query: Object.fromEntries(KEYS.flatMap(k => (form[k] && !(k === 'demo' && form[k] === 'include') ? [[k, form[k]]] : []))) })
  }
  const csvHref = computed(() => `/api/observations/export.csv?${new URLSearchParams(query.value as Record<string, string>)}`)

  const toggle = useAction()
  async function setCalibration(enabled: boolean) {
    await toggle.run(
      () => $fetch<{ enabled: boolean }>('/api/venue/calibration', { method: 'PATCH', body: { enabled } }),
      a => (a.enabled ? 'Calibration is on: cards and pour pages use the tuned figures where a glass has enough readings.' : 'Calibration is off: cards and pour pages show the published defaults.'),
      () => refreshNuxtData('manage-observations'),
    )
  }
  return { query, form, apply, csvHref, toggle, setCalibration }
}
