/** API response shapes for the company's people (staff and client accounts) and its admin home. */
import type { PageOf } from './list'
import type { Role, UnitSystem } from '../vocabulary'

/** Where an account stands: signing in, invited and not yet accepted (or the link ran out), or switched off. */
export const PERSON_STATUSES = ['active', 'invited', 'invitation-expired', 'deactivated'] as const
export type PersonStatus = (typeof PERSON_STATUSES)[number]

export interface PersonView {
  id: string
  name: string
  email: string
  role: Role
  status: PersonStatus
  units: UnitSystem
  /** The newest sign-in still on record (sessions are kept 30 days after they end); null when none is. */
  lastSignInAt: string | null
  /** For client accounts: the client record they belong to. */
  clientName: string | null
  /** When the newest invitation link was sent and until when it works; null once accepted. */
  invitedAt: string | null
  invitationExpiresAt: string | null
  /** Tanks not archived on which this person is the aquarist or the supervisor. */
  openTanks: number
}

export type PeopleList = PageOf<PersonView>

/** What needs an admin's attention, for the admin home. */
export interface AdminAttention {
  pendingInvitations: { id: string, name: string, email: string, role: Role, expired: boolean, invitedAt: string | null }[]
  deactivatedWithTanks: { id: string, name: string, role: Role, openTanks: number }[]
  unassignedTanks: { id: string, name: string, clientName: string, status: string }[]
}
