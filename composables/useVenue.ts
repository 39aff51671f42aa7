export interface PublicVenue {
  id: number
  name: string
  address: string
  timeZone: string
  currency: string
  legalAge: number
  volumeUnit: 'ml' | 'floz'
  temperatureUnit: 'c' | 'f'
  standardDrinkKind: 'us' | 'uk' | 'au' | 'custom'
  standardDrinkGrams: number
  guestEthanolLimitGrams: number
  cancellationCutoffHours: number
  cautions: string
}

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
      const currency = venue.value?.currency ?? 'USD'
      const digits = new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2
      return new Intl.NumberFormat('en-US', { style: 'currency', currency }).format(minor / 10 ** digits)
    },
  }
}
