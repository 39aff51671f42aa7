import type { CurvePoint } from '#shared/science'

/** The σ and index curve from the server for a temperature and sugar level. */
export function useFilmCurve(tempC: MaybeRefOrGetter<number>, sugarGL: MaybeRefOrGetter<number> = 0) {
  return useFetch<CurvePoint[]>('/api/science/curve', {
    key: computed(() => `curve-${toValue(tempC)}-${toValue(sugarGL)}`),
    query: computed(() => ({ tempC: String(Math.round(toValue(tempC) * 10) / 10), sugarGL: String(toValue(sugarGL)) })),
    default: () => [],
  })
}
