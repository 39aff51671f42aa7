/**
 * Demo data: a fictional tasting room and its people, invented for Larmoir. Loaded only when the
 * database is empty and NUXT_DEMO_SEED is on (the start command sets it).
 */
import type { ProductFields } from '../../shared/products'

export const DEMO_PASSWORD = 'demo-tasting-2026'

export const DEMO_VENUE = {
  name: 'Saltmarsh & Vine Tasting Room',
  address: '7 Heron Quay, Wrenfield, ME 04999, USA',
  timeZone: 'America/New_York',
  locale: 'en-US',
  country: 'US',
  currency: 'USD',
  legalAge: 21,
  volumeUnit: 'floz' as const,
  temperatureUnit: 'f' as const,
  standardDrinkKind: 'us' as const,
  standardDrinkGrams: 14,
  guestEthanolLimitGrams: 42,
  cancellationCutoffHours: 24,
  // The venue's own lines only: legal age, driving, pregnancy, medicines and local law are the
  // fixed block the product prints before them (shared/cautions.ts).
  cautions: [
    'Water is on every table: a glass between pours keeps the palate fresh.',
    'Ask at the bar for a taxi; the Heron Quay bus stops outside until 10 pm.',
  ].join('\n'),
  // 555-01xx numbers are reserved for fiction (North American Numbering Plan); .test is reserved (RFC 2606).
  phone: '+1 207 555 0143',
  email: 'hello@saltmarsh.test',
  website: 'https://saltmarsh.test',
  openingHours: {
    thu: [{ opens: '12:00', closes: '19:00' }],
    fri: [{ opens: '12:00', closes: '21:00' }],
    sat: [{ opens: '11:00', closes: '21:00' }],
    sun: [{ opens: '11:00', closes: '17:00' }],
  },
  // A room by the sea: damper than the model's default, a little cooler (invented, like the venue).
  roomHumidityPct: 62,
  roomAirTempC: 20.5,
}

export const DEMO_USERS = [
  { email: 'manager@saltmarsh.test', name: 'Odile Brannock', role: 'manager' as const, dateOfBirth: null },
  { email: 'host@saltmarsh.test', name: 'Teodor Vasko', role: 'host' as const, dateOfBirth: null },
  { email: 'marketing@saltmarsh.test', name: 'Priya Lindqvist', role: 'marketing' as const, dateOfBirth: null },
  { email: 'guest@saltmarsh.test', name: 'Maren Achterberg', role: 'guest' as const, dateOfBirth: '1988-04-17' },
]

export interface DemoProduct extends ProductFields {
  costPerBottleMinor: number
  abvPctVol: number
  residualSugarGL: number
}

const LAB = { lab: 'Wrenfield Cellar Lab (demo)', method: 'Ebulliometry / enzymatic glucose-fructose' }
export const DEMO_LAB = LAB

