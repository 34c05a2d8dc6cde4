/**
 * Gathers the facts of the attention board for the tanks a person may see, framework-free;
 * the judging is shared/attention/board. The glue (server/utils/attention.ts) passes the
 * person's tank scope from access.ts.
 */
import { and, asc, eq, inArray, isNull, ne, sql, type SQL } from 'drizzle-orm'
import { alias } from 'drizzle-orm/sqlite-core'
import { judgeTank, sortBoard, type BoardAlert, type BoardForecast, type BoardTank } from '#shared/attention/board'
import type { CycleForecast } from '#shared/cycle/forecast'
import { resolveThresholds } from '#shared/cycle/thresholds'
import type { AttentionQuery } from '#shared/schemas/attention'
import type { AttentionBoard } from '#shared/types/attention'
import type { Db } from '#server/db/connection'
import { alerts, clients, readings, signOffs, sites, tankVerdicts, tanks, users } from '#server/db/schema'
import { readOrganisationSettings } from '#server/db/settings'
import { listedForecast } from '#server/domain/forecast/tank-forecast'

const aquarist = alias(users, 'aquarist')
const acknowledger = alias(users, 'acknowledger')

function testIntervalHours(db: Db, organisationId: string): number {
  return resolveThresholds(readOrganisationSettings(db, organisationId).thresholds).testIntervalHours
}

/** The board's part of a tank's forecast: the stored one, as the tank list shows it. */
function boardForecast(tank: { status: BoardTank['status'] }, stored: CycleForecast | null): BoardForecast | null {
  const forecast = listedForecast(tank, stored)
  return forecast && { status: forecast.status, gap: forecast.gap, completion: forecast.completion, likely: forecast.likely }
}

function groupBy<T>(rows: T[], key: (row: T) => string): Map<string, T[]> {
  const map = new Map<string, T[]>()
  for (const row of rows) map.set(key(row), [...(map.get(key(row)) ?? []), row])
  return map
}

/** Every tank in `visible` (the viewer's scope) with what it needs today, filtered and sorted as asked. */
export function attentionBoard(db: Db, organisationId: string, visible: SQL, query: AttentionQuery, now = new Date()): AttentionBoard {
  const rows = db.select({
    tank: tanks, clientName: clients.name, siteLabel: sites.label, aquaristName: aquarist.name, verdict: tankVerdicts.verdict, forecast: tankVerdicts.forecast,
  }).from(tanks)
    .innerJoin(clients, eq(clients.id, tanks.clientId))
    .leftJoin(sites, eq(sites.id, tanks.siteId))
    .leftJoin(aquarist, eq(aquarist.id, tanks.aquaristId))
    .leftJoin(tankVerdicts, eq(tankVerdicts.tankId, tanks.id))
    .where(visible).orderBy(asc(tanks.name)).all()
  const aquarists = [...new Map(rows.filter(r => r.tank.aquaristId && r.aquaristName).map(r => [r.tank.aquaristId!, { id: r.tank.aquaristId!, name: r.aquaristName! }])).values()]
    .sort((a, b) => a.name.localeCompare(b.name))
  const shown = rows.filter(r => !query.aquarist || (query.aquarist === 'unassigned' ? !r.tank.aquaristId : r.tank.aquaristId === query.aquarist))
  const ids = shown.map(r => r.tank.id)
  if (!ids.length) return { items: [], aquarists, now: now.toISOString() }

  const openAlerts = groupBy(db.select({
    tankId: alerts.tankId, message: alerts.message, openedAt: alerts.openedAt, status: alerts.status,
    acknowledgedAt: alerts.acknowledgedAt, acknowledgedByName: acknowledger.name, escalatedAt: alerts.escalatedAt,
  }).from(alerts).leftJoin(acknowledger, eq(acknowledger.id, alerts.acknowledgedBy))
    .where(and(inArray(alerts.tankId, ids), ne(alerts.status, 'resolved'))).orderBy(asc(alerts.openedAt)).all(), a => a.tankId)
  const lastTests = new Map(db.select({ tankId: readings.tankId, at: sql<string>`max(${readings.takenAt})` }).from(readings)
    .where(and(inArray(readings.tankId, ids), isNull(readings.correctsId))).groupBy(readings.tankId).all().map(r => [r.tankId, r.at]))
  const requests = new Map(db.select({ tankId: signOffs.tankId, at: signOffs.requestedAt }).from(signOffs)
    .where(and(inArray(signOffs.tankId, ids), eq(signOffs.status, 'requested'))).all().map(r => [r.tankId, r.at]))
  const interval = testIntervalHours(db, organisationId)

  const items = shown.map((r) => {
    const facts: BoardTank = {
      tankId: r.tank.id, tankName: r.tank.name, clientName: r.clientName, siteLabel: r.siteLabel, status: r.tank.status,
      aquaristId: r.tank.aquaristId, aquaristName: r.aquaristName, cycleStartedAt: r.tank.cycleStartedAt,
      lastTestAt: lastTests.get(r.tank.id) ?? null,
      verdict: r.verdict ?? null,
      alerts: (openAlerts.get(r.tank.id) ?? []).map(a => ({ ...a, status: a.status as BoardAlert['status'] })),
      signOffRequestedAt: requests.get(r.tank.id) ?? null,
      forecast: boardForecast(r.tank, r.forecast),
    }
    return judgeTank(facts, now, interval)
  })
  return { items: sortBoard(items, query.sort), aquarists, now: now.toISOString() }
}
