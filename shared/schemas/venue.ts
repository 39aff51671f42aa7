import { WEEKDAYS, type OpeningHours, type OpeningSpan, type Weekday } from '../venue'
import { VENUE_LOCALE_CODES, canonicalTimeZone, isKnownCountry, isKnownCurrency } from '../regions'
import { CARD_PAPERS } from '../paper'
import { z } from './zod'
import { airTempInRange, airTempMessage, humidityField, toTenth } from './room'

/** Standard-drink definitions in grams of ethanol: NIAAA (US), NHS unit (UK), Australian guidelines. */
export const STANDARD_DRINK_GRAMS = { us: 14, uk: 8, au: 10 } as const
export const STANDARD_DRINK_LABELS = {
  us: 'United States: 14 g (NIAAA)',
  uk: 'United Kingdom unit: 8 g (NHS)',
  au: 'Australia: 10 g',
  custom: 'Custom grams',
} as const

/** Openings a day can hold: a lunch and an evening, with room to spare. */
export const MAX_OPENINGS_A_DAY = 4

const customGrams = z.number({ error: 'Enter grams of ethanol for the custom standard drink.' })
  .min(1, { error: 'A standard drink must be between 1 and 30 g.' }).max(30, { error: 'A standard drink must be between 1 and 30 g.' })

/** A plain phone number as people write one: "+1 207 555 0143", "(07) 5550 1234", "020-7946-0000". */
const phoneField = z.string({ error: 'Enter a phone number, or leave it empty.' }).trim().superRefine((s, ctx) => {
  if (!s) return
  const message = s.length < 6 || s.length > 40
    ? 'A phone number has 6 to 40 characters.'
    : !/^\+?[\d ()-]+$/.test(s)
        ? 'Use digits, spaces, brackets and -, with + only first, like +1 207 555 0143.'
        : (s.match(/\d/g)?.length ?? 0) < 6 ? 'A phone number has at least 6 digits.' : null
  if (message) ctx.addIssue({ code: 'custom', message })
})

const anEmail = z.email()
const contactEmailField = z.string({ error: 'Enter an e-mail address, or leave it empty.' }).trim().toLowerCase()
  .max(254, { error: 'That e-mail address is too long.' })
  .refine(s => !s || anEmail.safeParse(s).success, { error: 'Enter an e-mail address like hello@example.com, or leave it empty.' })

