/**
 * How a guest reaches the venue, written once for the pages, the error messages and the e-mails:
 * wherever a guest is told to contact the venue, these are the details they are given.
 */
export interface VenueContact { name: string, address: string, phone: string, email: string, website: string }

/** "saltmarsh.test" for "https://saltmarsh.test/": a website as people write it. */
export function websiteLabel(url: string): string {
  return url.replace(/^https?:\/\//i, '').replace(/\/$/, '')
}

/** A phone number as a tel: link (RFC 3966 keeps digits and a leading +). */
export function telHref(phone: string): string {
  return `tel:${phone.replace(/[^\d+]/g, '')}`
}

/**
 * "Saltmarsh & Vine Tasting Room: +1 207 555 0143, hello@saltmarsh.test, saltmarsh.test", or the
 * name and address when the venue has set no phone, e-mail or website.
 */
export function venueContactText(v: VenueContact): string {
  const ways = [v.phone, v.email, v.website ? websiteLabel(v.website) : ''].filter(Boolean)
  return ways.length ? `${v.name}: ${ways.join(', ')}` : `${v.name}, ${v.address}`
}
