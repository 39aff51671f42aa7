/** The days of the week, Monday first (ISO 8601 numbering 1–7). */
export const WEEKDAYS = ['mon', 'tue', 'wed', 'thu', 'fri', 'sat', 'sun'] as const
export type Weekday = (typeof WEEKDAYS)[number]

/** One opening of the day, local times HH:mm (closes after opens). */
export interface OpeningSpan { opens: string, closes: string }

/** Opening hours per weekday: no entry, or an empty list, means closed that day. */
export type OpeningHours = Partial<Record<Weekday, OpeningSpan[]>>
