import { DEFAULT_ROOM_AIR, type CurvePoint, type RoomAir } from '#shared/science/glassModel'

type CurveArgs = [tempC: MaybeRefOrGetter<number>, sugarGL?: MaybeRefOrGetter<number>, room?: MaybeRefOrGetter<RoomAir>]

function curveQuery(tempC: MaybeRefOrGetter<number>, sugarGL: MaybeRefOrGetter<number>, room: MaybeRefOrGetter<RoomAir>) {
  const tenth = (v: number) => String(Math.round(v * 10) / 10)
  return computed(() => {
    const air = toValue(room)
    return { tempC: tenth(toValue(tempC)), sugarGL: String(toValue(sugarGL)), rh: tenth(air.relativeHumidityPct), airTempC: tenth(air.airTempC) }
  })
}
const keyOf = (q: Record<string, string>) => `${q.tempC}-${q.sugarGL}-${q.rh}-${q.airTempC}`

/**
 * The σ and index curve from the server for a liquid temperature and sugar level in a room
 * (relative humidity `rh`, %, and `airTempC`; the model's default room when none is given).
 * `server: false` fetches it in the browser only (the chart draws on a canvas there).
 */
export function useFilmCurve(tempC: MaybeRefOrGetter<number>, sugarGL: MaybeRefOrGetter<number> = 0, room: MaybeRefOrGetter<RoomAir> = DEFAULT_ROOM_AIR, opts: { server?: boolean } = {}) {
  const query = curveQuery(tempC, sugarGL, room)
  return useFetch<CurvePoint[]>('/api/science/curve', { key: computed(() => `curve-${keyOf(query.value)}`), query, default: () => [], server: opts.server ?? true })
}

/**
 * The same curve's reading (utils/filmCurve.ts): the few points its text names, all a page needs
 * to render the text on the server; the curve itself stays out of the page's payload.
 */
export function useFilmCurveReading(...[tempC, sugarGL = 0, room = DEFAULT_ROOM_AIR]: CurveArgs) {
  const query = curveQuery(tempC, sugarGL, room)
  return useFetch('/api/science/curve', {
    key: computed(() => `curve-reading-${keyOf(query.value)}`),
    query,
    transform: (curve: CurvePoint[]) => filmCurveReading(curve),
    default: () => null,
  })
}
