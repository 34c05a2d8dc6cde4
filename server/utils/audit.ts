import type { Actor } from './access'
import { auditLog } from '../db/schema'

export interface AuditEntry {
  action: string
  entity: string
  entityId?: string | null
  before?: unknown
  after?: unknown
}

/** Appends one line to the organisation's audit log. The log is never updated or deleted. */
export function writeAudit(actor: Pick<Actor, 'id' | 'organisationId'>, entry: AuditEntry): void {
  useDB().insert(auditLog).values({
    organisationId: actor.organisationId,
    actorId: actor.id,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId ?? null,
    before: entry.before ?? null,
    after: entry.after ?? null,
  }).run()
}
