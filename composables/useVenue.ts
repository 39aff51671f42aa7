import type { PublicVenue } from '#shared/types/venue'
import { formatMoney } from '#shared/money'

/** The venue's settings, fetched once per page load and shared by every component. */
export function useVenue() {
  return useFetch<PublicVenue>('/api/venue', { key: 'venue', dedupe: 'defer' })
}

/** Formats instants in the venue's zone and money in its currency, with the platform's Intl. */
export function useVenueFormat() {
  const { data: venue } = useVenue()
  return {
    dateTime(instant: string | Date) {
      return new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short', timeZone: venue.value?.timeZone ?? 'UTC' }).format(new Date(instant))
    },
    money(minor: number) {
      return formatMoney(minor, venue.value?.currency ?? 'USD')
    },
  }
}
