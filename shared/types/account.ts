import type { Role } from '../roles'

/** The signed-in person's own account (GET /api/account). */
export interface AccountView {
  id: number
  name: string
  email: string
  role: Role
  /** Calendar date YYYY-MM-DD, or null until the first booking asks for it. */
  dateOfBirth: string | null
  createdAt: string
  /** The address has been proved by its e-mailed link; a guest books only then. */
  emailConfirmed: boolean
}

/** A staff account on the manager's staff page (GET /api/staff). */
export interface StaffMember {
  id: number
  name: string
  email: string
  role: Role
  disabled: boolean
  invitationPending: boolean
  createdAt: string
}

/** An answer that is only a message for the person (sign-up, password reset, a new address-check link). */
export interface MessageAnswer { message: string }
