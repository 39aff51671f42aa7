import { z } from './zod'

/** Standard-drink definitions in grams of ethanol: NIAAA (US), NHS unit (UK), Australian guidelines. */
export const STANDARD_DRINK_GRAMS = { us: 14, uk: 8, au: 10 } as const
export const STANDARD_DRINK_LABELS = {
  us: 'United States: 14 g (NIAAA)',
  uk: 'United Kingdom unit: 8 g (NHS)',
  au: 'Australia: 10 g',
  custom: 'Custom grams',
} as const

function isIanaZone(zone: string): boolean {
  try { new Intl.DateTimeFormat('en', { timeZone: zone }); return zone.includes('/') || zone === 'UTC' }
  catch { return false }
}

function isCurrency(code: string): boolean {
  try { new Intl.NumberFormat('en', { style: 'currency', currency: code }); return /^[A-Z]{3}$/.test(code) }
  catch { return false }
}

const customGrams = z.number({ error: 'Enter grams of ethanol for the custom standard drink.' })
  .min(1, { error: 'A standard drink must be between 1 and 30 g.' }).max(30, { error: 'A standard drink must be between 1 and 30 g.' })

export const venueSchema = z.object({
  name: z.string({ error: 'Enter the venue name.' }).trim().min(1, { error: 'Enter the venue name.' }).max(120, { error: 'Use at most 120 characters.' }),
  address: z.string({ error: 'Enter the address.' }).trim().min(1, { error: 'Enter the address.' }).max(400, { error: 'Use at most 400 characters.' }),
  timeZone: z.string({ error: 'Choose a time zone.' }).refine(isIanaZone, { error: 'Use an IANA time zone name, like Europe/Lisbon or America/New_York.' }),
  currency: z.string({ error: 'Enter a currency code.' }).trim().toUpperCase().refine(isCurrency, { error: 'Use a three-letter ISO 4217 currency code, like EUR or USD.' }),
  legalAge: z.number({ error: 'Enter the legal drinking age as a number.' }).int({ error: 'Use a whole number of years.' }).min(16, { error: 'The legal drinking age must be between 16 and 25.' }).max(25, { error: 'The legal drinking age must be between 16 and 25.' }),
  volumeUnit: z.enum(['ml', 'floz'], { error: 'Choose mL or US fl oz.' }),
  temperatureUnit: z.enum(['c', 'f'], { error: 'Choose °C or °F.' }),
  standardDrinkKind: z.enum(['us', 'uk', 'au', 'custom'], { error: 'Choose a standard-drink definition.' }),
  /** Read only for a custom definition; the named ones fix the grams. */
  standardDrinkGrams: z.unknown().optional(),
  guestEthanolLimitGrams: z.number({ error: 'Enter grams of ethanol.' }).min(1, { error: 'The per-guest limit must be between 1 and 200 g.' }).max(200, { error: 'The per-guest limit must be between 1 and 200 g.' }),
  cancellationCutoffHours: z.number({ error: 'Enter hours.' }).int({ error: 'Use whole hours.' }).min(0, { error: 'Use 0 to 720 hours.' }).max(720, { error: 'Use 0 to 720 hours.' }),
  cautions: z.string({ error: 'Enter the cautions guests see.' }).trim().min(1, { error: 'Enter the cautions guests see.' }).max(4000, { error: 'Use at most 4000 characters.' }),
}).transform((v, ctx) => {
  if (v.standardDrinkKind !== 'custom') return { ...v, standardDrinkGrams: STANDARD_DRINK_GRAMS[v.standardDrinkKind] }
  const grams = customGrams.safeParse(v.standardDrinkGrams)
  if (!grams.success) {
    ctx.addIssue({ code: 'custom', path: ['standardDrinkGrams'], message: grams.error.issues[0]?.message ?? 'Enter grams of ethanol.' })
    return z.NEVER
  }
  return { ...v, standardDrinkGrams: grams.data }
})

export type VenueInput = z.input<typeof venueSchema>
