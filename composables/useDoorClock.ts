import type { VenueClock } from '#shared/dates'

/** The venue's zone and locale, for the door's times (formatted by shared/dates.ts). */
export function useDoorClock(): ComputedRef<VenueClock> {
  const { data: venue } = useVenue()
  return computed(() => ({ timeZone: venue.value?.timeZone ?? 'UTC', locale: venue.value?.locale ?? 'en-US' }))
}
