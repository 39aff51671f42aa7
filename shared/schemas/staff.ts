import { z } from './zod'
import { STAFF_ROLES } from '../roles'
import { emailField, personNameField } from './common'

const staffRoleField = z.enum(STAFF_ROLES, { error: `Choose a staff role: ${STAFF_ROLES.join(', ')}.` })

export const inviteSchema = z.object({ name: personNameField, email: emailField, role: staffRoleField })

export const staffPatchSchema = z.object({
  role: staffRoleField.optional(),
  disabled: z.boolean({ error: 'Disabled must be true or false.' }).optional(),
}).refine(v => v.role !== undefined || v.disabled !== undefined, { error: 'Change the role or the disabled flag.' })
