import { describe, expect, it } from 'vitest'
import { BOOKING_STATES, type BookingState } from '../../shared/bookings'
import { addSeatCounts, countSeats, doorTiles, seatFactOf, type SeatBreakdown, type SeatFact } from '../../shared/seats'

const fact = (over: Partial<SeatFact> & { state: BookingState }): SeatFact => ({ partySize: 2, holdLive: false, outcome: null, seated: 0, walkIn: false, ...over })
const none: SeatBreakdown = { held: 0, confirmed: 0, seated: 0, notSeated: 0, didNotCome: 0, turnedAway: 0, walkIns: 0 }

describe('the seat rule, one booking at a time', () => {
  // [what, fact, seats taken, the part of the breakdown it lands in]
  const cases: [string, SeatFact, number, Partial<SeatBreakdown>][] = [
    ['a hold that still lasts', fact({ state: 'held', partySize: 3, holdLive: true }), 3, { held: 3 }],
    ['a hold whose time ran out (not swept yet)', fact({ state: 'held', partySize: 3, holdLive: false }), 0, {}],
    ['a confirmed party still to come', fact({ state: 'confirmed', partySize: 4 }), 4, { confirmed: 4 }],
    ['a party seated in full', fact({ state: 'checked_in', partySize: 4, outcome: 'arrived', seated: 4 }), 4, { seated: 4 }],
    ['a partly seated party keeps all its seats', fact({ state: 'checked_in', partySize: 4, outcome: 'arrived', seated: 3 }), 4, { seated: 3, notSeated: 1 }],
    ['a party with nobody seated yet keeps its seats', fact({ state: 'checked_in', partySize: 2, outcome: 'arrived', seated: 0 }), 2, { notSeated: 2 }],
    ['a checked-in booking without a door record counts as seated', fact({ state: 'checked_in', partySize: 2 }), 2, { seated: 2 }],
    ['a walk-in party', fact({ state: 'checked_in', partySize: 2, outcome: 'arrived', seated: 2, walkIn: true }), 2, { walkIns: 2 }],
    ['a party that did not come', fact({ state: 'no_show', partySize: 3, outcome: 'no_show' }), 0, { didNotCome: 3 }],
    ['a party turned away at the door (stored as no-show with outcome turned away)', fact({ state: 'no_show', partySize: 2, outcome: 'turned_away' }), 0, { turnedAway: 2 }],
    ['cancelled', fact({ state: 'cancelled', partySize: 5 }), 0, {}],
    ['refunded', fact({ state: 'refunded', partySize: 5 }), 0, {}],
    ['expired', fact({ state: 'expired', partySize: 5, holdLive: true }), 0, {}],
    ['a confirmed booking ignores a live-hold flag', fact({ state: 'confirmed', partySize: 1, holdLive: false }), 1, { confirmed: 1 }],
  ]

  it.each(cases)('%s', (_what, f, taken, part) => {
    const c = countSeats(10, [f])
    expect(c.seatsTaken).toBe(taken)
    expect(c.seatsLeft).toBe(10 - taken)
    expect(c.breakdown).toEqual({ ...none, ...part })
  })

  it('names every booking state', () => {
    for (const state of BOOKING_STATES) expect(() => countSeats(8, [fact({ state })]), state).not.toThrow()
    expect(() => countSeats(8, [fact({ state: 'lost' as BookingState })])).toThrow(/unknown booking state/)
  })
})

