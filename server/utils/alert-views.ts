/** Reads alerts for staff, scoped to the actor's organisation, shaped for the API. */
import { and, asc, desc, eq, inArray, type SQL } from 'drizzle-orm'
import { alias } from 'drizzle-orm/sqlite-core'
import type { AlertListQueryInput } from '#shared/schemas/alerts'
import type { AlertView } from '#shared/types/alerts'
import { ACTIVE_ALERT_STATUSES } from '#shared/vocabulary'
import { alerts, tanks, users } from '#server/db/schema'
import type { Actor } from './access'

const aquarist = alias(users, 'aquarist')
const acknowledger = alias(users, 'acknowledger')

function query() {
  return useDB().select({ alert: alerts, tankName: tanks.name, aquaristName: aquarist.name, acknowledgedByName: acknowledger.name })
    .from(alerts)
    .innerJoin(tanks, eq(tanks.id, alerts.tankId))
    .leftJoin(aquarist, eq(aquarist.id, tanks.aquaristId))
    .leftJoin(acknowledger, eq(acknowledger.id, alerts.acknowledgedBy))
}
type Row = NonNullable<ReturnType<ReturnType<typeof query>['get']>>

function toView(row: Row, now: Date): AlertView {
  const a = row.alert
  const until = a.resolvedAt ? new Date(a.resolvedAt) : now
  return {
    id: a.id, tankId: a.tankId, tankName: row.tankName, aquaristName: row.aquaristName, kind: a.kind, status: a.status,
    message: a.message, openedAt: a.openedAt, ageMinutes: Math.max(0, Math.round((until.getTime() - Date.parse(a.openedAt)) / 60_000)),
    acknowledgedAt: a.acknowledgedAt, acknowledgedByName: row.acknowledgedByName, acknowledgeNote: a.acknowledgeNote,
    escalatedAt: a.escalatedAt, resolvedAt: a.resolvedAt, resolveNote: a.resolveNote,
    openedByReadingId: a.openedByReadingId, lastReadingId: a.lastReadingId,
  }
}

/** The organisation's alerts, filtered; newest first unless asked otherwise. */
export function listAlerts(actor: Actor, q: AlertListQueryInput, now = new Date()): AlertView[] {
  const conditions: SQL[] = [eq(alerts.organisationId, actor.organisationId)]
  if (q.status === 'active') conditions.push(inArray(alerts.status, ACTIVE_ALERT_STATUSES))
  else if (q.status) conditions.push(eq(alerts.status, q.status))
  if (q.tankId) conditions.push(eq(alerts.tankId, q.tankId))
  const order = q.sort === 'oldest' ? asc(alerts.openedAt) : desc(alerts.openedAt)
  return query().where(and(...conditions)).orderBy(order, asc(alerts.id)).limit(200).all().map(r => toView(r, now))
}

/** One alert of the actor's organisation, or undefined. */
export function getAlert(actor: Actor, id: string, now = new Date()): AlertView | undefined {
  const row = query().where(and(eq(alerts.id, id), eq(alerts.organisationId, actor.organisationId))).get()
  return row ? toView(row, now) : undefined
}
