import { describe, expect, it } from 'vitest'
import { BOOKING_HISTORY_EVENTS, BOOKING_STATES, BOOKING_TRANSITIONS, REFERENCE_ALPHABET, canTransition, isReference, normalizeReference, type BookingEvent, type BookingState } from '../../shared/bookings'
import { minorToDecimal } from '../../shared/money'
import { bookingCreateSchema, bookingReportQuerySchema } from '../../shared/schemas/bookings'
import { fieldErrorsFromZod } from '../../shared/utils/fieldErrors'

describe('the booking state diagram', () => {
  // Every edge of the product design's diagram, plus the late-payment edge and the door's own two
  // (turning away, and taking back a door decision) documented in shared/bookings.ts.
  const edges: [BookingState, BookingEvent, BookingState][] = [
    ['held', 'pay', 'confirmed'],
    ['held', 'expire', 'expired'],
    ['confirmed', 'arrive', 'checked_in'],
    ['confirmed', 'no_show', 'no_show'],
    ['confirmed', 'turn_away', 'no_show'],
    ['no_show', 'undo_door', 'confirmed'],
    ['confirmed', 'cancel', 'cancelled'],
    ['cancelled', 'refund', 'refunded'],
    ['expired', 'late_payment', 'confirmed'],
  ]

  it.each(edges)('%s --%s--> %s', (from, event, to) => {
    expect(canTransition(from, event)).toBe(true)
    expect(BOOKING_TRANSITIONS[event].to).toBe(to)
  })

  it('refuses every other move', () => {
    const allowed = new Set(edges.map(([from, event]) => `${from}:${event}`))
    for (const from of BOOKING_STATES) {
      for (const event of Object.keys(BOOKING_TRANSITIONS) as BookingEvent[]) {
        expect(canTransition(from, event), `${from} ${event}`).toBe(allowed.has(`${from}:${event}`))
      }
    }
  })

  it('records every move in a booking\'s history', () => {
    for (const event of Object.keys(BOOKING_TRANSITIONS)) expect(BOOKING_HISTORY_EVENTS, event).toContain(event)
  })
})

describe('a reference as a host types it or a camera reads it', () => {
  it.each([
    ['7K2M9QXP4T', '7K2M9QXP4T'],
    ['7k2m9qxp4t', '7K2M9QXP4T'],
    [' 7k2m9 qxp4t ', '7K2M9QXP4T'],
    ['7K2M9-QXP4T', '7K2M9QXP4T'],
    ['7K2M9\u2013QXP4T', '7K2M9QXP4T'], // an en dash, as a phone's keyboard may put in
    // Crockford, "Base32", crockford.com/base32.html: O is read as 0, I and L as 1.
    ['7K2M9QXP4O', '7K2M9QXP40'],
    ['iK2M9QXP4l', '1K2M9QXP41'],
  ])('%j is %s', (typed, stored) => {
    expect(normalizeReference(typed)).toBe(stored)
    expect(isReference(normalizeReference(typed))).toBe(true)
  })

  it.each([
    ['too short', '7K2M9QXP4'],
    ['too long', '7K2M9QXP4TT'],
    ['U is not in the alphabet', '7K2M9QXP4U'],
    ['a card\'s web address', 'https://larmoir.test/p/1'],
    ['empty', ''],
  ])('refuses %s', (_what, typed) => expect(isReference(normalizeReference(typed))).toBe(false))
})

describe('booking references and money', () => {
  it('uses Crockford\'s base32 alphabet', () => {
    expect(REFERENCE_ALPHABET).toBe('0123456789ABCDEFGHJKMNPQRSTVWXYZ') // Crockford, "Base32", crockford.com/base32.html
    expect(REFERENCE_ALPHABET).toHaveLength(32)
  })

  it.each([
    [3500, 'USD', '35.00'],
    [3500, 'JPY', '3500'], // ISO 4217: JPY has no minor unit
    [12345, 'KWD', '12.345'], // ISO 4217: KWD has three decimals
  ])('%i minor units of %s are %s', (minor, currency, text) => expect(minorToDecimal(minor, currency)).toBe(text))
})

describe('the booking schema', () => {
  const good = { sessionId: 4, partySize: 2, contactName: ' Ana ', contactEmail: 'Ana@Example.TEST', contactPhone: '+1 (207) 555-0100', dateOfBirth: '1990-01-31', ageConfirmed: true }

  it('accepts a good booking and normalises it', () => {
    // No e-mail is taken from the form: booking mail goes to the account's confirmed address.
    const parsed = bookingCreateSchema.parse(good)
    expect(parsed).toMatchObject({ contactName: 'Ana' })
    expect(parsed).not.toHaveProperty('contactEmail')
  })

  it('gives one message per bad field', () => {
    const bad = bookingCreateSchema.safeParse({ sessionId: 0, partySize: 11, contactName: '', contactEmail: 'x', contactPhone: '12', dateOfBirth: '1990-02-30', ageConfirmed: false })
    expect(Object.keys(fieldErrorsFromZod(bad.error!)).sort()).toEqual(['ageConfirmed', 'contactName', 'contactPhone', 'dateOfBirth', 'partySize', 'sessionId'])
  })

  it('checks report dates and their order', () => {
    expect(bookingReportQuerySchema.safeParse({ from: '2026-05-02', to: '2026-05-01' }).success).toBe(false)
    expect(bookingReportQuerySchema.parse({ from: '2026-05-01', to: '2026-05-31', flightId: '3' })).toEqual({ from: '2026-05-01', to: '2026-05-31', flightId: 3 })
  })
})
