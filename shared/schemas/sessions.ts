import { z } from './zod'
import { isoDateField } from './common'

const localTimeField = z.string({ error: 'Enter a start time as HH:MM.' }).regex(/^([01]\d|2[0-3]):[0-5]\d$/, { error: 'Enter a start time as HH:MM (24-hour).' })

/**
 * A session, or a weekly series of them, in the venue's local time. The server turns each local
 * start into a UTC instant with the time-zone library, so daylight-saving changes keep 14:00 at 14:00.
 */
export const sessionCreateSchema = z.object({
  flightId: z.number({ error: 'Choose a flight.' }).int().positive({ error: 'Choose a flight.' }),
  startDate: isoDateField,
  startTime: localTimeField,
  durationMinutes: z.number({ error: 'Enter the duration in minutes.' }).int({ error: 'Use whole minutes.' }).min(15, { error: 'A session lasts 15 to 480 minutes.' }).max(480, { error: 'A session lasts 15 to 480 minutes.' }),
  seats: z.number({ error: 'Enter the number of seats.' }).int({ error: 'Use a whole number of seats.' }).min(1, { error: 'A session has 1 to 200 seats.' }).max(200, { error: 'A session has 1 to 200 seats.' }),
  priceMinor: z.number({ error: 'Enter the price.' }).int({ error: 'The price is in minor units (whole cents).' }).min(0, { error: 'The price cannot be negative.' }).max(10_000_00, { error: 'That price is too large.' }),
  hostId: z.number().int().positive().nullish(),
  bookingCutoffMinutes: z.number({ error: 'Enter the booking cut-off in minutes.' }).int().min(0, { error: 'Use 0 to 10080 minutes.' }).max(10080, { error: 'Use 0 to 10080 minutes.' }).default(60),
  repeatWeeks: z.number({ error: 'Enter how many weeks.' }).int({ error: 'Use whole weeks.' }).min(1, { error: 'Repeat for 1 to 52 weeks.' }).max(52, { error: 'Repeat for 1 to 52 weeks.' }).default(1),
})
export type SessionCreateInput = z.input<typeof sessionCreateSchema>

export const sessionPatchSchema = z.object({
  durationMinutes: sessionCreateSchema.shape.durationMinutes.optional(),
  seats: sessionCreateSchema.shape.seats.optional(),
  priceMinor: sessionCreateSchema.shape.priceMinor.optional(),
  hostId: z.number().int().positive().nullable().optional(),
  bookingCutoffMinutes: z.number().int().min(0).max(10080).optional(),
  status: z.enum(['open', 'closed'], { error: 'Choose open or closed. Cancelling a session has its own action.' }).optional(),
}).refine(v => Object.keys(v).length > 0, { error: 'Change at least one field.' })

export const sessionListQuerySchema = z.object({
  from: isoDateField.optional(),
  to: isoDateField.optional(),
  flightId: z.coerce.number({ error: 'flightId must be a number.' }).int().positive().optional(),
  status: z.enum(['open', 'closed', 'cancelled'], { error: 'Status must be open, closed or cancelled.' }).optional(),
})
