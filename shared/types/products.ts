import type { LabSheetKind } from '../labSheet'
import type { ProductFields, ProductStatus } from '../products'
import type { RoomAir, TearPrediction } from '../science'

/** One lab measurement of a product. */
export interface MeasurementView {
  id: number
  abvPctVol: number
  residualSugarGL: number
  lab: string
  method: string
  /** Calendar date YYYY-MM-DD. */
  measuredOn: string
  notes: string | null
  recordedAt: string
}

/** A product as staff see it (GET /api/products, /api/products/[id]); cost for managers only. */
export interface ProductView extends ProductFields {
  id: number
  costPerBottleMinor: number | null
  status: ProductStatus
  updatedAt: string
  current: MeasurementView
  /** The whole history, newest first (one product only). */
  history?: MeasurementView[]
  /** What the glass model derives for a default tasting pour at the serving temperature. */
  derived: {
    tastingPourMl: number
    ethanolGramsPerPour: number
    standardDrinksPerPour: number
    filmActivityIndex: number
    tearsExpected: boolean
    /** The whole prediction for that pour, ranges included. */
    predictions: TearPrediction
    /** The room's air the prediction was computed for. */
    room: RoomAir
  }
}

/** A product as the list shows it: its fields and figures, without the model's whole prediction. */
export interface ProductListItem extends Omit<ProductView, 'history' | 'derived'> {
  derived: Omit<ProductView['derived'], 'predictions' | 'room'>
}

/** GET /api/products: one page of the catalogue under the query's filters, and how many match. */
export interface ProductPage {
  items: ProductListItem[]
  page: number
  pageSize: number
  total: number
  /** Products of the venue by status, whatever the filters (the list's "Show" choice). */
  counts: { active: number, retired: number }
}

/** What importing a lab sheet wrote (POST /api/imports/commit). */
export interface LabSheetImported { imported: number, sheet: LabSheetKind }
