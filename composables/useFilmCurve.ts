import { DEFAULT_ROOM_AIR, type CurvePoint, type RoomAir } from '#shared/science/glassModel'

/**
 * The σ and index curve from the server for a liquid temperature and sugar level in a room
 * (relative humidity `rh`, %, and `airTempC`; the model's default room when none is given).
 */
export function useFilmCurve(tempC: MaybeRefOrGetter<number>, sugarGL: MaybeRefOrGetter<number> = 0, room: MaybeRefOrGetter<RoomAir> = DEFAULT_ROOM_AIR) {
  const tenth = (v: number) => String(Math.round(v * 10) / 10)
  const query = computed(() => {
    const air = toValue(room)
    return { tempC: tenth(toValue(tempC)), sugarGL: String(toValue(sugarGL)), rh: tenth(air.relativeHumidityPct), airTempC: tenth(air.airTempC) }
  })
  return useFetch<CurvePoint[]>('/api/science/curve', {
    key: computed(() => `curve-${query.value.tempC}-${query.value.sugarGL}-${query.value.rh}-${query.value.airTempC}`),
    query,
    default: () => [],
  })
}
