import type { ObservationComparison, ObservationSource, RoomSource, SeenInGlass, TearSpeed } from '../observations'
import type { GroupCalibration } from '../science/calibration'

/** A 10–90 % range of the model. */
export interface RangeView { low: number, high: number }

/** One observation with the model's prediction for it and how they compare (the list, the CSV, the chart). */
export interface ObservationRow {
  id: number
  recordedAt: string
  source: ObservationSource
  demo: boolean
  flight: { id: number, name: string }
  position: number | null
  product: { id: number, name: string }
  glass: { id: number, name: string }
  sessionId: number | null
  sessionStartsAt: string | null
  /** The pour's numbers when it was seen. */
  abvPctVol: number
  residualSugarGL: number
  servingTempC: number
  volumeMl: number
  room: { relativeHumidityPct: number, airTempC: number, source: RoomSource }
  seen: SeenInGlass
  /** The model's published-default prediction for these numbers, glass and room. */
  predicted: {
    tearsExpected: boolean
    bandVisible: boolean
    band: RangeView | null
    speed: RangeView | null
    around: RangeView | null
  }
  comparison: ObservationComparison
  /** Flags in words (kept, shown, left out of the calibration). */
  flags: string[]
  /** Why it is an outlier: flagged, or a band far outside its range; null when it is neither. */
  outlier: string | null
}

/** Counts for one product, glass or flight. */
export interface AgreementStats {
  id: number
  name: string
  observations: number
  devices: number
  /** Band readings compared with a range, and how many fell inside. */
  band: { compared: number, inside: number }
  speed: { compared: number, inside: number }
  tears: { compared: number, agree: number }
  flagged: number
}

/** One product on the charts: its observations and the model's range at its pours' numbers. */
export interface ChartProduct {
  productId: number
  name: string
  abvPctVol: number
  /** Median of the predicted band ranges of its observations (mm); null when the model has no band. */
  band: RangeView | null
  speed: RangeView | null
  /** Observed band heights (mm; 0 for "no clear band"), unflagged. */
  bandSeen: number[]
  /** Observed speed bins, unflagged. */
  speedSeen: Record<TearSpeed, number>
}

/** One glass (or glass in one room) in the calibration panel. */
export interface CalibrationPanelRow extends GroupCalibration {
  glassName: string
  /** 'applied' and the venue's switch on: cards and pour pages use it. */
  inUse: boolean
  /** Since when the cards have used it (the moment the fit that applied it was made); null when not in use. */
  inUseSince: string | null
  /** Why not in use, in words; null when in use. */
  whyNot: string | null
}

export interface ObservationSummary {
  total: number
  /** Invented demo observations among them. */
  demo: number
  flagged: number
  byProduct: AgreementStats[]
  byGlass: AgreementStats[]
  byFlight: AgreementStats[]
  chart: ChartProduct[]
  /** The charts' text equivalents, one line per product: band heights, tear speeds. */
  chartText: { band: string[], speed: string[] }
  /** Flagged or far-off readings, newest first; one device's repeated entries at one pour and session shown once with their count. */
  outliers: { row: ObservationRow, entries: number }[]
  calibration: { enabled: boolean, groups: CalibrationPanelRow[] }
}

export interface ObservationPage {
  rows: ObservationRow[]
  page: number
  pageSize: number
  total: number
}
