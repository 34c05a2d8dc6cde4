// The sealed session cookie carries only a session token (server-side sessions, server/domain/sessions).
// `user` is filled in from the database each time the browser asks for its session
// (server/plugins/03.session-view.ts) and re-checked on every API request (server/utils/access.ts).
import type { Role, UnitSystem } from '../vocabulary'

declare module '#auth-utils' {
  interface User {
    id: string
    name: string
    role: Role
    organisationId: string
    units: UnitSystem
    /** The company's time zone (IANA): every moment the person reads is on this clock, on the server's page and in the browser alike. */
    timeZone: string
  }
  interface SecureSessionData {
    sessionToken?: string
  }
}

export {}
