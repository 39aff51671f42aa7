/**
 * Session times for guests, always in the venue's zone (named, so a visitor from elsewhere is not
 * misled), and amounts in the venue's currency. Built on useVenueFormat's Intl formatting.
 */
export function useSessionFormat() {
  const { data: venue } = useVenue()
  const base = useVenueFormat()
  const zone = () => venue.value?.timeZone ?? 'UTC'
  const fmt = (iso: string | Date, opts: Intl.DateTimeFormatOptions) => new Intl.DateTimeFormat('en-US', { ...opts, timeZone: zone() }).format(new Date(iso))
  const zoneName = (iso: string | Date) => new Intl.DateTimeFormat('en-US', { timeZone: zone(), timeZoneName: 'short' }).formatToParts(new Date(iso)).find(p => p.type === 'timeZoneName')?.value ?? zone()
  return {
    money: base.money,
    dateTime: base.dateTime,
    /** "Dec 3, 2026, 6:30 PM EST": an instant with the venue's zone named. */
    when: (iso: string | Date) => `${base.dateTime(iso)} ${zoneName(iso)}`,
    /** "Sat, Oct 3" */
    day: (iso: string | Date) => fmt(iso, { weekday: 'short', month: 'short', day: 'numeric' }),
    /** "2:00 PM" */
    time: (iso: string | Date) => fmt(iso, { hour: 'numeric', minute: '2-digit' }),
    /** "Saturday, October 3, 2026" */
    longDay: (iso: string | Date) => fmt(iso, { dateStyle: 'full' }),
    /** "EDT" */
    zoneName,
    /** "2 h 15 min" */
    duration: (minutes: number) => (minutes >= 60 ? `${Math.floor(minutes / 60)} h${minutes % 60 ? ` ${minutes % 60} min` : ''}` : `${minutes} min`),
  }
}
