/**
 * The one way an audit row is written, framework-free: pass the same handle (or
 * transaction) the change itself uses, so the change and its record commit together.
 */
import type { TidewrightDB } from '../../db/connection'
import { auditLog } from '../../db/schema'

export interface AuditActor {
  id: string | null
  organisationId: string
}

export interface AuditEntry {
  action: string
  entity: string
  entityId?: string | null
  before?: unknown
  after?: unknown
}

/** Appends one line to the organisation's audit log. The log is never updated or deleted. */
export function appendAudit(db: TidewrightDB, actor: AuditActor, entry: AuditEntry): void {
  db.insert(auditLog).values({
    organisationId: actor.organisationId,
    actorId: actor.id,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId ?? null,
    before: entry.before ?? null,
    after: entry.after ?? null,
  }).run()
}
