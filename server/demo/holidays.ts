/**
 * The public holidays of the demo venue's country (the United States), so the demo's sessions stay
 * off them. Source: the legal public holidays of 5 U.S.C. § 6103(a), with the day they are observed
 * when they fall on a weekend (Saturday → the Friday before, Sunday → the Monday after), as the U.S.
 * Office of Personnel Management publishes them each year (from memory). A state's own holidays
 * are left out. Pure: calendar days only, no time zone can shift them.
 */

export interface Holiday {
  /** YYYY-MM-DD */
  date: string
  name: string
}

const pad = (n: number) => String(n).padStart(2, '0')
const day = (y: number, m: number, d: number) => `${y}-${pad(m)}-${pad(d)}`
/** 0 = Sunday … 6 = Saturday */
const weekday = (y: number, m: number, d: number) => new Date(Date.UTC(y, m - 1, d)).getUTCDay()
const daysIn = (y: number, m: number) => new Date(Date.UTC(y, m, 0)).getUTCDate()

/** The n-th (1-based) given weekday of a month; n = -1 is the last one. */
function nthWeekday(y: number, m: number, wd: number, n: number): string {
  if (n > 0) {
    const first = weekday(y, m, 1)
    return day(y, m, 1 + ((wd - first + 7) % 7) + (n - 1) * 7)
  }
  const lastDay = daysIn(y, m)
  return day(y, m, lastDay - ((weekday(y, m, lastDay) - wd + 7) % 7))
}

/** A fixed-date holiday, and its observed weekday when it falls on a weekend. */
function fixed(y: number, m: number, d: number, name: string): Holiday[] {
  const wd = weekday(y, m, d)
  const out: Holiday[] = [{ date: day(y, m, d), name }]
  if (wd === 6 || wd === 0) {
    const observed = new Date(Date.UTC(y, m - 1, d + (wd === 6 ? -1 : 1)))
    out.push({ date: observed.toISOString().slice(0, 10), name: `${name} (observed)` })
  }
  return out
}

/** Every federal holiday of a year, with its observed day where that differs, in date order. */
export function usFederalHolidays(year: number): Holiday[] {
  return [
    ...fixed(year, 1, 1, 'New Year\'s Day'),
    { date: nthWeekday(year, 1, 1, 3), name: 'Birthday of Martin Luther King, Jr.' },
    { date: nthWeekday(year, 2, 1, 3), name: 'Washington\'s Birthday' },
    { date: nthWeekday(year, 5, 1, -1), name: 'Memorial Day' },
    ...fixed(year, 6, 19, 'Juneteenth National Independence Day'),
    ...fixed(year, 7, 4, 'Independence Day'),
    { date: nthWeekday(year, 9, 1, 1), name: 'Labor Day' },
    { date: nthWeekday(year, 10, 1, 2), name: 'Columbus Day' },
    ...fixed(year, 11, 11, 'Veterans Day'),
    { date: nthWeekday(year, 11, 4, 4), name: 'Thanksgiving Day' },
    ...fixed(year, 12, 25, 'Christmas Day'),
  ].sort((a, b) => a.date.localeCompare(b.date))
}

/** The holiday on a calendar day (YYYY-MM-DD), or null. A New Year's Day on a Saturday is observed on the last day of the year before. */
export function holidayOn(date: string): Holiday | null {
  const y = Number(date.slice(0, 4))
  return [...usFederalHolidays(y), ...usFederalHolidays(y + 1)].find(h => h.date === date) ?? null
}
