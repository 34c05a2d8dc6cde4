import type { Actor } from './access'
import { appendAudit, type AuditEntry } from '../db/audit'

export type { AuditEntry }

/** Appends one line to the organisation's audit log. The log is never updated or deleted. */
export function writeAudit(actor: Pick<Actor, 'id' | 'organisationId'>, entry: AuditEntry): void {
  appendAudit(useDB(), actor, entry)
}
