import { describe, expect, it } from 'vitest'
import { formatCalendarDay, formatDay, formatDayTime, formatFromNow, formatStampInZone, formatTime, formatWhen } from '../../shared/dates'

// Expected strings are what Node's ICU data writes for these locales (common practice, no source).
const us = { timeZone: 'America/New_York', locale: 'en-US' }
const uk = { timeZone: 'Europe/London', locale: 'en-GB' }
const now = new Date('2026-12-02T15:00:00Z')

describe('dates in the venue zone and locale', () => {
  it('writes times as the locale does: 12-hour in the US, 24-hour in the UK', () => {
    expect(formatTime('2026-12-05T19:00:00Z', us)).toBe('2:00 PM')
    expect(formatTime('2026-12-05T19:00:00Z', uk)).toBe('19:00')
  })
  it('puts day and month in the locale order, with the year only in another year', () => {
    expect(formatDay('2026-12-05T19:00:00Z', us, now)).toBe('Sat, Dec 5')
    expect(formatDay('2026-12-05T19:00:00Z', uk, now)).toBe('Sat 5 Dec')
    expect(formatDay('2027-01-09T19:00:00Z', us, now)).toBe('Sat, Jan 9, 2027')
    expect(formatDayTime('2027-01-09T19:00:00Z', uk, now)).toBe('Sat, 9 Jan 2027, 19:00')
  })
  it('shifts by the zone, not the server: 02:00 UTC is still the evening before in New York', () => {
    expect(formatDay('2026-12-06T02:00:00Z', us, now)).toBe('Sat, Dec 5')
    expect(formatWhen('2026-12-06T02:00:00Z', us, now)).toBe('Sat, Dec 5, 9:00 PM EST')
  })
  it('never shifts a calendar day', () => {
    expect(formatCalendarDay('2026-12-31', us, now)).toBe('Dec 31')
    expect(formatCalendarDay('2027-01-01', uk, now)).toBe('1 Jan 2027')
  })
  it('says how far away an instant is', () => {
    expect(formatFromNow('2026-12-02T20:00:00Z', us, now)).toBe('in 5 hours')
    expect(formatFromNow('2026-12-05T15:00:00Z', us, now)).toBe('in 3 days')
    expect(formatFromNow('2026-12-02T14:48:00Z', us, now)).toBe('12 minutes ago')
  })
  // US Eastern offsets and the 2026 change dates are the IANA tz database's rules (from memory).
  it('writes a spreadsheet stamp in the zone, with midnight as 00 and each side of a clock change', () => {
    expect(formatStampInZone('2026-11-03T18:00:00Z', 'America/New_York')).toBe('2026-11-03 13:00')
    expect(formatStampInZone('2026-07-01T04:00:00Z', 'America/New_York')).toBe('2026-07-01 00:00')
    expect(formatStampInZone('2026-03-08T07:30:00Z', 'America/New_York')).toBe('2026-03-08 03:30')
    expect(formatStampInZone('2026-11-01T05:59:00Z', 'America/New_York')).toBe('2026-11-01 01:59')
    expect(formatStampInZone('2026-11-01T06:01:00Z', 'America/New_York')).toBe('2026-11-01 01:01')
    expect(formatStampInZone(new Date('2026-12-31T23:30:00Z'), 'Europe/London')).toBe('2026-12-31 23:30')
  })
  it('gives the same text from a formatter made once as from a new one, in every locale and zone asked', () => {
    for (let i = 0; i < 3; i++) {
      expect(formatTime('2026-12-05T19:00:00Z', uk)).toBe('19:00')
      expect(formatTime('2026-12-05T19:00:00Z', us)).toBe('2:00 PM')
    }
  })
})
