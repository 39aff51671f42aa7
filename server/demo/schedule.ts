import { DateTime } from 'luxon'
import { DEMO_SESSION_SERIES } from './data'
import { holidayOn, type Holiday } from './holidays'

/** One session the demo schedules for its published flight. */
export interface PlannedSession {
  startsAt: Date
  /** Index into DEMO_SESSION_SERIES; null for the one session later today. */
  series: number | null
  durationMinutes: number
  seats: number
  priceMinor: number
  bookingCutoffMinutes: number
  /**
   * The holiday the session falls on. Only the session later today may carry one: it is marked as
   * a holiday opening so the host's day has parties from the first start. Weekly sessions skip holidays.
   */
  holiday: Holiday | null
}

/**
 * The demo's sessions from `now`: each weekly series from its next weekday on, leaving out the
 * weeks whose day is a public holiday (server/demo/holidays.ts), and one session later today.
 */
export function planDemoSessions(now: Date, timeZone: string): PlannedSession[] {
  const today = DateTime.fromJSDate(now, { zone: timeZone })
  const planned: PlannedSession[] = []
  DEMO_SESSION_SERIES.forEach((s, series) => {
    const first = today.plus({ days: ((s.weekday - today.weekday + 7) % 7) || 7 })
    for (let week = 0; week < s.weeks; week++) {
      const local = DateTime.fromISO(`${first.plus({ weeks: week }).toISODate()}T${s.startTime}`, { zone: timeZone })
      // A start the clocks skip that night does not exist; the demo leaves it out rather than move it.
      if (!local.isValid || local.toFormat('HH:mm') !== s.startTime) continue
      if (holidayOn(local.toISODate()!)) continue
      planned.push({ startsAt: local.toUTC().toJSDate(), series, durationMinutes: s.durationMinutes, seats: s.seats, priceMinor: s.priceMinor, bookingCutoffMinutes: s.bookingCutoffMinutes, holiday: null })
    }
  })
  // In 90 minutes or so, but not before noon: nobody books a tasting for the small hours.
  const soon = DateTime.max(today.plus({ minutes: 90 }).startOf('hour'), today.set({ hour: 12, minute: 0, second: 0, millisecond: 0 }))
  planned.push({ startsAt: soon.toUTC().toJSDate(), series: null, durationMinutes: 75, seats: 10, priceMinor: 3500, bookingCutoffMinutes: 30, holiday: holidayOn(soon.toISODate()!) })
  return planned.sort((a, b) => a.startsAt.getTime() - b.startsAt.getTime())
}
