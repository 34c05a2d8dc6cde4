import type { Role } from '#shared/types/roles'

declare module '#app' {
  interface PageMeta {
    /** Open to visitors who are not signed in (sign-in, password reset, invitations, verification). */
    public?: boolean
    /** Only these roles may open the page; the global middleware answers anyone else with 403. */
    roles?: readonly Role[]
  }
}

export {}
