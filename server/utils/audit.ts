import type { Actor } from './access'
import { appendAudit, type AuditEntry } from '../domain/audit/append'

/**
 * Appends one line to the organisation's audit log on the process's connection. Called
 * inside a `useDB().transaction(...)` it joins that transaction (one connection, synchronous).
 */
export function writeAudit(actor: Pick<Actor, 'id' | 'organisationId'>, entry: AuditEntry): void {
  appendAudit(useDB(), actor, entry)
}
