/**
 * Dates and times, formatted in one place for staff and guest pages, e-mails and cards alike: in
 * the venue's IANA zone and its locale (en-US "Sat, Oct 3, 2:00 PM"; en-GB "Sat 3 Oct, 14:00"),
 * with the year only when it is not the current year in that zone. Instants are ISO strings or
 * Dates in UTC; calendar days are YYYY-MM-DD and are never shifted by a zone.
 */

/** Where and how a venue writes its times. */
export interface VenueClock { timeZone: string, locale: string }

const formatters = new Map<string, Intl.DateTimeFormat>()
/**
 * One Intl.DateTimeFormat per locale and options, made once: making one costs about thirty times
 * what a format with it costs (~60 µs against ~2 µs on Node.js 20), and a report or a card writes
 * thousands of dates. Bounded: emptied past 1,000 kinds.
 */
function dtf(locale: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale}|${JSON.stringify(options)}`
  let f = formatters.get(key)
  if (!f) {
    if (formatters.size >= 1000) formatters.clear()
    f = new Intl.DateTimeFormat(locale, options)
    formatters.set(key, f)
  }
  return f
}

const year = (d: Date, timeZone: string) => dtf('en', { timeZone, year: 'numeric' }).format(d)
const toDate = (instant: string | Date) => (instant instanceof Date ? instant : new Date(instant))

/** Whether the instant falls in another calendar year than `now`, in the venue's zone. */
function otherYear(d: Date, clock: VenueClock, now: Date): boolean {
  return year(d, clock.timeZone) !== year(now, clock.timeZone)
}

/** "Sat, Oct 3" (or "Sat, Oct 3, 2027" in another year), in the venue's zone. */
export function formatDay(instant: string | Date, clock: VenueClock, now = new Date()): string {
  const d = toDate(instant)
  return dtf(clock.locale, { timeZone: clock.timeZone, weekday: 'short', month: 'short', day: 'numeric', ...(otherYear(d, clock, now) ? { year: 'numeric' } : {}) }).format(d)
}

/** "Sat, Oct 3, 2026": short, always with the year (a card a guest keeps). */
export function formatShortDayWithYear(instant: string | Date, clock: VenueClock): string {
  return dtf(clock.locale, { timeZone: clock.timeZone, weekday: 'short', month: 'short', day: 'numeric', year: 'numeric' }).format(toDate(instant))
}

/** "Saturday, October 3, 2026": always with the year (confirmations). */
export function formatLongDay(instant: string | Date, clock: VenueClock): string {
  return dtf(clock.locale, { timeZone: clock.timeZone, dateStyle: 'full' }).format(toDate(instant))
}

/** "2:00 PM" or "14:00", as the venue's locale writes it. */
export function formatTime(instant: string | Date, clock: VenueClock): string {
  return dtf(clock.locale, { timeZone: clock.timeZone, hour: 'numeric', minute: '2-digit' }).format(toDate(instant))
}

/** "Sat, Oct 3, 2:00 PM" (the year added in another year). */
export function formatDayTime(instant: string | Date, clock: VenueClock, now = new Date()): string {
  return `${formatDay(instant, clock, now)}, ${formatTime(instant, clock)}`
}

/** The zone's short name at that instant: "EDT", "GMT+1". */
export function formatZoneName(instant: string | Date, clock: VenueClock): string {
  return dtf(clock.locale, { timeZone: clock.timeZone, timeZoneName: 'short' }).formatToParts(toDate(instant)).find(p => p.type === 'timeZoneName')?.value ?? clock.timeZone
}

/** "Sat, Oct 3, 2:00 PM EDT": an instant a visitor from elsewhere cannot misread. */
export function formatWhen(instant: string | Date, clock: VenueClock, now = new Date()): string {
  return `${formatDayTime(instant, clock, now)} ${formatZoneName(instant, clock)}`
}

/** A calendar day YYYY-MM-DD as "Oct 3" (with the year in another year); no zone can shift it. */
export function formatCalendarDay(day: string, clock: VenueClock, now = new Date()): string {
  const d = new Date(`${day}T12:00:00Z`)
  const other = day.slice(0, 4) !== year(now, clock.timeZone)
  return dtf(clock.locale, { timeZone: 'UTC', month: 'short', day: 'numeric', ...(other ? { year: 'numeric' } : {}) }).format(d)
}

/** "2 h 15 min", "45 min". */
export function formatDuration(minutes: number): string {
  return minutes >= 60 ? `${Math.floor(minutes / 60)} h${minutes % 60 ? ` ${minutes % 60} min` : ''}` : `${minutes} min`
}

/** "in 5 hours", "in 3 days", "12 minutes ago": how far an instant is from now, in words. */
export function formatFromNow(instant: string | Date, clock: VenueClock, now = new Date()): string {
  const ms = toDate(instant).getTime() - now.getTime()
  const abs = Math.abs(ms)
  const [value, unit]: [number, Intl.RelativeTimeFormatUnit] = abs < 3_600_000
    ? [Math.round(ms / 60_000), 'minute']
    : abs < 48 * 3_600_000 ? [Math.round(ms / 3_600_000), 'hour'] : [Math.round(ms / 86_400_000), 'day']
  return new Intl.RelativeTimeFormat(clock.locale, { numeric: 'always' }).format(value, unit)
}

/**
 * An instant as ISO 8601 local time with the zone's offset at that instant, to the second:
 * "2026-12-05T14:00:00-05:00" (what schema.org's startDate asks for). Across a daylight-saving
 * change each instant keeps its own offset.
 */
export function formatIsoInZone(instant: string | Date, timeZone: string): string {
  const d = toDate(instant)
  const parts = Object.fromEntries(dtf('en-US', {
    timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit', timeZoneName: 'longOffset',
  }).formatToParts(d).map(p => [p.type, p.value]))
  // "GMT-05:00", or "GMT" when the offset is zero.
  const offset = (parts.timeZoneName ?? 'GMT').replace(/^GMT/, '') || '+00:00'
  return `${parts.year}-${parts.month}-${parts.day}T${parts.hour}:${parts.minute}:${parts.second}${offset}`
}

/** An instant as a spreadsheet reads local time, to the minute: "2026-11-03 18:00" in the zone. */
export function formatStampInZone(instant: string | Date, timeZone: string): string {
  const parts = Object.fromEntries(dtf('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' })
    .formatToParts(toDate(instant)).map(p => [p.type, p.value]))
  return `${parts.year}-${parts.month}-${parts.day} ${parts.hour}:${parts.minute}`
}
