import type { Role } from './shared/roles'

declare module '#app' {
  interface PageMeta {
    /** Roles that may open the page; the server guards the data either way. */
    roles?: Role[]
  }
}

export {}
