import { z } from './zod'
import { LAB_SHEET_MAX_BYTES } from '../labSheet'

export const labSheetUploadSchema = z.object({
  sheet: z.enum(['products', 'measurements'], { error: 'Choose the kind of sheet: products or measurements.' }),
  csv: z.string({ error: 'Attach a CSV file.' }).min(1, { error: 'The file is empty.' })
    .max(LAB_SHEET_MAX_BYTES, { error: `The file is larger than ${LAB_SHEET_MAX_BYTES / 1024 / 1024} MB.` }),
})

export const labSheetCommitSchema = labSheetUploadSchema.extend({
  lines: z.array(z.number().int().min(2), { error: 'Choose the rows to import.' }).min(1, { error: 'Choose at least one row.' }).max(20_000),
})
