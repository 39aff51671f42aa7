import { z } from './zod'
import { isoDateField, personNameField } from './common'
import { PARTY_MAX } from '../bookings'

const phoneField = z.string({ error: 'Enter a phone number.' }).trim()
  .max(30, { error: 'That phone number is too long.' })
  .regex(/^\+?[0-9 ().-]+$/, { error: 'Use digits, spaces, + ( ) - and . only.' })
  .refine(s => s.replace(/\D/g, '').length >= 6, { error: 'Enter a phone number the venue can call on the day.' })

/**
 * The booking form and `POST /api/bookings` share this schema. There is no e-mail field: booking
 * mail goes only to the account's confirmed address.
 */
export const bookingCreateSchema = z.object({
  sessionId: z.number({ error: 'Choose a session.' }).int({ error: 'Choose a session.' }).positive({ error: 'Choose a session.' }),
  partySize: z.number({ error: 'Enter how many guests.' }).int({ error: 'Use a whole number of guests.' })
    .min(1, { error: `Book for 1 to ${PARTY_MAX} guests.` }).max(PARTY_MAX, { error: `Book for 1 to ${PARTY_MAX} guests; for a larger group, contact the venue.` }),
  contactName: personNameField,
  contactPhone: phoneField,
  dateOfBirth: isoDateField,
  notes: z.string({ error: 'Notes must be text.' }).trim().max(500, { error: 'Keep notes under 500 characters.' }).nullish().transform(v => v || null),
  ageConfirmed: z.boolean({ error: 'Confirm that everyone in your party is of legal drinking age and will bring photo ID.' })
    .refine(v => v, { error: 'Confirm that everyone in your party is of legal drinking age and will bring photo ID.' }),
})

/** A guest's own bookings, optionally of one session (the booking form looks for a live hold there). */
export const bookingListQuerySchema = z.object({
  sessionId: z.coerce.number({ error: 'The session id must be a number.' }).int({ error: 'The session id must be a whole number.' }).positive({ error: 'The session id must be positive.' }).optional(),
})

/** The manager's bookings view and the CSV export: dates are the venue's calendar days. */
const reportFields = {
  from: isoDateField.optional(),
  to: isoDateField.optional(),
  flightId: z.coerce.number({ error: 'flightId must be a number.' }).int({ error: 'flightId must be a whole number.' }).positive({ error: 'flightId must be positive.' }).optional(),
}
const reportDatesInOrder = { error: 'The end date must not be before the start date.', path: ['to'] }
export const bookingReportQuerySchema = z.object(reportFields).refine(q => !q.from || !q.to || q.from <= q.to, reportDatesInOrder)

/** Sessions per page of the manager's bookings view (the CSV has them all). */
export const REPORT_SESSIONS_PER_PAGE = 20

/** The bookings view: the report's range and a page of its sessions (from 1). */
export const bookingReportPageQuerySchema = z.object({
  ...reportFields,
  page: z.coerce.number({ error: 'page must be a number.' }).int({ error: 'page must be a whole number.' }).min(1, { error: 'Pages are numbered from 1.' }).max(10_000, { error: 'page is at most 10000.' }).default(1),
}).refine(q => !q.from || !q.to || q.from <= q.to, reportDatesInOrder)
