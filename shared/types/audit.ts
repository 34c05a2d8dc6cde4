/** API response shapes of the audit trail viewer. */
import type { PageOf } from './list'
import type { AuditChange } from '../audit/words'

export interface AuditRowView {
  id: number
  at: string
  /** Null for what Tidewright did by itself (an alert opened by a reading's verdict, a reminder). */
  actorId: string | null
  /** The person's name; null when Tidewright acted, or the account no longer exists. */
  actorName: string | null
  action: string
  actionLabel: string
  entity: string
  entityId: string | null
  tankId: string | null
  tankName: string | null
  changes: AuditChange[]
}

export interface AuditList extends PageOf<AuditRowView> {
  /** The company's time zone (its settings): every moment of the trail is shown on the company's clock. */
  timeZone: string
}
