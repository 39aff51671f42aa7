/** The days of the week, Monday first (ISO 8601 numbering 1–7). */
export const WEEKDAYS = ['mon', 'tue', 'wed', 'thu', 'fri', 'sat', 'sun'] as const
export type Weekday = (typeof WEEKDAYS)[number]

/** One opening of the day, local times HH:mm (closes after opens). */
export interface OpeningSpan { opens: string, closes: string }

/** Opening hours per weekday: no entry, or an empty list, means closed that day. */
export type OpeningHours = Partial<Record<Weekday, OpeningSpan[]>>

/** "12:00" as the locale writes a time of day ("12:00 PM", "12:00"). */
function localTime(hhmm: string, locale: string): string {
  return new Intl.DateTimeFormat(locale, { timeZone: 'UTC', hour: 'numeric', minute: '2-digit' }).format(new Date(`2026-01-05T${hhmm}:00Z`))
}

/** One line per weekday the venue opens, Monday first: { day: "Thu", hours: "12:00 PM – 7:00 PM" }. */
export function openingHoursLines(hours: OpeningHours | null | undefined, locale: string): { day: string, hours: string }[] {
  if (!hours) return []
  // 2026-01-05 is a Monday: its week gives the locale's weekday names in ISO order.
  return WEEKDAYS.flatMap((d, i) => {
    const spans = hours[d] ?? []
    if (!spans.length) return []
    const day = new Intl.DateTimeFormat(locale, { timeZone: 'UTC', weekday: 'short' }).format(new Date(Date.UTC(2026, 0, 5 + i)))
    return [{ day, hours: spans.map(s => `${localTime(s.opens, locale)} – ${localTime(s.closes, locale)}`).join(', ') }]
  })
}

/**
 * A phone number as a tel: link: digits and a leading +. After a country code, the "(0)" that
 * marks a trunk prefix dialled only from inside the country is left out ("+44 (0)20 7946 0321" →
 * "tel:+442079460321"; ITU-T E.123 keeps it out of the international form, from memory).
 */
export function phoneHref(phone: string): string {
  const international = phone.trim().startsWith('+')
  return `tel:${(international ? phone.replace(/\(0\)/g, '') : phone).replace(/[^\d+]/g, '')}`
}
