/** The four kinds of Tidewright user. */
export type Role = 'admin' | 'aquarist' | 'supervisor' | 'client'

/** Staff roles: everyone at the company who is not a client. */
export const STAFF_ROLES: readonly Role[] = ['admin', 'aquarist', 'supervisor']
