/**
 * The one seat rule. Every screen that shows seats (the public list and a session's page, the
 * booking transaction that decides, the host's day, the manager's report) counts them here, from
 * the same facts about a session's bookings, so that no two of them can disagree.
 *
 * Seats left = seats − (held + confirmed + checked in), as the product design puts it. In detail:
 *
 * - held: takes its party's seats only while the hold lasts (its time to pay has not run out);
 *   a hold that ran out takes nothing, even before the sweep has moved it to expired.
 * - confirmed: takes its party's seats (still to come).
 * - checked in: takes its party's seats, all of them, even when the host seated only some (the
 *   others had no ID yet, or are late): the party paid for its seats, and a missing guest may
 *   still come. The breakdown splits these into seated and not seated.
 * - walk-in: a party seated at the door is a checked-in booking with source walk-in; it takes
 *   its seats like any other and is shown on its own line.
 * - no-show: takes nothing. The host's two door outcomes both end in this state: "did not come"
 *   (check-in outcome no-show) and "turned away" (outcome turned away, for example no ID); the
 *   breakdown keeps them apart. Their seats were paid for, so they count as sold (fill rate).
 * - cancelled, refunded, expired: take nothing.
 *
 * Invariants: seatsTaken = held + confirmed + seated + notSeated + walkIns;
 * seatsSold = seatsTaken + didNotCome + turnedAway; seatsLeft = max(0, seats − seatsTaken).
 *
 * Pure: no framework imports, so the client could show the same figures from the same facts.
 */
import type { BookingState } from './bookings'

/** What the host recorded at the door (the check-in row). */
export type DoorOutcome = 'arrived' | 'turned_away' | 'no_show'

/**
 * What counting needs to know about one booking, or about several alike with their party sizes
 * and seated counts summed (a grouped query gives one fact per state, hold, outcome and source).
 */
export interface SeatFact {
  state: BookingState
  /** Guests booked. */
  partySize: number
  /** A held booking whose time to pay has not run out; ignored in every other state. */
  holdLive: boolean
  /** The check-in row's outcome; null without one. */
  outcome: DoorOutcome | null
  /** Guests the host seated (the check-in row's count); 0 without one. */
  seated: number
  /** Seated at the door without booking ahead. */
  walkIn: boolean
}

/** Guests in each part of a session, by the rule above. */
export interface SeatBreakdown {
  /** Held and still paying. */
  held: number
  /** Confirmed, still to come. */
  confirmed: number
  /** Booked guests the host seated. */
  seated: number
  /** Booked guests of a partly seated party who are not (yet) seated: their seats stay theirs. */
  notSeated: number
  /** Parties marked as not coming (no seats taken). */
  didNotCome: number
  /** Parties turned away at the door (no seats taken). */
  turnedAway: number
  /** Guests seated at the door without a booking. */
  walkIns: number
}

export interface SeatCount {
  seats: number
  seatsTaken: number
  seatsLeft: number
  /** Seats paid for: taken, plus parties that did not come or were turned away (for a fill rate). */
  seatsSold: number
  breakdown: SeatBreakdown
}

const emptyBreakdown = (): SeatBreakdown => ({ held: 0, confirmed: 0, seated: 0, notSeated: 0, didNotCome: 0, turnedAway: 0, walkIns: 0 })

/** Adds one fact to a breakdown; every state is named, so a new state fails to compile here. */
function addFact(out: SeatBreakdown, f: SeatFact): void {
  switch (f.state) {
    case 'held':
      if (f.holdLive) out.held += f.partySize
      return
    case 'confirmed':
      out.confirmed += f.partySize
      return
    case 'checked_in': {
      if (f.walkIn) {
        out.walkIns += f.partySize
        return
      }
      // A checked-in booking without a door record (none is written outside check-in) counts as seated in full.
      const seated = f.outcome === 'arrived' ? Math.min(Math.max(0, f.seated), f.partySize) : f.partySize
      out.seated += seated
      out.notSeated += f.partySize - seated
      return
    }
    case 'no_show':
      if (f.outcome === 'turned_away') out.turnedAway += f.partySize
      else out.didNotCome += f.partySize
      return
    case 'cancelled':
    case 'refunded':
    case 'expired':
      return
    default: {
      const never: never = f.state
      throw new Error(`unknown booking state ${String(never)}`)
    }
  }
}

/** Seats taken, left and sold in a session of `seats`, from its bookings' facts. */
export function countSeats(seats: number, facts: Iterable<SeatFact>): SeatCount {
  const breakdown = emptyBreakdown()
  for (const f of facts) addFact(breakdown, f)
  const seatsTaken = breakdown.held + breakdown.confirmed + breakdown.seated + breakdown.notSeated + breakdown.walkIns
  return {
    seats,
    seatsTaken,
    seatsLeft: Math.max(0, seats - seatsTaken),
    seatsSold: seatsTaken + breakdown.didNotCome + breakdown.turnedAway,
    breakdown,
  }
}

/**
 * The host's tiles: each guest on the door's list (booked online, or seated at the door) is in
 * exactly one of them, so they add up to the guests booked plus the walk-ins. Seated counts
 * walk-ins too; a partly seated party's missing guests are "not seated".
 */
export interface DoorTiles {
  /** Holds still paying. */
  paying: number
  toCome: number
  seated: number
  notSeated: number
  didNotCome: number
  turnedAway: number
}

export function doorTiles(b: SeatBreakdown): DoorTiles {
  return { paying: b.held, toCome: b.confirmed, seated: b.seated + b.walkIns, notSeated: b.notSeated, didNotCome: b.didNotCome, turnedAway: b.turnedAway }
}

/** Sums several sessions' counts (a report's totals). */
export function addSeatCounts(counts: Iterable<SeatCount>): SeatCount {
  const breakdown = emptyBreakdown()
  let seats = 0
  let seatsTaken = 0
  let seatsLeft = 0
  let seatsSold = 0
  for (const c of counts) {
    seats += c.seats
    seatsTaken += c.seatsTaken
    seatsLeft += c.seatsLeft
    seatsSold += c.seatsSold
    for (const k of Object.keys(breakdown) as (keyof SeatBreakdown)[]) breakdown[k] += c.breakdown[k]
  }
  return { seats, seatsTaken, seatsLeft, seatsSold, breakdown }
}

/** The fact of one booking row and its check-in row, as of `now`. */
export function seatFactOf(
  b: { state: BookingState, partySize: number, holdExpiresAt: Date, source: 'online' | 'walk_in' },
  checkIn: { outcome: DoorOutcome, seated: number } | null,
  now: Date,
): SeatFact {
  return {
    state: b.state,
    partySize: b.partySize,
    holdLive: b.state === 'held' && b.holdExpiresAt.getTime() > now.getTime(),
    outcome: checkIn?.outcome ?? null,
    seated: checkIn?.seated ?? 0,
    walkIn: b.source === 'walk_in',
  }
}
