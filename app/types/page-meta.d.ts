import type { Role } from '#shared/types/roles'

declare module '#app' {
  interface PageMeta {
    /** Lowest role that may open the page; read by the `role` middleware. */
    requiredRole?: Role
  }
}

export {}
