/**
 * The papers a flight card prints on, and which one a venue's country uses by default.
 * Kept apart from shared/cards.ts so that the database schema can name the papers without
 * loading the glass model.
 */
export const CARD_PAPERS = ['a5', 'half-letter'] as const
export type CardPaper = (typeof CARD_PAPERS)[number]
/**
 * Page sizes in PDF points (1/72 in): A5 is 148 × 210 mm (ISO 216), US half letter 5.5 × 8.5 in
 * (ANSI/ASME Y14.1). The print page sets the same sizes in CSS points, so both print alike.
 */
export const CARD_PAPER_POINTS: Record<CardPaper, { width: number, height: number, label: string, css: string }> = {
  'a5': { width: 419.53, height: 595.28, label: 'A5', css: 'A5' },
  'half-letter': { width: 396, height: 612, label: 'US half letter', css: '5.5in 8.5in' },
}

/**
 * Countries whose offices use US letter-size paper rather than ISO 216 (from memory: the United
 * States, Canada, Mexico, the Philippines, Chile, Colombia, Venezuela, Costa Rica, Guatemala,
 * the Dominican Republic, Puerto Rico). Their venues' cards default to half letter, every other
 * country's to A5.
 */
const LETTER_COUNTRIES = new Set(['US', 'CA', 'MX', 'PH', 'CL', 'CO', 'VE', 'CR', 'GT', 'DO', 'PR'])

/** The card paper a venue prints on: its manager's choice, else its country's usual one. */
export function venueCardPaper(venue: { country: string, cardPaper: CardPaper | null }): CardPaper {
  return venue.cardPaper ?? (LETTER_COUNTRIES.has(venue.country.toUpperCase()) ? 'half-letter' : 'a5')
}
