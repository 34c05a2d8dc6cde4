import type { Actor } from './access'
import { recordAudit, type AuditEntry } from '../domain/audit/record'

export type { AuditEntry } from '../domain/audit/record'

/** Appends one line to the organisation's audit log. The log is never updated or deleted. */
export function writeAudit(actor: Pick<Actor, 'id' | 'organisationId'>, entry: AuditEntry): void {
  recordAudit(useDB(), actor, entry)
}
