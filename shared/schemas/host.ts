import { z } from './zod'
import { PARTY_MAX, REFERENCE_LENGTH, isReference, normalizeReference } from '../bookings'
import { isoDateField, personNameField } from './common'

/** The day in the path of `/api/days/[date]`: a venue-local calendar date. */
export const dayParams = z.object({ date: isoDateField })

const reasonField = z.string({ error: 'Give a reason.' }).trim().min(3, { error: 'Say briefly why (at least 3 characters).' }).max(300, { error: 'Keep the reason under 300 characters.' })

/**
 * A party arrives: how many sit down, each with photo ID seen. When fewer than the whole party
 * sit down, the reason (e.g. one guest had no ID) is required.
 */
export const checkInSchema = z.object({
  seated: z.number({ error: 'How many guests are seated?' }).int().min(1, { error: 'Seat at least one guest, or turn the party away.' }).max(PARTY_MAX),
  idsSeen: z.number({ error: 'Tick the ID of each seated guest.' }).int().min(0).max(PARTY_MAX),
  reason: reasonField.optional(),
}).refine(v => v.idsSeen === v.seated, { error: 'Check the ID of every guest you seat.', path: ['idsSeen'] })

export const turnAwaySchema = z.object({ reason: reasonField })

/** Taking back a "did not come" or a "turned away": why is optional (e.g. they arrived late). */
export const undoDoorSchema = z.object({ reason: reasonField.optional() })

/**
 * A booking reference as the host typed it or the camera read it: any case, with spaces or dashes,
 * O for 0 and I or L for 1 (Crockford's rules); normalized to the stored form.
 */
const referenceField = z.string({ error: 'Type the booking reference.' })
  .max(40, { error: `A booking reference has ${REFERENCE_LENGTH} letters and digits.` })
  .transform(normalizeReference)
  .refine(isReference, { error: `A booking reference has ${REFERENCE_LENGTH} letters and digits (no U); check it with the guest.` })

export const referenceParams = z.object({ reference: referenceField })

export const walkInSchema = z.object({
  contactName: personNameField,
  partySize: z.number({ error: 'How many guests?' }).int({ error: 'Use a whole number.' }).min(1, { error: 'At least one guest.' }).max(PARTY_MAX, { error: `At most ${PARTY_MAX} guests at once.` }),
  idsSeen: z.number({ error: 'Tick the ID of each guest.' }).int().min(0).max(PARTY_MAX),
  notes: z.string({ error: 'Notes must be text.' }).trim().max(500, { error: 'Keep notes under 500 characters.' }).nullish().transform(v => v || null),
}).refine(v => v.idsSeen === v.partySize, { error: 'Check the ID of every walk-in guest before seating them.', path: ['idsSeen'] })
