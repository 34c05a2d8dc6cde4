/**
 * A person acting on an alert: acknowledging it, or resolving it by hand with a note. Each
 * is a conditional update with its audit row in one transaction. Framework-free.
 */
import { and, eq, ne } from 'drizzle-orm'
import type { Db } from '#server/db/connection'
import { alerts } from '#server/db/schema'
import { recordAudit } from '#server/domain/audit/record'
import type { AlertRow } from './records'

export interface AlertActionResult { alert: AlertRow, before: AlertRow }

/** A person acting on an alert, for its audit row. */
export interface AlertActor { id: string, organisationId: string }

/** Acknowledges an open alert, with its audit row; already acknowledged or resolved alerts are returned unchanged (null). */
export function acknowledgeAlertInDb(db: Db, alertId: string, actor: AlertActor, note: string | null, now = new Date()): AlertActionResult | null {
  return db.transaction((t) => {
    const before = t.select().from(alerts).where(eq(alerts.id, alertId)).get()
    if (!before || before.status !== 'open') return null
    const alert = t.update(alerts).set({ status: 'acknowledged', acknowledgedAt: now.toISOString(), acknowledgedBy: actor.id, acknowledgeNote: note, updatedAt: now.toISOString() })
      .where(and(eq(alerts.id, alertId), eq(alerts.status, 'open'))).returning().get()
    if (!alert) return null
    recordAudit(t, actor, { action: 'alert.acknowledge', entity: 'alert', entityId: alertId, before: { status: before.status }, after: { status: alert.status, note } })
    return { alert, before }
  })
}

/** Resolves an alert by hand with a note, with its audit row. */
export function resolveAlertInDb(db: Db, alertId: string, actor: AlertActor, note: string, now = new Date()): AlertActionResult | null {
  return db.transaction((t) => {
    const before = t.select().from(alerts).where(eq(alerts.id, alertId)).get()
    if (!before || before.status === 'resolved') return null
    const alert = t.update(alerts).set({ status: 'resolved', resolvedAt: now.toISOString(), resolvedBy: actor.id, resolveNote: note, openKey: null, updatedAt: now.toISOString() })
      .where(and(eq(alerts.id, alertId), ne(alerts.status, 'resolved'))).returning().get()
    if (!alert) return null
    recordAudit(t, actor, { action: 'alert.resolve', entity: 'alert', entityId: alertId, before: { status: before.status }, after: { status: 'resolved', by: 'hand', note } })
    return { alert, before }
  })
}
