import { formatDay, formatDayTime, formatDuration, formatLongDay, formatTime, formatWhen, formatZoneName, type VenueClock } from '#shared/dates'

/**
 * Session times for staff and guests alike, always in the venue's zone and locale (shared/dates.ts:
 * the year only when it is not this year; the zone named where a visitor could misread it), and
 * amounts in the venue's currency.
 */
export function useSessionFormat() {
  const { data: venue } = useVenue()
  const base = useVenueFormat()
  const clock = (): VenueClock => ({ timeZone: venue.value?.timeZone ?? 'UTC', locale: venue.value?.locale ?? 'en-US' })
  return {
    money: base.money,
    dateTime: base.dateTime,
    /** "Sat, Dec 5, 6:30 PM EST": an instant with the venue's zone named. */
    when: (iso: string | Date) => formatWhen(iso, clock()),
    /** "Sat, Dec 5" (the year added in another year) */
    day: (iso: string | Date) => formatDay(iso, clock()),
    /** "2:00 PM" or "14:00", as the venue's locale writes it */
    time: (iso: string | Date) => formatTime(iso, clock()),
    /** "Saturday, December 5, 2026" */
    longDay: (iso: string | Date) => formatLongDay(iso, clock()),
    /** "EST" */
    zoneName: (iso: string | Date) => formatZoneName(iso, clock()),
    /** "2 h 15 min" */
    duration: formatDuration,
    /** "Sat, Dec 5, 2:00 PM" */
    dayTime: (iso: string | Date) => formatDayTime(iso, clock()),
  }
}