export const DEMO_PRODUCTS: DemoProduct[] = [
  { code: 'SV-CID-21', kind: 'cider', name: 'Orchard Gate Dry Cider', producer: 'Saltmarsh & Vine', vintageOrBatch: 'Batch 21', colour: 'pale_straw', servingTempC: 8, allergens: ['sulfites'], bottleSizeMl: 750, costPerBottleMinor: 900, abvPctVol: 6.2, residualSugarGL: 4 },
  { code: 'SV-ALB-24', kind: 'still_wine', name: 'Tidewater Albariño', producer: 'Saltmarsh & Vine', vintageOrBatch: '2024', colour: 'straw', servingTempC: 9, allergens: ['sulfites'], bottleSizeMl: 750, costPerBottleMinor: 1400, abvPctVol: 12.5, residualSugarGL: 2.1 },
  { code: 'SV-SPK-22', kind: 'sparkling', name: 'Heron Quay Brut', producer: 'Saltmarsh & Vine', vintageOrBatch: '2022', colour: 'gold', servingTempC: 7, allergens: ['sulfites'], bottleSizeMl: 750, costPerBottleMinor: 2100, abvPctVol: 11.8, residualSugarGL: 8 },
  { code: 'SV-CF-23', kind: 'still_wine', name: 'Driftwood Cabernet Franc', producer: 'Saltmarsh & Vine', vintageOrBatch: '2023', colour: 'ruby', servingTempC: 16, allergens: ['sulfites'], bottleSizeMl: 750, costPerBottleMinor: 1700, abvPctVol: 13.6, residualSugarGL: 1.5 },
  { code: 'SV-FOR-19', kind: 'fortified', name: 'Low Tide Fortified Red', producer: 'Saltmarsh & Vine', vintageOrBatch: '2019', colour: 'garnet', servingTempC: 16, allergens: ['sulfites'], bottleSizeMl: 500, costPerBottleMinor: 2300, abvPctVol: 19.5, residualSugarGL: 98 },
  { code: 'SV-GIN-07', kind: 'spirit', name: 'Marsh Samphire Gin', producer: 'Saltmarsh & Vine Still', vintageOrBatch: 'Batch 7', colour: 'water_white', servingTempC: 18, allergens: [], bottleSizeMl: 700, costPerBottleMinor: 1900, abvPctVol: 43, residualSugarGL: 0 },
]

/**
 * Glass shapes every new venue starts with; the manager edits them. Dimensions are typical of
 * each style (common practice, no source).
 */
export const DEFAULT_GLASSES = [
  { name: 'Tulip wine glass', bowlDiameterMm: 84, wallAngleDeg: 78, fillHeightMm: 38 },
  { name: 'Flute', bowlDiameterMm: 52, wallAngleDeg: 86, fillHeightMm: 70 },
  { name: 'Nosing glass', bowlDiameterMm: 62, wallAngleDeg: 70, fillHeightMm: 22 },
  { name: 'Stemless tasting tumbler', bowlDiameterMm: 70, wallAngleDeg: 84, fillHeightMm: 30 },
]

/** Demo flights: pours by product code, glass by name, volume mL, serving °C. */
export const DEMO_FLIGHTS = [
  {
    name: 'Shoreline Flight',
    summary: 'From a dry cider to our samphire gin: six pours, lightest to strongest, each with its own show on the glass.',
    publish: true,
    pours: [
      { code: 'SV-CID-21', glass: 'Stemless tasting tumbler', volumeMl: 90, servingTempC: 8 },
      { code: 'SV-SPK-22', glass: 'Flute', volumeMl: 60, servingTempC: 7 },
      { code: 'SV-ALB-24', glass: 'Tulip wine glass', volumeMl: 60, servingTempC: 10 },
      { code: 'SV-CF-23', glass: 'Tulip wine glass', volumeMl: 60, servingTempC: 16 },
      { code: 'SV-FOR-19', glass: 'Nosing glass', volumeMl: 45, servingTempC: 16 },
      { code: 'SV-GIN-07', glass: 'Nosing glass', volumeMl: 15, servingTempC: 18 },
    ],
  },
  {
    name: 'After Dark (in the works)',
    summary: 'A short, stronger flight for evening sessions.',
    publish: false,
    pours: [{ code: 'SV-CF-23', glass: 'Tulip wine glass', volumeMl: 60, servingTempC: 17 }, { code: 'SV-FOR-19', glass: 'Nosing glass', volumeMl: 45, servingTempC: 16 }, { code: 'SV-GIN-07', glass: 'Nosing glass', volumeMl: 20, servingTempC: 18 }],
  },
]

/** Weekly demo sessions of the published flight, from the coming week on. */
export const DEMO_SESSION_SERIES = [
  { weekday: 6, startTime: '14:00', weeks: 8, durationMinutes: 75, seats: 12, priceMinor: 3500, bookingCutoffMinutes: 120 },
  { weekday: 5, startTime: '18:30', weeks: 4, durationMinutes: 60, seats: 8, priceMinor: 3000, bookingCutoffMinutes: 60 },
]
