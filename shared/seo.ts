/**
 * What search engines and link previews read about the venue's public pages: schema.org JSON-LD
 * for the venue (LocalBusiness) and for each session on sale (Event with its Offer), built from
 * the same views the pages show. Pure: no framework imports.
 */
import { formatIsoInZone } from './dates'
import { minorToDecimal } from './money'
import { WEEKDAYS, type OpeningHours } from './venue'
import type { ListedSession } from './types/sessions'

type JsonLd = Record<string, unknown>

const SCHEMA = 'https://schema.org'
/** schema.org's DayOfWeek members, Monday first like WEEKDAYS. */
const DAY_NAMES = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'] as const

/** The venue as schema.org sees it (a subset of PublicVenue). */
export interface SeoVenue { name: string, address: string, phone: string, email: string, website: string, currency: string, openingHours: OpeningHours | null }

/** One opening hours specification per opening of each weekday (schema.org OpeningHoursSpecification). */
function openingHoursSpecification(hours: OpeningHours | null): JsonLd[] {
  if (!hours) return []
  return WEEKDAYS.flatMap((d, i) => (hours[d] ?? []).map(s => ({ '@type': 'OpeningHoursSpecification', 'dayOfWeek': `${SCHEMA}/${DAY_NAMES[i]}`, 'opens': s.opens, 'closes': s.closes })))
}

/**
 * The venue as a schema.org LocalBusiness: the most general type that fits a winery's barn, a
 * distillery's bar and a tasting room alike; what kind of place it is, its name says.
 */
export function localBusinessLd(venue: SeoVenue, opts: { url: string, image: string | null }): JsonLd {
  return {
    '@context': SCHEMA,
    '@type': 'LocalBusiness',
    'name': venue.name,
    'url': opts.url,
    'address': venue.address,
    ...(opts.image ? { image: opts.image } : {}),
    ...(venue.phone ? { telephone: venue.phone } : {}),
    ...(venue.email ? { email: venue.email } : {}),
    ...(venue.website ? { sameAs: [venue.website] } : {}),
    'currenciesAccepted': venue.currency,
    'openingHoursSpecification': openingHoursSpecification(venue.openingHours),
  }
}

/** schema.org's availability of an offer, from the seats left (shared/seats.ts counted them). */
export function offerAvailability(seatsLeft: number): string {
  return `${SCHEMA}/${seatsLeft > 0 ? 'InStock' : 'SoldOut'}`
}

/**
 * A session on sale as a schema.org Event at the venue, with its Offer: the price per guest in
 * major units as a decimal string ("35.00"), its currency, availability from the seats left, and
 * the booking page. Start and end carry the venue's offset at each instant.
 */
/**
 * How many of a flight's sessions its page describes as Events: the next ones, soonest first. A
 * search engine reads the page again often; describing every date on sale would make the page
 * several times heavier for no guest's benefit.
 */
export const EVENT_LD_LIMIT = 6

export function sessionEventLd(s: ListedSession, opts: { flightName: string, description: string, venue: SeoVenue, timeZone: string, siteUrl: string, images: string[] }): JsonLd {
  const place = { '@type': 'Place', 'name': opts.venue.name, 'address': opts.venue.address }
  return {
    '@context': SCHEMA,
    '@type': 'Event',
    'name': `${opts.flightName}: a seated tasting flight`,
    'description': opts.description,
    'startDate': formatIsoInZone(s.startsAt, opts.timeZone),
    'endDate': formatIsoInZone(s.endsAt, opts.timeZone),
    'eventStatus': `${SCHEMA}/EventScheduled`,
    'eventAttendanceMode': `${SCHEMA}/OfflineEventAttendanceMode`,
    'location': place,
    ...(opts.images.length ? { image: opts.images } : {}),
    'maximumAttendeeCapacity': s.seats,
    'remainingAttendeeCapacity': s.seatsLeft,
    'organizer': { '@type': 'Organization', 'name': opts.venue.name, 'url': opts.siteUrl },
    'offers': {
      '@type': 'Offer',
      'price': minorToDecimal(s.priceMinor, s.currency),
      'priceCurrency': s.currency,
      'availability': offerAvailability(s.seatsLeft),
      'validThrough': formatIsoInZone(s.bookingClosesAt, opts.timeZone),
      'url': new URL(`/book/${s.id}`, opts.siteUrl).toString(),
    },
  }
}

/**
 * JSON for a `<script type="application/ld+json">` element: "<" is written as \u003c, so no text
 * in it (a flight's name, say) can close the element early. The browser never runs a data block,
 * so the page's content security policy has nothing to allow.
 */
export function jsonLdText(data: JsonLd | JsonLd[]): string {
  return JSON.stringify(data).replace(/</g, '\\u003c')
}
