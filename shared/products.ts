import type { LiquidColour } from './liquidColours'

export const PRODUCT_KINDS = ['still_wine', 'sparkling', 'fortified', 'spirit', 'beer', 'cider', 'low_alcohol', 'other'] as const
export type ProductKind = (typeof PRODUCT_KINDS)[number]
export const PRODUCT_KIND_LABELS: Record<ProductKind, string> = {
  still_wine: 'Still wine',
  sparkling: 'Sparkling wine',
  fortified: 'Fortified wine',
  spirit: 'Spirit',
  beer: 'Beer',
  cider: 'Cider',
  low_alcohol: 'Low or no alcohol',
  other: 'Other',
}

export const PRODUCT_STATUSES = ['active', 'retired'] as const
export type ProductStatus = (typeof PRODUCT_STATUSES)[number]

/** Allergens a label must declare in the EU (Regulation 1169/2011, Annex II) and sulfites over 10 mg/L. */
export const ALLERGENS = ['sulfites', 'gluten', 'milk', 'egg', 'fish', 'nuts', 'soy', 'celery', 'mustard', 'sesame', 'lupin', 'molluscs', 'crustaceans', 'peanuts'] as const
export type Allergen = (typeof ALLERGENS)[number]

/** The fields that describe a product, as the catalogue, the lab sheet and the demo give them. */
export interface ProductFields {
  code: string
  kind: ProductKind
  name: string
  producer: string
  vintageOrBatch: string | null
  /** The liquid's colour in the trade's words; null: the kind's usual colour (shared/liquidColours.ts). */
  colour: LiquidColour | null
  servingTempC: number
  allergens: Allergen[]
  bottleSizeMl: number
}

/** Most products the public glass page explains: a page a guest reads, not the whole cellar. */
export const GLASS_PAGE_PRODUCTS_MAX = 24
