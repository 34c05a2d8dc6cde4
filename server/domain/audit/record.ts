/**
 * The audit log's one writer. Framework-free: pass the transaction a change runs in, so
 * the change and its audit row are written together or not at all. The log is
 * append-only (a database trigger refuses UPDATE and DELETE).
 */
import type { Db } from '../../db/connection'
import { auditLog } from '../../db/schema'

export interface AuditEntry {
  action: string
  entity: string
  entityId?: string | null
  before?: unknown
  after?: unknown
}

/** Who made a change: a person, or nobody (`id` null) when Tidewright reacts on its own. */
export interface AuditWho {
  id: string | null
  organisationId: string
}

/** Appends one line to the organisation's audit log. */
export function recordAudit(db: Db, who: AuditWho, entry: AuditEntry): void {
  db.insert(auditLog).values({
    organisationId: who.organisationId,
    actorId: who.id,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId ?? null,
    before: entry.before ?? null,
    after: entry.after ?? null,
  }).run()
}
