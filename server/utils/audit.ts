import type { Actor } from './access'
import type { Db } from '#server/db/connection'
import { recordAudit, type AuditEntry, type AuditWho } from '#server/domain/audit/record'

export type { AuditEntry } from '#server/domain/audit/record'

/**
 * Appends one line to the organisation's audit log on the process's database. Call it inside
 * the change's own `useDB().transaction`, or use `auditedChange`, so the change and its
 * audit row commit together.
 */
export function writeAudit(actor: Pick<Actor, 'id' | 'organisationId'>, entry: AuditEntry): void {
  recordAudit(useDB(), actor, entry)
}

/**
 * Runs a change and writes the audit row that describes it in one transaction: both commit
 * or neither does. `describe` sees the change's result; null writes no row (nothing changed).
 * The write lock is waited for off the request loop (`writeTransaction`).
 */
export function auditedChange<T>(who: AuditWho, change: (db: Db) => T, describe: (result: T) => AuditEntry | null): Promise<T> {
  return writeTransaction((db) => {
    const result = change(db)
    const entry = describe(result)
    if (entry) recordAudit(db, who, entry)
    return result
  })
}
