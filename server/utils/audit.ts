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
 */
export function auditedChange<T>(who: AuditWho, change: (db: Db) => T, describe: (result: T) => AuditEntry | null): T {
  return useDB().transaction((tx) => {
    const result = change(tx)
    const entry = describe(result)
    if (entry) recordAudit(tx, who, entry)
    return result
  })
}
