import { z } from './zod'
import { isoDateField } from './common'
import { OBSERVATION_SOURCES } from '../observations'

const idFilter = (name: string) => z.coerce.number({ error: `${name} must be a number.` }).int({ error: `${name} must be a whole number.` }).positive({ error: `${name} must be positive.` }).optional()

const filterFields = {
  productId: idFilter('productId'),
  glassId: idFilter('glassId'),
  flightId: idFilter('flightId'),
  from: isoDateField.optional(),
  to: isoDateField.optional(),
  source: z.enum(OBSERVATION_SOURCES, { error: 'source is guest or host.' }).optional(),
  /** Invented demo observations: included unless 'exclude'. */
  demo: z.enum(['include', 'exclude'], { error: 'demo is include or exclude.' }).default('include'),
}
const datesInOrder = { error: 'The end date must not be before the start date.', path: ['to'] }

/**
 * The manager's filters on observations, shared by the page, the summary and the CSV. Dates are the
 * venue's calendar days, both ends included.
 */
export const observationFilterSchema = z.object(filterFields).refine(q => !q.from || !q.to || q.from <= q.to, datesInOrder)
export type ObservationFilter = z.output<typeof observationFilterSchema>

export const OBSERVATION_PAGE_SIZE = 50

/** The list's filters and its page (from 1). */
export const observationListQuerySchema = z.object({
  ...filterFields,
  page: z.coerce.number({ error: 'page must be a number.' }).int({ error: 'page must be a whole number.' }).min(1, { error: 'Pages are numbered from 1.' }).max(10_000, { error: 'page is at most 10000.' }).default(1),
}).refine(q => !q.from || !q.to || q.from <= q.to, datesInOrder)

/** The venue's switch for calibrated predictions. */
export const calibrationSwitchSchema = z.object({
  enabled: z.boolean({ error: 'enabled is true or false.' }),
})
