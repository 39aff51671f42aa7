import type { PublicVenue } from '#shared/types/venue'
import { formatMoney } from '#shared/money'
import { formatCalendarDay, formatDay, formatDayTime, formatDuration, formatLongDay, formatTime, formatWhen, formatZoneName, type VenueClock } from '#shared/dates'

/** The venue's settings, fetched once per page load and shared by every component. */
export function useVenue() {
  return useFetch<PublicVenue>('/api/venue', { key: 'venue', dedupe: 'defer' })
}

/**
 * Formats instants in the venue's zone and locale (shared/dates.ts) and money in its currency, so
 * every page writes "Sat, Oct 3, 2:00 PM" the way the venue does, whatever the browser's zone.
 */
export function useVenueFormat() {
  const { data: venue } = useVenue()
  const clock = computed<VenueClock>(() => ({ timeZone: venue.value?.timeZone ?? 'UTC', locale: venue.value?.locale ?? 'en-US' }))
  return {
    clock,
    /** "Sat, Oct 3, 2:00 PM" (as dayTime) */
    dateTime: (instant: string | Date) => formatDayTime(instant, clock.value),
    money(minor: number) {
      return formatMoney(minor, venue.value?.currency ?? 'USD', clock.value.locale)
    },
    /** "Sat, Oct 3" */
    day: (instant: string | Date, now?: Date) => formatDay(instant, clock.value, now),
    /** "2:00 PM" or "14:00" */
    time: (instant: string | Date) => formatTime(instant, clock.value),
    /** "Sat, Oct 3, 2:00 PM" */
    dayTime: (instant: string | Date, now?: Date) => formatDayTime(instant, clock.value, now),
    /** "Sat, Oct 3, 2:00 PM EDT" */
    when: (instant: string | Date, now?: Date) => formatWhen(instant, clock.value, now),
    /** "Saturday, October 3, 2026" */
    longDay: (instant: string | Date) => formatLongDay(instant, clock.value),
    /** A calendar day YYYY-MM-DD: "Oct 3" */
    calendarDay: (day: string, now?: Date) => formatCalendarDay(day, clock.value, now),
    /** The zone's short name at that instant: "EST" */
    zoneName: (instant: string | Date) => formatZoneName(instant, clock.value),
    duration: formatDuration,
  }
}

/** The venue's temperature unit for forms that read a thermometer: 'c' or 'f', and its sign. */
export function useTemperatureUnit() {
  const { data: venue } = useVenue()
  const unit = computed(() => venue.value?.temperatureUnit ?? 'c')
  const sign = computed(() => (unit.value === 'f' ? '°F' : '°C'))
  return { unit, sign }
}
