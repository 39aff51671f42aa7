import { currencyCodes, currencyName, timeZoneIds, zoneLongName, zoneOffset } from '#shared/regions'

/** One choice of a searchable list: the value it sets, the text the field shows, a line under it, and what a search matches. */
export interface ComboOption { value: string, label: string, detail?: string, search: string }

/** Lower case, accents dropped, "America/New_York" read as "america new york". */
const fold = (s: string) => s.normalize('NFD').replace(/[\u0300-\u036F]/g, '').toLowerCase().replace(/[_/]/g, ' ')

/**
 * The options holding every word of the query (in any order), the best first: the exact code,
 * then options with a word that starts with the query's first word, then the rest.
 */
export function matchOptions(options: ComboOption[], query: string): ComboOption[] {
  const q = fold(query).trim()
  const words = q.split(/\s+/).filter(Boolean)
  if (!words.length) return options
  const rank = (o: ComboOption) => (fold(o.value) === q ? 0 : ` ${o.search}`.includes(` ${words[0]}`) ? 1 : 2)
  return options.filter(o => words.every(w => o.search.includes(w)))
    .map((o, i) => ({ o, i, r: rank(o) }))
    .sort((a, b) => a.r - b.r || a.i - b.i)
    .map(x => x.o)
}

/** "USD — US Dollar". */
export function currencyLabel(code: string): string {
  return `${code} — ${currencyName(code)}`
}

/** Every ISO 4217 code the platform knows, with its English name. */
export function currencyOptions(): ComboOption[] {
  return currencyCodes().map((code) => {
    const label = currencyLabel(code)
    return { value: code, label, search: fold(label) }
  })
}

/** "UTC-04:00 · Eastern Daylight Time": where the zone stands now. */
export function zoneDetail(zone: string, at = new Date()): string {
  return [zoneOffset(zone, at), zoneLongName(zone, at)].filter(Boolean).join(' · ')
}

/** Every IANA zone the platform knows, with its offset and name now, so "sydney", "eastern" or "+10" find one. */
export function timeZoneOptions(at = new Date()): ComboOption[] {
  return timeZoneIds().map((zone) => {
    const detail = zoneDetail(zone, at)
    return { value: zone, label: zone, detail, search: fold(`${zone} ${detail}`) }
  })
}
