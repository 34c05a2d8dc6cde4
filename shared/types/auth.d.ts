// The signed-in user as stored in the sealed session cookie. Role and organisation are
// re-checked against the database on every API request (server/utils/access.ts).
import type { Role, UnitSystem } from '../vocabulary'

declare module '#auth-utils' {
  interface User {
    id: string
    name: string
    role: Role
    organisationId: string
    units: UnitSystem
  }
}

export {}
