/**
 * Small pieces of the flight card's wording that the PDF and the print page both set, so the two
 * cannot drift apart.
 */
import type { CardPour, FlightCard } from './types/cards'

/**
 * A pour's facts after its name: vintage or batch, strength, the pour and its temperature — and
 * its producer unless the venue's own ("Saltmarsh & Vine" at Saltmarsh & Vine Tasting Room). The
 * kind of drink is on the pour page; standard drinks are in the card's table, allergens in one line.
 */
export function cardFacts(card: Pick<FlightCard, 'venue'>, pour: CardPour): string {
  const own = card.venue.name.toLowerCase().startsWith(pour.producer.toLowerCase())
  return [own ? null : pour.producer, pour.vintageOrBatch, pour.abvText, `${pour.volumeText} at ${pour.servedAtText}`].filter(Boolean).join(' · ')
}

/** "Allergens — sulfites: pours 1, 2, 3; milk: pour 6." once for the card, or null when none are declared. */
export function cardAllergens(card: Pick<FlightCard, 'pours'>): string | null {
  const by = new Map<string, number[]>()
  for (const p of card.pours) for (const a of p.allergens) by.set(a, [...(by.get(a) ?? []), p.position])
  if (!by.size) return null
  const list = [...by].map(([a, ps]) => `${a}: pour${ps.length > 1 ? 's' : ''}\u00a0${ps.join(', ')}`)
  return `Allergens — ${list.join('; ')}.`
}

/** A sentence's lead up to its colon ("Highest climb of the flight:"), set in semibold; none past 60 characters. */
export function leadSplit(text: string): { lead: string, rest: string } {
  const colon = text.indexOf(': ')
  if (colon < 0 || colon > 60) return { lead: '', rest: text }
  return { lead: text.slice(0, colon + 1), rest: text.slice(colon + 1) }
}

/**
 * Spaces that may not break a line: between a figure and its unit ("4.7–6.2 mm/s", "2:00 PM",
 * "3.0 fl oz", "12.5 % ABV") and inside "fl oz". Text laid out for print goes through this, so a
 * unit never starts a line on its own.
 */
export function bindUnits(text: string): string {
  return text
    .replace(/(\d) (?=(?:mm\/s|mm|cm|µm|s|min|h|g\/L|g|kg|%|°[CF]|fl oz|mL|L|AM|PM|mPa·s|mN\/m)(?![\p{L}\d]))/gu, '$1\u00a0')
    .replace(/\bfl oz\b/g, 'fl\u00a0oz')
    .replace(/% ABV\b/g, '%\u00a0ABV')
}

/**
 * bindUnits for a web page, where a browser may also break after the en dash of a range
 * ("11–" ⏎ "35 mm"): word joiners hold a range's ends to its dash. (Not for the PDF, whose font has
 * no glyph for the joiner and whose layout breaks only at spaces.)
 */
export function bindUnitsWeb(text: string): string {
  return bindUnits(text).replace(/(\d)–(\d)/g, '$1\u2060–\u2060$2')
}
