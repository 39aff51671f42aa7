/** Lab-sheet CSV formats the importer accepts; the header row names the columns (any order). */
export const LAB_SHEETS = {
  products: {
    label: 'New products, each with its first measurement',
    required: ['code', 'kind', 'name', 'producer', 'abv_pct_vol', 'residual_sugar_g_l', 'serving_temp_c', 'bottle_ml', 'cost_per_bottle', 'lab', 'method', 'measured_on'],
    optional: ['vintage', 'colour', 'allergens', 'notes'],
  },
  measurements: {
    label: 'New measurements of products already on the list',
    required: ['code', 'abv_pct_vol', 'residual_sugar_g_l', 'lab', 'method', 'measured_on'],
    optional: ['notes'],
  },
} as const
export type LabSheetKind = keyof typeof LAB_SHEETS

export interface LabSheetRow {
  /** Line number in the file (the header is line 1). */
  line: number
  code: string
  /** Column → message. Empty when the row can be imported. */
  errors: Record<string, string>
  /** What will be written, for the preview table. */
  summary: { name?: string, kind?: string, abvPctVol?: number, residualSugarGL?: number, measuredOn?: string }
}

export interface LabSheetCheck {
  sheet: LabSheetKind
  missingColumns: string[]
  unknownColumns: string[]
  rows: LabSheetRow[]
  validCount: number
}

/** One line of the preview stream: progress while checking, then the whole result. */
export type LabSheetStreamLine
  = | { type: 'progress', done: number, total: number }
    | { type: 'result', result: LabSheetCheck }
    | { type: 'error', message: string }

export const LAB_SHEET_MAX_BYTES = 5 * 1024 * 1024
export const LAB_SHEET_MAX_ROWS = 20_000
