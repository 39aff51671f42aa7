/**
 * Where a venue is and how it writes: its locale, its currency and its time zone. The currencies
 * and zones are the platform's own lists (ECMA-402 `Intl.supportedValuesOf`), so the form in the
 * browser and the check on the server offer and accept the same codes.
 */

/** The locales whose dates, times and numbers Larmoir writes well (shared/dates.ts, shared/money.ts). */
export const VENUE_LOCALES = {
  'en-US': 'English (United States)',
  'en-GB': 'English (United Kingdom)',
  'en-AU': 'English (Australia)',
  'en-CA': 'English (Canada)',
  'en-IE': 'English (Ireland)',
  'en-NZ': 'English (New Zealand)',
} as const
export type VenueLocale = keyof typeof VENUE_LOCALES
export const VENUE_LOCALE_CODES = Object.keys(VENUE_LOCALES) as [VenueLocale, ...VenueLocale[]]

let currencies: Set<string> | undefined
let countries: { code: string, name: string }[] | undefined

/** Codes the platform names but that are not countries (the EU, the UN, "unknown region"). */
const NOT_COUNTRIES = new Set(['EU', 'EZ', 'UN', 'QO', 'ZZ', 'XA', 'XB'])

/**
 * ISO 3166-1 alpha-2 countries and territories with their English names, as the platform knows
 * them (ECMA-402 Intl.DisplayNames), sorted by name.
 */
export function countryOptions(): { code: string, name: string }[] {
  if (countries) return countries
  const names = new Intl.DisplayNames(['en'], { type: 'region', fallback: 'none' })
  const out: { code: string, name: string }[] = []
  for (let a = 65; a <= 90; a++) {
    for (let b = 65; b <= 90; b++) {
      const code = String.fromCharCode(a, b)
      const name = NOT_COUNTRIES.has(code) ? undefined : names.of(code)
      if (name && name !== code) out.push({ code, name })
    }
  }
  countries = out.sort((x, y) => x.name.localeCompare(y.name, 'en'))
  return countries
}

export function isKnownCountry(code: string): boolean {
  return countryOptions().some(c => c.code === code)
}
let zones: Set<string> | undefined

/** ISO 4217 codes of the currencies in use, as the platform knows them ("EUR", "USD", …). */
export function currencyCodes(): string[] {
  return Intl.supportedValuesOf('currency')
}

export function isKnownCurrency(code: string): boolean {
  currencies ??= new Set(currencyCodes())
  return currencies.has(code)
}

/** The IANA zones the platform lists, plus UTC, which it accepts but does not list. */
export function timeZoneIds(): string[] {
  return [...Intl.supportedValuesOf('timeZone'), 'UTC']
}

/**
 * A zone's canonical IANA name ("america/new_york" → "America/New_York", "US/Eastern" →
 * "America/New_York"), or null for a name the platform does not know.
 */
export function canonicalTimeZone(zone: string): string | null {
  zones ??= new Set(timeZoneIds())
  if (zones.has(zone)) return zone
  try {
    const resolved = new Intl.DateTimeFormat('en-US', { timeZone: zone }).resolvedOptions().timeZone
    return zones.has(resolved) ? resolved : null
  }
  catch {
    return null
  }
}

/** The zone's offset from UTC at that instant, "UTC-05:00", "UTC+05:45", "UTC+00:00". */
export function zoneOffset(zone: string, at = new Date()): string {
  const name = new Intl.DateTimeFormat('en-US', { timeZone: zone, timeZoneName: 'longOffset' }).formatToParts(at).find(p => p.type === 'timeZoneName')?.value ?? 'GMT'
  return name === 'GMT' ? 'UTC+00:00' : name.replace('GMT', 'UTC')
}

/** The zone's name in English at that instant ("Eastern Daylight Time"), or '' where the platform has only an offset. */
export function zoneLongName(zone: string, at = new Date()): string {
  const name = new Intl.DateTimeFormat('en-US', { timeZone: zone, timeZoneName: 'long' }).formatToParts(at).find(p => p.type === 'timeZoneName')?.value ?? ''
  return /^GMT([+-]|$)/.test(name) ? '' : name
}

/** The currency's English name: "EUR" → "Euro". */
export function currencyName(code: string): string {
  return new Intl.DisplayNames('en', { type: 'currency' }).of(code) ?? code
}
