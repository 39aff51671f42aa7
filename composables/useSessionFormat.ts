/**
 * Session times for staff and guests alike: the venue's formats (useVenueFormat, shared/dates.ts),
 * always in its zone and locale, the year only when it is not this year.
 */
export function useSessionFormat() {
  return useVenueFormat()
}
