import type { PublicVenue } from '#shared/types/venue'
import { formatMoney } from '#shared/money'
import { formatDayTime } from '#shared/dates'

/** The venue's settings, fetched once per page load and shared by every component. */
export function useVenue() {
  return useFetch<PublicVenue>('/api/venue', { key: 'venue', dedupe: 'defer' })
}

/** Formats instants in the venue's zone and locale and money in its currency. */
export function useVenueFormat() {
  const { data: venue } = useVenue()
  return {
    /** "Sat, Dec 5, 2:00 PM" in the venue's zone and locale (shared/dates.ts). */
    dateTime(instant: string | Date) {
      return formatDayTime(instant, { timeZone: venue.value?.timeZone ?? 'UTC', locale: venue.value?.locale ?? 'en-US' })
    },
    money(minor: number) {
      return formatMoney(minor, venue.value?.currency ?? 'USD', venue.value?.locale ?? 'en-US')
    },
  }
}
