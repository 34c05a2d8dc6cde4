/** API response shapes for clients and their sites. */
import type { PageOf } from './list'
import type { StaffRole } from '../vocabulary'

export interface SiteView {
  id: string
  clientId: string
  label: string
  address: string | null
  roomNotes: string | null
  accessNotes: string | null
  archivedAt: string | null
}

export interface ClientSummary {
  id: string
  name: string
  email: string | null
  phone: string | null
  archivedAt: string | null
  tankCount: number
  siteCount: number
  updatedAt: string
}

export type ClientList = PageOf<ClientSummary>

export interface ClientView extends ClientSummary {
  notes: string | null
  sites: SiteView[]
}

/** A member of staff, for the assignment pickers. */
export interface StaffMember {
  id: string
  name: string
  role: StaffRole
}
