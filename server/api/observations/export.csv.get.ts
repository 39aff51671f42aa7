import Papa from 'papaparse'
import { DateTime } from 'luxon'
import { observationFilterSchema } from '../../../shared/schemas/observationAnalysis'
import type { RangeView } from '../../../shared/types/observationAnalysis'

/** A cell a spreadsheet would run as a formula gets a leading apostrophe (OWASP, CSV injection). */
const safeText = (v: string) => (/^[=+\-@\t\r]/.test(v) ? `'${v}` : v)
const low = (r: RangeView | null) => (r ? r.low.toFixed(2) : '')
const high = (r: RangeView | null) => (r ? r.high.toFixed(2) : '')

const OBSERVATION_CSV_FIELDS = [
  'Observation', 'Recorded at', 'Source', 'Demo', 'Flight', 'Pour', 'Product', 'ABV % vol', 'Residual sugar g/L', 'Serving °C', 'Volume mL',
  'Glass', 'Session', 'Session start', 'Room RH %', 'Room air °C', 'Room reading', 'Band mm', 'No clear band', 'Tears formed', 'Tears around',
  'Tear speed', 'Minutes since', 'Since', 'Predicted band low mm', 'Predicted band high mm', 'Predicted speed low mm/s', 'Predicted speed high mm/s',
  'Predicted tears around low', 'Predicted tears around high', 'Tears expected', 'Band against range', 'Speed against range', 'Count against range',
  'Tears against model', 'Flags',
] as const

/** One row per observation under the page's filters, with the pour's numbers, the prediction then and the agreement. Times in the venue's zone. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'manager')
  const filters = await readQueryAs(event, observationFilterSchema)
  const venue = await getVenue()
  const rows = await loadObservationRows(venue, filters)
  const local = (iso: string) => DateTime.fromISO(iso, { zone: venue.timeZone }).toFormat('yyyy-MM-dd HH:mm')
  const data = rows.map(r => [
    r.id, local(r.recordedAt), r.source, r.demo ? 'yes' : 'no', safeText(r.flight.name), r.position ?? '', safeText(r.product.name), r.abvPctVol, r.residualSugarGL, r.servingTempC, r.volumeMl,
    safeText(r.glass.name), r.sessionId ?? '', r.sessionStartsAt ? local(r.sessionStartsAt) : '', r.room.relativeHumidityPct, r.room.airTempC, r.room.source,
    r.seen.bandHeightMm ?? '', r.seen.noClearBand ? 'yes' : 'no', r.seen.tearsFormed, r.seen.tearCount ?? '', r.seen.tearSpeed ?? '', r.seen.minutesSince, r.seen.since,
    low(r.predicted.band), high(r.predicted.band), low(r.predicted.speed), high(r.predicted.speed), r.predicted.around ? Math.round(r.predicted.around.low) : '', r.predicted.around ? Math.round(r.predicted.around.high) : '',
    r.predicted.tearsExpected ? 'yes' : 'no', r.comparison.band, r.comparison.speed, r.comparison.count, r.comparison.tears, safeText(r.flags.join('; ')),
  ])
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="observations-${DateTime.now().setZone(venue.timeZone).toISODate()}.csv"`)
  return Papa.unparse({ fields: [...OBSERVATION_CSV_FIELDS], data }, { newline: '\r\n' })
})
