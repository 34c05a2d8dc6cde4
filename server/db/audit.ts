/** Appending to the audit log, framework-free so a command can write its audit row inside its own transaction. */
import type { TidewrightDB } from './connection'
import { auditLog } from './schema'

export interface AuditEntry {
  action: string
  entity: string
  entityId?: string | null
  before?: unknown
  after?: unknown
}

type Writer = Pick<TidewrightDB, 'insert'>

/** Appends one line to the organisation's audit log. The log is never updated or deleted. */
export function appendAudit(db: Writer, actor: { id: string | null, organisationId: string }, entry: AuditEntry, at = new Date()): void {
  db.insert(auditLog).values({
    organisationId: actor.organisationId,
    actorId: actor.id,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId ?? null,
    before: entry.before ?? null,
    after: entry.after ?? null,
    at: at.toISOString(),
  }).run()
}
