import { describe, expect, it } from 'vitest'
import { ageOn, signUpSchema } from '../../shared/schemas/auth'
import { venueSchema } from '../../shared/schemas/venue'
import { inviteSchema, staffPatchSchema } from '../../shared/schemas/staff'
import { fieldErrorsFromZod } from '../../shared/utils/fieldErrors'

describe('age on a given day', () => {
  it.each([
    ['2005-12-02', '2026-12-01', 20],
    ['2005-12-01', '2026-12-01', 21],
    ['2004-02-29', '2025-02-28', 20],
    ['2004-02-29', '2025-03-01', 21],
  ])('born %s, on %s: %i', (dob, day, age) => expect(ageOn(dob, day)).toBe(age))
})

describe('shared schemas', () => {
  it('sign-up normalises the e-mail and gives one message per bad field', () => {
    const ok = signUpSchema.parse({ name: ' Ann ', email: ' Ann@Example.TEST ', password: 'long-enough-1', dateOfBirth: '1980-01-01' })
    expect(ok).toMatchObject({ name: 'Ann', email: 'ann@example.test' })
    const bad = signUpSchema.safeParse({ email: 'x', password: 1, dateOfBirth: '2021-02-29' })
    expect(bad.success).toBe(false)
    expect(Object.keys(fieldErrorsFromZod(bad.error!)).sort()).toEqual(['dateOfBirth', 'email', 'name', 'password'])
  })

  it('invitations take only staff roles', () => {
    expect(inviteSchema.safeParse({ name: 'A', email: 'a@b.test', role: 'guest' }).success).toBe(false)
    expect(inviteSchema.safeParse({ name: 'A', email: 'a@b.test', role: 'marketing' }).success).toBe(true)
    expect(staffPatchSchema.safeParse({}).success).toBe(false)
  })

  it('venue settings: the standard drink follows the definition unless custom', () => {
    const base = { name: 'V', address: 'A', phone: '', email: '', website: '', openingHours: null, locale: 'en-GB', timeZone: 'Europe/Lisbon', currency: 'eur', legalAge: 18, volumeUnit: 'ml', temperatureUnit: 'c', guestEthanolLimitGrams: 40, cancellationCutoffHours: 24, cautions: 'c' } as const
    expect(venueSchema.parse({ ...base, standardDrinkKind: 'au', standardDrinkGrams: 3 }).standardDrinkGrams).toBe(10) // Australian standard drink: 10 g
    expect(venueSchema.parse({ ...base, standardDrinkKind: 'custom', standardDrinkGrams: 12 }).standardDrinkGrams).toBe(12)
    expect(venueSchema.parse({ ...base, standardDrinkKind: 'us', standardDrinkGrams: 1 }).currency).toBe('EUR')
    expect(venueSchema.safeParse({ ...base, timeZone: 'Nowhere/Else', standardDrinkKind: 'us', standardDrinkGrams: 14 }).success).toBe(false)
  })
})

describe('booking notes', () => {
  it('a form that sends the parsed value back (null for an empty note) still validates', async () => {
    const { bookingCreateSchema } = await import('../../shared/schemas/bookings')
    const base = { sessionId: 1, partySize: 2, contactName: 'A', contactEmail: 'a@b.test', contactPhone: '+1 207 555 0100', dateOfBirth: '1990-01-01', ageConfirmed: true }
    for (const notes of ['', null, undefined, 'Nut allergy']) {
      const once = bookingCreateSchema.parse({ ...base, notes })
      expect(bookingCreateSchema.parse(once).notes).toBe(notes || null)
    }
  })
})

describe('venue contact and hours', () => {
  const base = { name: 'V', address: 'A', phone: '', email: '', website: '', openingHours: null, locale: 'en-US', timeZone: 'UTC', currency: 'USD', legalAge: 21, volumeUnit: 'ml', temperatureUnit: 'c', standardDrinkKind: 'us', guestEthanolLimitGrams: 42, cancellationCutoffHours: 24, cautions: '' } as const

  it('a tel: link keeps digits and a leading +, and drops the (0) only after a country code', async () => {
    const { phoneHref } = await import('../../shared/venue')
    expect(phoneHref('+1 (207) 555-0143')).toBe('tel:+12075550143')
    expect(phoneHref('+44 (0)20 7946 0321')).toBe('tel:+442079460321') // ITU-T E.123: no (0) in the international form (from memory)
    expect(phoneHref('(0)20 7946 0321')).toBe('tel:02079460321')
  })

  it('UTC, which the platform accepts but does not list, is a zone; an empty string is not', () => {
    expect(venueSchema.parse(base).timeZone).toBe('UTC')
    expect(venueSchema.safeParse({ ...base, timeZone: '' }).success).toBe(false)
  })

  it('openings touching end to start are two openings, in order; a span across midnight is refused', () => {
    const ok = venueSchema.parse({ ...base, openingHours: { fri: [{ opens: '17:00', closes: '23:00' }, { opens: '12:00', closes: '17:00' }] } })
    expect(ok.openingHours).toEqual({ fri: [{ opens: '12:00', closes: '17:00' }, { opens: '17:00', closes: '23:00' }] })
    const late = venueSchema.safeParse({ ...base, openingHours: { sat: [{ opens: '20:00', closes: '01:00' }] } })
    expect(fieldErrorsFromZod(late.error!)).toEqual({ 'openingHours.sat.0.closes': 'Closing must be after opening, on the same day.' })
  })
})