function isWebAddress(s: string): boolean {
  if (!/^https?:\/\//i.test(s)) return false
  try {
    const url = new URL(s)
    return url.hostname.includes('.') && !url.username && !url.password
  }
  catch { return false }
}

const websiteField = z.string({ error: 'Enter a web address, or leave it empty.' }).trim()
  .max(300, { error: 'Use at most 300 characters for the web address.' })
  .refine(s => !s || isWebAddress(s), { error: 'Enter the full address, starting with https://, like https://example.com, or leave it empty.' })

const HH_MM = /^(?:[01]\d|2[0-3]):[0-5]\d$/
const timeOfDay = (what: string) => z.string({ error: `Enter the ${what} time.` }).regex(HH_MM, { error: `Enter the ${what} time as hours and minutes, like 09:30.` })

/** Both times well formed: only then is the order of a span, or an overlap, worth a message. */
function isSpan(s: unknown): s is OpeningSpan {
  const { opens, closes } = (s && typeof s === 'object' ? s : {}) as Record<string, unknown>
  return typeof opens === 'string' && typeof closes === 'string' && HH_MM.test(opens) && HH_MM.test(closes)
}

const spanSchema = z.object({ opens: timeOfDay('opening'), closes: timeOfDay('closing') }, { error: 'Give an opening and a closing time.' })
  .refine(s => !isSpan(s) || s.closes > s.opens, { path: ['closes'], error: 'Closing must be after opening, on the same day.' })

/** One day's openings, in any order; each is checked against the ones before it for overlaps. */
const daySchema = z.array(spanSchema, { error: 'Give the day\'s openings as a list.' })
  .max(MAX_OPENINGS_A_DAY, { error: `Use at most ${MAX_OPENINGS_A_DAY} openings a day.` })
  .superRefine((spans, ctx) => {
    spans.forEach((s, j) => {
      const earlier = isSpan(s) && spans.slice(0, j).find(o => isSpan(o) && o.opens < s.closes && s.opens < o.closes)
      if (earlier) ctx.addIssue({ code: 'custom', path: [j, 'opens'], message: `This overlaps ${earlier.opens}–${earlier.closes}.` })
    })
  })
  .optional()

const byStart = (a: OpeningSpan, b: OpeningSpan) => a.opens.localeCompare(b.opens)

/** Opening hours per weekday; a day without openings is closed. Stored with open days only, openings in order; none at all is null. */
const openingHoursField = z.object(Object.fromEntries(WEEKDAYS.map(d => [d, daySchema])) as Record<Weekday, typeof daySchema>, { error: 'Give the opening hours per day of the week.' })
  .nullable()
  .transform((hours): OpeningHours | null => {
    if (!hours) return null
    const open = WEEKDAYS.flatMap(d => (hours[d]?.length ? [[d, hours[d].map(({ opens, closes }) => ({ opens, closes })).sort(byStart)] as const] : []))
    return open.length ? Object.fromEntries(open) : null
  })

export const venueSchema = z.object({
  name: z.string({ error: 'Enter the venue name.' }).trim().min(1, { error: 'Enter the venue name.' }).max(120, { error: 'Use at most 120 characters.' }),
  address: z.string({ error: 'Enter the address.' }).trim().min(1, { error: 'Enter the address.' }).max(400, { error: 'Use at most 400 characters.' }),
  phone: phoneField,
  email: contactEmailField,
  website: websiteField,
  openingHours: openingHoursField,
  locale: z.enum(VENUE_LOCALE_CODES, { error: 'Choose one of the languages and regions offered.' }),
  /** Where the venue is (left out: unchanged): chooses the cards' paper unless `cardPaper` is set. */
  country: z.string({ error: 'Choose a country.' }).trim().toUpperCase().refine(isKnownCountry, { error: 'Choose a country from the list (an ISO 3166 code, like US or PT).' }).optional(),
  /** The cards' paper; null: the usual paper of the venue's country. */
  cardPaper: z.enum(CARD_PAPERS, { error: 'Choose A5, US half letter or the country\'s usual paper.' }).nullable().optional(),
  timeZone: z.string({ error: 'Choose a time zone.' }).trim().transform((zone, ctx) => {
    const known = canonicalTimeZone(zone)
    if (known) return known
    ctx.addIssue({ code: 'custom', message: 'Choose a time zone from the list, like Europe/Lisbon or America/New_York.' })
    return z.NEVER
  }),
  currency: z.string({ error: 'Choose a currency.' }).trim().toUpperCase().refine(isKnownCurrency, { error: 'Choose a currency from the list: an ISO 4217 code, like EUR or USD.' }),
  legalAge: z.number({ error: 'Enter the legal drinking age as a number.' }).int({ error: 'Use a whole number of years.' }).min(16, { error: 'The legal drinking age must be between 16 and 25.' }).max(25, { error: 'The legal drinking age must be between 16 and 25.' }),
  volumeUnit: z.enum(['ml', 'floz'], { error: 'Choose mL or US fl oz.' }),
  temperatureUnit: z.enum(['c', 'f'], { error: 'Choose °C or °F.' }),
  standardDrinkKind: z.enum(['us', 'uk', 'au', 'custom'], { error: 'Choose a standard-drink definition.' }),
  /** Read only for a custom definition; the named ones fix the grams. */
  standardDrinkGrams: z.unknown().optional(),
  guestEthanolLimitGrams: z.number({ error: 'Enter grams of ethanol.' }).min(1, { error: 'The per-guest limit must be between 1 and 200 g.' }).max(200, { error: 'The per-guest limit must be between 1 and 200 g.' }),
  cancellationCutoffHours: z.number({ error: 'Enter hours.' }).int({ error: 'Use whole hours.' }).min(0, { error: 'Use 0 to 720 hours.' }).max(720, { error: 'Use 0 to 720 hours.' }),
  /** The venue's own lines, after the fixed block the product always prints (shared/cautions.ts); may be empty. */
  cautions: z.string({ error: 'Enter your own cautions, one per line, or leave them empty.' }).trim().max(4000, { error: 'Use at most 4000 characters.' }),
  /** The room's usual air (left out: unchanged); the air in °C, its range told in the venue's unit below. */
  roomHumidityPct: humidityField.optional(),
  roomAirTempC: z.number({ error: 'Enter the room\'s usual air temperature.' }).optional(),
}).superRefine((v, ctx) => {
  // Checked even when other fields failed, so every bad field is named at once; the unit is the one
  // this same body sets (°C when that field is itself bad).
  const { roomAirTempC: t, temperatureUnit } = (v && typeof v === 'object' ? v : {}) as Record<string, unknown>
  if (typeof t === 'number' && Number.isFinite(t) && !airTempInRange(t)) {
    ctx.addIssue({ code: 'custom', path: ['roomAirTempC'], message: airTempMessage(temperatureUnit === 'f' ? 'f' : 'c') })
  }
}, { when: () => true }).transform((parsed, ctx) => {
  const v = parsed.roomAirTempC === undefined ? parsed : { ...parsed, roomAirTempC: toTenth(parsed.roomAirTempC) }
  if (v.standardDrinkKind !== 'custom') return { ...v, standardDrinkGrams: STANDARD_DRINK_GRAMS[v.standardDrinkKind] }
  const grams = customGrams.safeParse(v.standardDrinkGrams)
  if (!grams.success) {
    ctx.addIssue({ code: 'custom', path: ['standardDrinkGrams'], message: grams.error.issues[0]?.message ?? 'Enter grams of ethanol.' })
    return z.NEVER
  }
  return { ...v, standardDrinkGrams: grams.data }
})

export type VenueInput = z.input<typeof venueSchema>
