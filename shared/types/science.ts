import type { ProductKind } from '../products'
import type { LiquidColour } from '../liquidColours'
import type { FilmResult, TearPrediction } from '../science'
import type { Range } from '../science/uncertainty'

/** Every quantity of the glass model for one pour, and the guest's sentences (GET /api/science/film). */
export interface FilmView extends FilmResult { description: string[] }

/** A venue product as the glass model sees it at its serving temperature (GET /api/science/products). */
export interface ProductOnCurve {
  id: number
  name: string
  kind: ProductKind
  producer: string
  vintageOrBatch: string | null
  /** The liquid's colour: the product's, or its kind's usual one. */
  colour: LiquidColour
  abvPctVol: number
  residualSugarGL: number
  servingTempC: number
  filmActivityIndex: number
  predictions: TearPrediction
  viscosity_mPa_s: number
  description: string[]
}

/** One pour on the curve chart: its label, ABV (% vol), index and the index's range. */
export interface CurveMark { label: string, abvPctVol: number, filmActivityIndex: number, indexRange?: Range | null }
