import type { CardFonts } from '../cards/cardPdf'
import { buildFlightCard, type FlightCard } from '../cards/cardData'
import type { Venue } from '../db/schema/venues'

let fonts: Promise<CardFonts> | undefined

/** The shipped Lora files, read once from the server's bundled assets. */
export function cardFonts(): Promise<CardFonts> {
  fonts ??= (async () => {
    const storage = useStorage('assets:fonts')
    const read = async (name: string) => {
      const raw = await storage.getItemRaw(name)
      if (!raw) throw new Error(`font ${name} is missing from the server bundle`)
      return Buffer.from(raw as ArrayBuffer)
    }
    return {
      regular: await read('lora-latin-400-normal.woff'),
      semibold: await read('lora-latin-600-normal.woff'),
      italic: await read('lora-latin-400-italic.woff'),
    }
  })()
  return fonts
}

/** The card of one flight as staff print it; guest names and session come from the caller. */
export async function flightCard(venue: Venue, flightId: number, extra: { guestName?: string | null, sessionLabel?: string | null } = {}): Promise<FlightCard> {
  const view = await flightView(venue, await loadFlight(venue, flightId))
  return buildFlightCard({ venue, flight: view, publicUrl: appLink(`/pour/${flightId}`), ...extra })
}
