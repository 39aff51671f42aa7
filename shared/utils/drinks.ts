/** "1 standard drink", "2.4 standard drinks" under the venue's definition. */
export function standardDrinksText(n: number): string {
  const v = Math.round(n * 10) / 10
  return `${v} standard drink${v === 1 ? '' : 's'}`
}

/** "US standard drink = 14 g of ethanol" */
export function standardDrinkDefinition(venue: { standardDrinkKind: string, standardDrinkGrams: number }): string {
  const name = ({ us: 'US standard drink', uk: 'UK unit', au: 'Australian standard drink', custom: 'standard drink' } as Record<string, string>)[venue.standardDrinkKind] ?? 'standard drink'
  return `one ${name} = ${venue.standardDrinkGrams} g of ethanol`
}

/** The standard-drinks line of the cautions: "This flight holds 2.9 standard drinks per guest (one US standard drink = 14 g of ethanol)." */
export function standardDrinksLine(what: 'flight' | 'pour', n: number, venue: { standardDrinkKind: string, standardDrinkGrams: number }): string {
  return `This ${what} holds ${standardDrinksText(n)}${what === 'flight' ? ' per guest' : ''} (${standardDrinkDefinition(venue)}).`
}
