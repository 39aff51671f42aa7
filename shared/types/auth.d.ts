import type { Role } from '../roles'

declare module '#auth-utils' {
  interface User {
    id: number
    name: string
    email: string
    role: Role
  }
}

export {}
