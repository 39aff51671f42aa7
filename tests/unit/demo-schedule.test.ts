import { describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { holidayOn, usFederalHolidays } from '../../server/demo/holidays'
import { planDemoSessions } from '../../server/demo/schedule'
import { DEMO_PRODUCTS, DEMO_FLIGHTS, DEMO_VENUE } from '../../server/demo/data'
import { DEMO_INTROS, DEMO_NOTES, DEMO_PHOTO_ALT } from '../../server/demo/content'
import { DRAWN_PRODUCTS, productPicture, roomPicture } from '../../server/demo/pictures'

describe('the demo venue\'s public holidays', () => {
  it('are the federal holidays of 2026 with their observed days', () => {
    // The U.S. Office of Personnel Management's federal holidays for 2026 (from memory): Independence
    // Day falls on a Saturday and is observed on Friday, July 3.
    expect(usFederalHolidays(2026).map(h => h.date)).toEqual([
      '2026-01-01', '2026-01-19', '2026-02-16', '2026-05-25', '2026-06-19', '2026-07-03', '2026-07-04',
      '2026-09-07', '2026-10-12', '2026-11-11', '2026-11-26', '2026-12-25',
    ])
  })
  it('move a Sunday holiday to the Monday and a Saturday New Year\'s Day to the Friday before it', () => {
    // 5 U.S.C. 6103(b) and Executive Order 11582 (from memory): Christmas 2022 was a Sunday,
    // observed Monday, Dec 26; New Year's Day 2028 is a Saturday, observed Friday, Dec 31, 2027.
    expect(holidayOn('2022-12-26')?.name).toBe('Christmas Day (observed)')
    expect(holidayOn('2027-12-31')?.name).toBe('New Year\'s Day (observed)')
    expect(holidayOn('2026-11-26')?.name).toBe('Thanksgiving Day')
    expect(holidayOn('2026-11-27')).toBeNull()
  })
})

describe('the demo\'s sessions', () => {
  it('put no weekly session on a holiday, from any day the demo might be loaded on', () => {
    const zone = DEMO_VENUE.timeZone
    let skippedSomething = false
    for (let day = DateTime.fromISO('2026-01-01T10:00', { zone }); day.year < 2029; day = day.plus({ days: 1 })) {
      const plan = planDemoSessions(day.toJSDate(), zone)
      for (const s of plan) {
        const local = DateTime.fromJSDate(s.startsAt, { zone }).toISODate()!
        const holiday = holidayOn(local)
        if (s.series !== null) expect(holiday, `${day.toISODate()}: a weekly session on ${local}`).toBeNull()
        // Only the session later today may fall on one, and it says so.
        else expect(s.holiday).toEqual(holiday)
      }
      if (plan.filter(s => s.series !== null).length < 12) skippedSomething = true
    }
    expect(skippedSomething, 'some week fell on a holiday and was left out').toBe(true)
  }, 60_000) // three years of days; slow when the machine is busy, not a speed check
  it('loaded on Wednesday, Dec 2, 2026, leaves out Christmas Day and keeps the rest', () => {
    const plan = planDemoSessions(new Date('2026-12-02T15:00:00Z'), DEMO_VENUE.timeZone)
    const days = plan.map(s => DateTime.fromJSDate(s.startsAt, { zone: DEMO_VENUE.timeZone }).toISODate())
    expect(days).not.toContain('2026-12-25')
    expect(days).toContain('2026-12-18')
    expect(days).toContain('2026-12-26')
    expect(plan.filter(s => s.series === null)).toHaveLength(1)
  })
})

describe('the demo\'s content', () => {
  it('gives every product a note and a drawn photo with a description, and every flight an introduction', () => {
    for (const p of DEMO_PRODUCTS) {
      expect(DEMO_NOTES[p.code]?.length, p.code).toBeGreaterThan(20)
      expect(DRAWN_PRODUCTS, p.code).toContain(p.code)
      expect(DEMO_PHOTO_ALT.products[p.code]?.length, p.code).toBeGreaterThan(20)
      expect(productPicture(p.code)).toMatch(/^<svg [^>]*width="800" height="1000"/)
    }
    for (const f of DEMO_FLIGHTS) expect(DEMO_INTROS[f.name]?.length, f.name).toBeGreaterThan(20)
    expect(roomPicture()).not.toMatch(/<image|href=/) // drawn here, nothing fetched
  })
})