describe('a whole session', () => {
  // 12 seats: a live hold of 2, a run-out hold of 2, confirmed 3, a party of 4 with 3 seated, a
  // no-show of 2, a turned-away pair, a walk-in of 1 and a cancelled 5.
  const facts: SeatFact[] = [
    fact({ state: 'held', partySize: 2, holdLive: true }),
    fact({ state: 'held', partySize: 2, holdLive: false }),
    fact({ state: 'confirmed', partySize: 3 }),
    fact({ state: 'checked_in', partySize: 4, outcome: 'arrived', seated: 3 }),
    fact({ state: 'no_show', partySize: 2, outcome: 'no_show' }),
    fact({ state: 'no_show', partySize: 2, outcome: 'turned_away' }),
    fact({ state: 'checked_in', partySize: 1, outcome: 'arrived', seated: 1, walkIn: true }),
    fact({ state: 'cancelled', partySize: 5 }),
  ]

  it('is seats − (held + confirmed + checked in), as the product design says', () => {
    const c = countSeats(12, facts)
    // held 2 + confirmed 3 + checked in 4 + walk-in 1 (checked in too) = 10
    expect(c).toEqual({
      seats: 12,
      seatsTaken: 10,
      seatsLeft: 2,
      seatsSold: 14,
      breakdown: { held: 2, confirmed: 3, seated: 3, notSeated: 1, didNotCome: 2, turnedAway: 2, walkIns: 1 },
    })
  })

  it('gives the same count from grouped facts (party sizes and seated counts summed) as from single bookings', () => {
    const single = [
      fact({ state: 'checked_in', partySize: 4, outcome: 'arrived', seated: 4 }),
      fact({ state: 'checked_in', partySize: 3, outcome: 'arrived', seated: 1 }),
      fact({ state: 'confirmed', partySize: 2 }),
      fact({ state: 'confirmed', partySize: 5 }),
    ]
    const grouped = [
      fact({ state: 'checked_in', partySize: 7, outcome: 'arrived', seated: 5 }),
      fact({ state: 'confirmed', partySize: 7 }),
    ]
    expect(countSeats(20, grouped)).toEqual(countSeats(20, single))
  })

  it('never shows fewer than no seats left when a session is over-full (its seats were lowered)', () => {
    const c = countSeats(4, [fact({ state: 'confirmed', partySize: 6 })])
    expect(c).toMatchObject({ seatsTaken: 6, seatsLeft: 0 })
  })

  it('keeps its invariants for any mix of bookings', () => {
    // A small linear congruential generator (Numerical Recipes constants, common practice) keeps the run repeatable.
    let seed = 20_240_601
    const next = (n: number) => {
      seed = (seed * 1_664_525 + 1_013_904_223) % 2 ** 32
      return seed % n
    }
    const outcomes = [null, 'arrived', 'turned_away', 'no_show'] as const
    for (let run = 0; run < 200; run++) {
      const list = Array.from({ length: next(12) }, () => {
        const partySize = 1 + next(10)
        return fact({ state: BOOKING_STATES[next(BOOKING_STATES.length)]!, partySize, holdLive: next(2) === 1, outcome: outcomes[next(4)]!, seated: next(partySize + 1), walkIn: next(4) === 0 })
      })
      const seats = next(40)
      const c = countSeats(seats, list)
      const b = c.breakdown
      expect(c.seatsTaken).toBe(b.held + b.confirmed + b.seated + b.notSeated + b.walkIns)
      expect(c.seatsSold).toBe(c.seatsTaken + b.didNotCome + b.turnedAway)
      expect(c.seatsLeft).toBe(Math.max(0, seats - c.seatsTaken))
      const byState = (s: BookingState[]) => list.filter(f => s.includes(f.state) && (f.state !== 'held' || f.holdLive)).reduce((n, f) => n + f.partySize, 0)
      expect(c.seatsTaken).toBe(byState(['held', 'confirmed', 'checked_in']))
    }
  })
})

describe('facts from rows', () => {
  const now = new Date('2026-03-14T18:00:00.000Z')
  const row = { state: 'held' as const, partySize: 2, holdExpiresAt: now, source: 'online' as const }

  it('a hold lasts while its end is after now, and not at the very instant it ends', () => {
    expect(seatFactOf({ ...row, holdExpiresAt: new Date(now.getTime() + 1) }, null, now).holdLive).toBe(true)
    expect(seatFactOf(row, null, now).holdLive).toBe(false)
    expect(seatFactOf({ ...row, state: 'confirmed', holdExpiresAt: new Date(now.getTime() + 60_000) }, null, now).holdLive).toBe(false)
  })

  it('reads the door record and the walk-in source', () => {
    expect(seatFactOf({ ...row, state: 'checked_in', source: 'walk_in' }, { outcome: 'arrived', seated: 2 }, now))
      .toEqual({ state: 'checked_in', partySize: 2, holdLive: false, outcome: 'arrived', seated: 2, walkIn: true })
    expect(seatFactOf({ ...row, state: 'no_show' }, { outcome: 'turned_away', seated: 0 }, now)).toMatchObject({ outcome: 'turned_away', seated: 0, walkIn: false })
  })
})

describe('totals', () => {
  it('add sessions up, seats left per session (an over-full session lends no seats to another)', () => {
    const a = countSeats(4, [fact({ state: 'confirmed', partySize: 6 })])
    const b = countSeats(8, [fact({ state: 'no_show', partySize: 2, outcome: 'no_show' }), fact({ state: 'confirmed', partySize: 3 })])
    expect(addSeatCounts([a, b])).toEqual({
      seats: 12,
      seatsTaken: 9,
      seatsLeft: 5,
      seatsSold: 11,
      breakdown: { ...none, confirmed: 9, didNotCome: 2 },
    })
    expect(addSeatCounts([])).toEqual({ seats: 0, seatsTaken: 0, seatsLeft: 0, seatsSold: 0, breakdown: none })
  })
})

describe('the host\'s tiles', () => {
  it('put every guest booked or seated at the door in exactly one tile', () => {
    const facts = [
      fact({ state: 'held', partySize: 2, holdLive: true }),
      fact({ state: 'confirmed', partySize: 3 }),
      fact({ state: 'checked_in', partySize: 4, outcome: 'arrived', seated: 3 }),
      fact({ state: 'checked_in', partySize: 2, outcome: 'arrived', seated: 2 }),
      fact({ state: 'checked_in', partySize: 2, outcome: 'arrived', seated: 2, walkIn: true }),
      fact({ state: 'no_show', partySize: 1, outcome: 'no_show' }),
      fact({ state: 'no_show', partySize: 2, outcome: 'turned_away' }),
    ]
    const tiles = doorTiles(countSeats(20, facts).breakdown)
    expect(tiles).toEqual({ paying: 2, toCome: 3, seated: 3 + 2 + 2, notSeated: 1, didNotCome: 1, turnedAway: 2 })
    const guests = facts.reduce((n, f) => n + f.partySize, 0)
    expect(Object.values(tiles).reduce((a, b) => a + b, 0)).toBe(guests)
  })
})
