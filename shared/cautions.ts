/**
 * The cautions of responsible service. A fixed block the product keeps on every guest page, the
 * booking form, the confirmation e-mail and every card — a manager cannot delete it — followed by
 * the venue's own lines from its settings. The wording defers to local law and licensed practice;
 * the lines are common practice of the trade (no single source), the driving line follows the
 * plain advice of road-safety bodies not to drink at all before driving.
 */
export interface CautionVenue {
  legalAge: number
  /** The venue's own extra lines, one per line. */
  cautions: string
}

export interface CautionOptions {
  /** "This flight holds 2.9 standard drinks per guest (one US standard drink = 14 g of ethanol)." */
  standardDrinksLine?: string | null
}

/** The lines the product always shows, in this order. */
export function fixedCautionLines(venue: Pick<CautionVenue, 'legalAge'>): string[] {
  return [
    `You must be ${venue.legalAge} or older to drink here, and every guest shows photo ID at the door.`,
    'If you are driving, please do not drink.',
    'If you are pregnant or could be, the safest choice is not to drink alcohol.',
    'Alcohol can interact with medicines: if you take any, ask your doctor or pharmacist before you taste.',
    'Hosts serve under local law and their licence, and may pour less or stop serving at any time.',
  ]
}

/**
 * The same five cautions in fewer words, for the flight card, where a page holds six pours: each
 * line says what its long form says (tests/unit/cautions.test.ts holds them together).
 */
export function shortFixedCautionLines(venue: Pick<CautionVenue, 'legalAge'>): string[] {
  return [
    `Guests must be ${venue.legalAge} or older, with photo ID.`,
    'Driving? Please do not drink.',
    'Pregnant or could be? The safest choice is no alcohol.',
    'On medicines? Ask your doctor or pharmacist before you taste.',
    'Hosts serve under local law and their licence, and may pour less or stop serving at any time.',
  ]
}

/** The venue's own lines, trimmed, blanks and repeats of the fixed block dropped. */
function venueCautionLines(venue: CautionVenue): string[] {
  const fixed = new Set(fixedCautionLines(venue).map(l => l.toLowerCase()))
  return venue.cautions.split('\n').map(s => s.trim()).filter(s => s && !fixed.has(s.toLowerCase()))
}

/** Every caution line: the standard drinks of what is poured (when known), the fixed block, then the venue's lines. */
export function cautionLines(venue: CautionVenue, opts: CautionOptions & { short?: boolean } = {}): string[] {
  return [...(opts.standardDrinksLine ? [opts.standardDrinksLine] : []), ...(opts.short ? shortFixedCautionLines(venue) : fixedCautionLines(venue)), ...venueCautionLines(venue)]
}
