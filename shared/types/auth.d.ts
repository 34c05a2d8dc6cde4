// The signed-in user as stored in the sealed session cookie. Role and organisation are
// re-checked against the database on every API request (server/utils/access.ts).
declare module '#auth-utils' {
  interface User {
    id: string
    name: string
    role: 'admin' | 'aquarist' | 'supervisor' | 'client'
    organisationId: string
    units: 'us' | 'metric'
  }
}

export {}
