import { describe, expect, it } from 'vitest'
import { formatIsoInZone } from '../../shared/dates'
import { jsonLdText, localBusinessLd, offerAvailability, sessionEventLd, type SeoVenue } from '../../shared/seo'
import type { PublicSession } from '../../shared/types/sessions'

const venue: SeoVenue = {
  name: 'Test Tasting Room', address: '1 Test Quay', phone: '+1 207 555 0100', email: 'hi@room.test', website: 'https://room.test',
  currency: 'USD', openingHours: { fri: [{ opens: '12:00', closes: '21:00' }], sat: [{ opens: '11:00', closes: '14:00' }, { opens: '16:00', closes: '22:00' }] },
}
const session = (over: Partial<PublicSession> = {}): PublicSession => ({
  id: 7, flightId: 1, flightName: 'Test flight', startsAt: '2026-12-05T19:00:00.000Z', startsLocal: null, endsAt: '2026-12-05T20:15:00.000Z',
  durationMinutes: 75, seats: 12, seatsLeft: 3, priceMinor: 3500, currency: 'USD', bookingClosesAt: '2026-12-05T17:00:00.000Z',
  status: 'open', bookable: true, closedReason: null, ...over,
})

describe('ISO times with the venue\'s offset', () => {
  it('writes the offset in force at each instant', () => {
    expect(formatIsoInZone('2026-12-05T19:00:00Z', 'America/New_York')).toBe('2026-12-05T14:00:00-05:00')
    // US daylight saving time ends on the first Sunday of November (Energy Policy Act of 2005, from memory).
    expect(formatIsoInZone('2026-11-01T05:30:00Z', 'America/New_York')).toBe('2026-11-01T01:30:00-04:00')
    expect(formatIsoInZone('2026-11-01T06:30:00Z', 'America/New_York')).toBe('2026-11-01T01:30:00-05:00')
    expect(formatIsoInZone('2026-12-05T19:00:00Z', 'Asia/Kolkata')).toBe('2026-12-06T00:30:00+05:30') // India is UTC+05:30 all year (from memory)
    expect(formatIsoInZone('2026-12-05T19:00:00Z', 'UTC')).toBe('2026-12-05T19:00:00+00:00')
  })
})

describe('schema.org for a session on sale', () => {
  const ld = sessionEventLd(session(), { flightName: 'Test flight', description: 'Six pours', venue, timeZone: 'America/New_York', siteUrl: 'https://room.test', images: ['https://room.test/media/a.jpg'] })
  it('is an Event at the venue with its start and end in the venue\'s offset', () => {
    expect(ld['@type']).toBe('Event')
    expect(ld.startDate).toBe('2026-12-05T14:00:00-05:00')
    expect(ld.endDate).toBe('2026-12-05T15:15:00-05:00')
    expect(ld.location).toEqual({ '@type': 'Place', 'name': venue.name, 'address': venue.address })
  })
  it('offers a seat at the price in major units, with the booking page', () => {
    // schema.org Offer.price: a number or text, with "." as the decimal separator (schema.org/price).
    expect(ld.offers).toMatchObject({ '@type': 'Offer', 'price': '35.00', 'priceCurrency': 'USD', 'availability': 'https://schema.org/InStock', 'url': 'https://room.test/book/7' })
    const yen = sessionEventLd(session({ priceMinor: 3500, currency: 'JPY' }), { flightName: 'x', description: '', venue, timeZone: 'Asia/Tokyo', siteUrl: 'https://room.test', images: [] })
    expect((yen.offers as { price: string }).price).toBe('3500') // the yen has no minor unit (ISO 4217)
  })
  it('is sold out with no seats left', () => {
    expect(offerAvailability(1)).toBe('https://schema.org/InStock')
    expect(offerAvailability(0)).toBe('https://schema.org/SoldOut')
  })
})

describe('schema.org for the venue', () => {
  it('is a LocalBusiness with one opening hours entry per opening', () => {
    const ld = localBusinessLd(venue, { url: 'https://room.test/', image: null })
    expect(ld['@type']).toBe('LocalBusiness')
    expect(ld.telephone).toBe(venue.phone)
    expect(ld.openingHoursSpecification).toEqual([
      { '@type': 'OpeningHoursSpecification', 'dayOfWeek': 'https://schema.org/Friday', 'opens': '12:00', 'closes': '21:00' },
      { '@type': 'OpeningHoursSpecification', 'dayOfWeek': 'https://schema.org/Saturday', 'opens': '11:00', 'closes': '14:00' },
      { '@type': 'OpeningHoursSpecification', 'dayOfWeek': 'https://schema.org/Saturday', 'opens': '16:00', 'closes': '22:00' },
    ])
  })
  it('cannot close its script element early', () => {
    const text = jsonLdText({ name: 'Bad </script><script>alert(1)</script>' })
    expect(text).not.toContain('</script')
    expect(JSON.parse(text).name).toBe('Bad </script><script>alert(1)</script>')
  })
})
