import type { OpeningHours } from '../venue'
import type { CardPaper } from '../paper'

/** The venue's public settings, as GET /api/venue sends them (server/api/venue/index.get.ts). */
export interface PublicVenue {
  id: number
  name: string
  address: string
  /** IANA zone: every instant is UTC on the wire and shown in this zone. */
  timeZone: string
  /** BCP 47 locale of its dates, times and numbers. */
  locale: string
  /** ISO 3166-1 alpha-2 country: chooses the cards' paper unless `cardPaper` is set. */
  country: string
  /** The cards' paper the manager chose; null: the country's usual one (shared/paper.ts). */
  cardPaper: CardPaper | null
  /** ISO 4217 code; amounts are integer minor units of it. */
  currency: string
  legalAge: number
  volumeUnit: 'ml' | 'floz'
  temperatureUnit: 'c' | 'f'
  standardDrinkKind: 'us' | 'uk' | 'au' | 'custom'
  standardDrinkGrams: number
  guestEthanolLimitGrams: number
  cancellationCutoffHours: number
  /** The venue's own caution lines, after the fixed block (shared/cautions.ts). */
  cautions: string
  phone: string
  email: string
  website: string
  openingHours: OpeningHours | null
  /** The room's usual relative humidity, %: the glass model's air unless a host read the room for a session. */
  roomHumidityPct: number
  /** The room's usual air temperature, °C to a tenth (shown in `temperatureUnit`). */
  roomAirTempC: number
}
