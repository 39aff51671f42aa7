/**
 * Money, in one place for both sides: amounts are integer minor units of an ISO 4217 currency
 * (cents for USD, none for JPY). This turns them into text and back; nothing else multiplies or
 * divides by powers of ten. The currency's decimals come from the platform's ISO 4217 data (Intl).
 */

/** Minor-unit digits of a currency: 2 for USD and EUR, 0 for JPY, 3 for BHD (ISO 4217, through Intl). */
export function currencyDigits(currency: string): number {
  let digits = DIGITS.get(currency)
  if (digits === undefined) {
    digits = new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2
    if (DIGITS.size < 400) DIGITS.set(currency, digits)
  }
  return digits
}
/** Digits by currency, learnt once each (making an Intl.NumberFormat costs ~15 µs; a CSV asks thousands of times). */
const DIGITS = new Map<string, number>()

/** Whole minor units → the major units as a plain decimal string: "35.00", "3500" for JPY. */
export function minorToDecimal(minor: number, currency: string): string {
  const digits = currencyDigits(currency)
  return (minor / 10 ** digits).toFixed(digits)
}

/** Whole minor units → an amount with its currency sign, in a locale: "$35.00", "€12.50". */
export function formatMoney(minor: number, currency: string, locale = 'en-US'): string {
  const key = `${locale}|${currency}`
  let f = MONEY_FORMATS.get(key)
  if (!f) {
    f = new Intl.NumberFormat(locale, { style: 'currency', currency })
    if (MONEY_FORMATS.size < 1000) MONEY_FORMATS.set(key, f)
  }
  return f.format(Number(minorToDecimal(minor, currency)))
}
const MONEY_FORMATS = new Map<string, Intl.NumberFormat>()

/**
 * "14.50" (a leading currency sign is allowed) → 1450 minor units of USD. Blank → undefined; text
 * that is not a number → NaN. An amount with more decimals than the currency has is returned
 * unrounded (e.g. 1450.5), so the schemas' integer check refuses it with their own message.
 */
export function parseMoney(text: string | number | null | undefined, currency: string): number | undefined {
  const t = String(text ?? '').trim().replace(/^[^\d.-]+/, '')
  if (t === '') return undefined
  const n = Number(t)
  if (!Number.isFinite(n)) return Number.NaN
  const digits = currencyDigits(currency)
  const pattern = digits > 0 ? new RegExp(`^-?\\d*(\\.\\d{0,${digits}})?$`) : /^-?\d+$/
  return pattern.test(t) ? Math.round(n * 10 ** digits) : n * 10 ** digits
}
