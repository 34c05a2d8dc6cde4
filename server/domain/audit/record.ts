/**
 * The audit log's one writer. Framework-free: pass the transaction a change runs in, so
 * the change and its audit row are written together or not at all. The log is
 * append-only (a database trigger refuses UPDATE and DELETE).
 */
import { sql } from 'drizzle-orm'
import type { Db } from '../../db/connection'
import { preparedPerDb } from '../../db/prepared'
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

/**
 * The append, prepared once per handle (every save writes a row; building the insert each time
 * cost a quarter of the save's transaction). `before` and `after` are bound as the JSON text
 * the JSON columns would write, and a missing one as NULL (bound through the column, it would be
 * the text `null`); `at` is bound, since a prepared statement would keep the first call's time.
 */
const appendAudit = preparedPerDb(db => db.insert(auditLog).values({
  organisationId: sql.placeholder('organisationId'),
  actorId: sql.placeholder('actorId'),
  action: sql.placeholder('action'),
  entity: sql.placeholder('entity'),
  entityId: sql.placeholder('entityId'),
  before: sql`${sql.placeholder('before')}`,
  after: sql`${sql.placeholder('after')}`,
  at: sql.placeholder('at'),
}).prepare())

/** A value as its JSON column stores it: JSON text, or NULL when there is none. */
function asJsonColumn(value: unknown): string | null {
  return value === undefined || value === null ? null : JSON.stringify(value)
}

/** Appends one line to the organisation's audit log. */
export function recordAudit(db: Db, who: AuditWho, entry: AuditEntry): void {
  appendAudit(db).run({
    organisationId: who.organisationId,
    actorId: who.id,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId ?? null,
    before: asJsonColumn(entry.before),
    after: asJsonColumn(entry.after),
    at: new Date().toISOString(),
  })
}
