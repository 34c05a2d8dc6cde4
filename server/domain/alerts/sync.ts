/**
 * Keeps a tank's alerts in step with its verdict: a danger finding opens one alert per tank
 * and kind (the rule id), later readings that still show it update it, a verdict without it
 * resolves it. One transaction, so an alert, its notices, their e-mails and its audit row
 * commit together. Framework-free: the server, the seed and the tests share it.
 */
import { and, eq, ne, sql } from 'drizzle-orm'
import type { Finding, Verdict } from '../../../shared/cycle/types'
import { forReader } from '../../../shared/readings/reader-words'
import type { Db } from '../../db/connection'
import { writeNotice } from '../../db/notices'
import { preparedPerDb } from '../../db/prepared'
import { alerts, tanks } from '../../db/schema'
import { readOrganisationSettings } from '../../db/settings'
import { recordAudit } from '../audit/record'
import { alertOpenedMail, clientDangerMail, clientNoticeBody, mailReader, plainHtml } from './mail'
import { clientUsers, findingReading, measuredReading, openKeyFor, tankLink, tankUrl, userRow, type AlertRow } from './records'

export interface AlertSyncOptions {
  readingId?: string
  now?: Date
  /** Who entered the change that moved the verdict; the audit rows name them (none: Tidewright itself). */
  actorId?: string | null
  /** Public base URL for links in e-mails, e.g. https://app.example.com */
  baseUrl: string
}

export interface AlertSyncResult {
  opened: AlertRow[]
  updated: AlertRow[]
  resolved: AlertRow[]
  /** Users who got a new notice (for live badges). */
  notifiedUserIds: string[]
}

/** Whether the tank has an alert not yet resolved, prepared once. */
const unresolvedAlertOf = preparedPerDb(db => db.select({ id: alerts.id }).from(alerts)
  .where(and(eq(alerts.tankId, sql.placeholder('tankId')), ne(alerts.status, 'resolved'))).limit(1).prepare())

