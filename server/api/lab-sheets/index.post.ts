import type { LabSheetImported } from '../../../shared/types/products'
import { labSheetCommitSchema } from '../../../shared/schemas/imports'

/** Re-checks the sheet and writes the chosen rows in one transaction (all or nothing). */
export default defineEventHandler(async (event): Promise<LabSheetImported> => {
  await requireRole(event, 'manager')
  const { sheet, csv, lines } = await readBodyAs(event, labSheetCommitSchema)
  const venue = await getVenue()
  const checked = await checkLabSheet(csv, sheet, venue)
  const imported = await commitLabSheet(checked, lines, venue.id)
  setResponseStatus(event, 201)
  return { imported, sheet }
})
