import type { Role } from '../roles'

declare module '#auth-utils' {
  interface User {
    id: number
    name: string
    email: string
    role: Role
  }
  /** Server-only part of the sealed cookie: which sign-in this is, and the account's session version then. */
  interface SecureSessionData {
    sid: string
    version: number
  }
}

export {}
