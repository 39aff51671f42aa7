import { z } from './zod'
import { POURS_MAX, POURS_MIN } from '../flights'
import { TEMP_RANGE_C, WALL_ANGLE_RANGE_DEG } from '../science/ranges'

export const glassSchema = z.object({
  name: z.string({ error: 'Name the glass.' }).trim().min(1, { error: 'Name the glass.' }).max(80, { error: 'Use at most 80 characters.' }),
  bowlDiameterMm: z.number({ error: 'Enter the bowl diameter in mm.' }).min(20, { error: 'The bowl diameter must be between 20 and 160 mm.' }).max(160, { error: 'The bowl diameter must be between 20 and 160 mm.' }),
  wallAngleDeg: z.number({ error: 'Enter the wall angle in degrees.' }).min(WALL_ANGLE_RANGE_DEG.min, { error: `The wall angle must be between ${WALL_ANGLE_RANGE_DEG.min}° and ${WALL_ANGLE_RANGE_DEG.max}° from horizontal.` }).max(WALL_ANGLE_RANGE_DEG.max, { error: `The wall angle must be between ${WALL_ANGLE_RANGE_DEG.min}° and ${WALL_ANGLE_RANGE_DEG.max}° from horizontal.` }),
  fillHeightMm: z.number({ error: 'Enter the fill height in mm.' }).min(5, { error: 'The fill height must be between 5 and 150 mm.' }).max(150, { error: 'The fill height must be between 5 and 150 mm.' }),
})

export const pourSchema = z.object({
  productId: z.number({ error: 'Choose a product.' }).int().positive({ error: 'Choose a product.' }),
  volumeMl: z.number({ error: 'Enter the pour volume.' }).min(5, { error: 'A pour must be between 5 and 250 mL.' }).max(250, { error: 'A pour must be between 5 and 250 mL.' }),
  glassId: z.number({ error: 'Choose a glass.' }).int().positive({ error: 'Choose a glass.' }),
  servingTempC: z.number({ error: 'Enter the serving temperature.' }).min(TEMP_RANGE_C.min, { error: `Serve between ${TEMP_RANGE_C.min} and ${TEMP_RANGE_C.max} °C.` }).max(TEMP_RANGE_C.max, { error: `Serve between ${TEMP_RANGE_C.min} and ${TEMP_RANGE_C.max} °C.` }),
  note: z.string().trim().max(500, { error: 'Use at most 500 characters.' }).nullish(),
})
export type PourInput = z.input<typeof pourSchema>

const poursField = z.array(pourSchema, { error: 'List the pours.' })
  .min(POURS_MIN, { error: `A flight has ${POURS_MIN} to ${POURS_MAX} pours.` })
  .max(POURS_MAX, { error: `A flight has ${POURS_MIN} to ${POURS_MAX} pours.` })

const flightFieldsSchema = z.object({
  name: z.string({ error: 'Name the flight.' }).trim().min(1, { error: 'Name the flight.' }).max(120, { error: 'Use at most 120 characters.' }),
  summary: z.string().trim().max(400, { error: 'Use at most 400 characters.' }).default(''),
})

export const flightSaveSchema = flightFieldsSchema.extend({ pours: poursField })

/** The builder's live preview: pours as they stand, possibly incomplete (1 pour is fine). */
export const flightPreviewSchema = z.object({ pours: z.array(pourSchema).min(1, { error: 'Add a pour.' }).max(POURS_MAX, { error: `At most ${POURS_MAX} pours.` }) })

export const flightPatchSchema = flightFieldsSchema.partial().extend({ pours: poursField.optional() })
  .refine(v => Object.keys(v).length > 0, { error: 'Change at least one field.' })
