import { labSheetUploadSchema } from '../../../shared/schemas/imports'
import type { LabSheetStreamLine } from '../../../shared/labSheet'

/**
 * Checks a lab sheet and streams progress as newline-delimited JSON while it works, then the
 * whole row-by-row result. Nothing is written.
 */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const { sheet, csv } = await readBodyAs(event, labSheetUploadSchema)
  const venue = await getVenue()
  const encoder = new TextEncoder()
  setResponseHeader(event, 'content-type', 'application/x-ndjson; charset=utf-8')
  setResponseHeader(event, 'cache-control', 'no-store')
  return new ReadableStream({
    async start(controller) {
      const send = (line: LabSheetStreamLine) => controller.enqueue(encoder.encode(`${JSON.stringify(line)}\n`))
      try {
        const { check } = await checkLabSheet(csv, sheet, venue, (done, total) => send({ type: 'progress', done, total }))
        send({ type: 'result', result: check })
      }
      catch (err) {
        send({ type: 'error', message: (err as { message?: string }).message ?? 'The sheet could not be checked.' })
      }
      controller.close()
    },
  })
})