/** Opens, updates and resolves the tank's alerts to match its verdict. */
export function syncAlertsInDb(db: Db, tankId: string, verdict: Verdict, options: AlertSyncOptions): AlertSyncResult {
  const now = options.now ?? new Date()
  const nowIso = now.toISOString()
  const result: AlertSyncResult = { opened: [], updated: [], resolved: [], notifiedUserIds: [] }
  // Most saves: no danger, and no alert to update or resolve. The transaction below would read and
  // write nothing then, so it is not opened (it takes the write lock and reads four tables).
  if (!verdict.findings.some(f => f.severity === 'danger') && !unresolvedAlertOf(db).get({ tankId })) return result
  // Immediate: it reads, then writes; a deferred transaction would fail at once (SQLITE_BUSY) if
  // another connection wrote in between, where an immediate one waits its turn.
  db.transaction((t) => {
    const tank = t.select().from(tanks).where(eq(tanks.id, tankId)).get()
    if (!tank) return
    const dangers = new Map<string, Finding>()
    for (const finding of verdict.findings) if (finding.severity === 'danger' && !dangers.has(finding.ruleId)) dangers.set(finding.ruleId, finding)
    const current = t.select().from(alerts).where(and(eq(alerts.tankId, tankId), ne(alerts.status, 'resolved'))).all()
    const byKind = new Map(current.map(a => [a.kind, a]))
    const aquarist = userRow(t, tank.aquaristId)
    const { timeZone } = readOrganisationSettings(t, tank.organisationId)

    for (const [kind, finding] of dangers) {
      const lastReadingId = findingReading(finding, options.readingId) ?? null
      const existing = byKind.get(kind)
      const detail = { readingIds: finding.readingIds, actions: verdict.actions }
      if (existing) {
        const row = t.update(alerts).set({ message: finding.message, lastReadingId, detail, updatedAt: nowIso })
          .where(eq(alerts.id, existing.id)).returning().get()
        result.updated.push(row)
        continue
      }
      // The unique index on open_key is the guard against a second open alert of the kind.
      const row = t.insert(alerts).values({
        organisationId: tank.organisationId, tankId, kind, status: 'open', message: finding.message,
        openedByReadingId: lastReadingId, lastReadingId, detail, openedAt: nowIso, openKey: openKeyFor(tankId, kind),
        createdAt: nowIso, updatedAt: nowIso,
      }).onConflictDoNothing({ target: alerts.openKey }).returning().get()
      if (!row) continue
      result.opened.push(row)
      recordAudit(t, { id: options.actorId ?? null, organisationId: tank.organisationId }, { action: 'alert.open', entity: 'alert', entityId: row.id, after: { kind: row.kind, tankId, readingId: row.openedByReadingId } })
      if (aquarist?.active) {
        const words = alertOpenedMail({
          tankName: tank.name, tankUrl: tankUrl(options.baseUrl, tankId), finding, actions: verdict.actions,
          reading: measuredReading(t, lastReadingId), units: aquarist.units, timeZone,
        })
        writeNotice(t, {
          userId: aquarist.id, organisationId: tank.organisationId, kind: 'alert-opened', assignedAquarist: true,
          title: `Danger on ${tank.name}`, body: forReader(finding.message, mailReader({ units: aquarist.units, timeZone, reading: null })), link: tankLink(tankId), alertId: row.id,
          email: { ...words, messageId: `<alert-${row.id}-opened@mail.tidewright.invalid>` },
        }, now)
        result.notifiedUserIds.push(aquarist.id)
      }
      const measured = measuredReading(t, lastReadingId)
      for (const client of clientUsers(t, tank.clientId)) {
        const words = clientDangerMail({
          tankName: tank.name, tankUrl: tankUrl(options.baseUrl, tankId), finding, actions: verdict.actions,
          reading: measured, units: client.units, kitBasis: tank.kitBasis, timeZone,
        })
        writeNotice(t, {
          userId: client.id, organisationId: tank.organisationId, kind: 'tank-danger',
          title: `Act now: ${tank.name}`, body: clientNoticeBody(finding, verdict.actions, measured, mailReader({ units: client.units, timeZone, reading: measured }, tank.kitBasis)), link: tankLink(tankId), alertId: row.id,
          email: { ...words, messageId: `<alert-${row.id}-client-${client.id}@mail.tidewright.invalid>` },
        }, now)
        result.notifiedUserIds.push(client.id)
      }
    }

    for (const alert of current) {
      if (dangers.has(alert.kind)) continue
      const row = t.update(alerts).set({
        status: 'resolved', resolvedAt: nowIso, resolvedBy: null, openKey: null,
        resolveNote: options.readingId ? 'Cleared by a later test.' : 'Cleared when the tank was re-evaluated.',
        lastReadingId: options.readingId ?? alert.lastReadingId, updatedAt: nowIso,
      }).where(eq(alerts.id, alert.id)).returning().get()
      result.resolved.push(row)
      recordAudit(t, { id: options.actorId ?? null, organisationId: tank.organisationId }, { action: 'alert.resolve', entity: 'alert', entityId: row.id, after: { status: 'resolved', by: 'reading', readingId: options.readingId ?? null } })
      if (aquarist?.active) {
        const body = `A later test cleared the danger alert on ${tank.name}. Keep testing as the verdict asks.`
        writeNotice(t, {
          userId: aquarist.id, organisationId: tank.organisationId, kind: 'alert-resolved', title: `Cleared on ${tank.name}`,
          body, link: tankLink(tankId), alertId: alert.id,
          email: { subject: `Cleared: ${tank.name}`, text: `${body}\n\n${tankUrl(options.baseUrl, tankId)}`, html: plainHtml([body], { href: tankUrl(options.baseUrl, tankId), label: `Open ${tank.name}` }) },
        }, now)
        result.notifiedUserIds.push(aquarist.id)
      }
    }
  }, { behavior: 'immediate' })
  return result
}
