/**
 * The alert lifecycle. A danger finding in a tank's verdict opens one alert per tank and
 * kind (the rule id); later readings that still show it update it; a verdict without it
 * resolves it. Unacknowledged alerts escalate to the tank's supervisor after the company's
 * delay. Framework-free: the server, the seed and the worker share it; each function runs
 * in one transaction so an alert, its notices, their e-mails and its audit row commit together.
 */
import { and, eq, inArray, isNull, lte, ne } from 'drizzle-orm'
import type { Finding, Verdict } from '../../shared/cycle/types'
import { actionLines, alertEscalatedMail, alertOpenedMail, clientDangerMail, mailReader, plainHtml, type MeasuredReading } from './alert-mail'
import { forReader } from '../../shared/readings/reader-words'
import type { Db } from './connection'
import { recordAudit } from '../domain/audit/record'
import { writeNotice } from './notices'
import { alerts, organisations, readings, tanks, users } from './schema'
import { readOrganisationSettings } from './settings'

export type AlertRow = typeof alerts.$inferSelect

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

export const openKeyFor = (tankId: string, kind: string) => `${tankId}:${kind}`
const tankLink = (tankId: string) => `/tanks/${tankId}`
const tankUrl = (baseUrl: string, tankId: string) => `${baseUrl.replace(/\/+$/, '')}${tankLink(tankId)}`

function measuredReading(db: Db, readingId: string | undefined | null): MeasuredReading | null {
  if (!readingId) return null
  return db.select({
    takenAt: readings.takenAt, ammoniaN: readings.ammoniaN, nitriteN: readings.nitriteN, nitrateN: readings.nitrateN,
    pH: readings.pH, temperatureC: readings.temperatureC, salinity: readings.salinity,
  }).from(readings).where(eq(readings.id, readingId)).get() ?? null
}

/** The sign-in accounts of the tank's own client: the people at the tank who must act. */
function clientUsers(db: Db, clientId: string) {
  return db.select().from(users).where(and(eq(users.clientId, clientId), eq(users.role, 'client'), eq(users.active, true))).all()
}

function userRow(db: Db, id: string | null) {
  return id ? db.select().from(users).where(eq(users.id, id)).get() : undefined
}

/** The reading a finding rests on most recently: the newest of its readings, else the one just entered. */
function findingReading(finding: Finding, readingId: string | undefined): string | undefined {
  return finding.readingIds.at(-1) ?? readingId
}

/** Opens, updates and resolves the tank's alerts to match its verdict. */
export function syncAlertsInDb(db: Db, tankId: string, verdict: Verdict, options: AlertSyncOptions): AlertSyncResult {
  const now = options.now ?? new Date()
  const nowIso = now.toISOString()
  const result: AlertSyncResult = { opened: [], updated: [], resolved: [], notifiedUserIds: [] }
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
          title: `Act now: ${tank.name}`, body: forReader([finding.message, ...actionLines(verdict.actions).slice(0, 1)].join(' '), mailReader({ units: client.units, timeZone, reading: measured }, tank.kitBasis)), link: tankLink(tankId), alertId: row.id,
          email: { ...words, messageId: `<alert-${row.id}-client-${client.id}@mail.tidewright.invalid>` },
        }, now)
        result.notifiedUserIds.push(client.id)
      }
    }

    for (const alert of current) {
      if (dangers.has(alert.kind)) continue
      const row = t.update(alerts).set({
        status: 'resolved', resolvedAt: nowIso, resolvedBy: null, openKey: null,
        resolveNote: options.readingId ? 'Cleared by a later reading.' : 'Cleared when the tank was re-evaluated.',
        lastReadingId: options.readingId ?? alert.lastReadingId, updatedAt: nowIso,
      }).where(eq(alerts.id, alert.id)).returning().get()
      result.resolved.push(row)
      recordAudit(t, { id: options.actorId ?? null, organisationId: tank.organisationId }, { action: 'alert.resolve', entity: 'alert', entityId: row.id, after: { status: 'resolved', by: 'reading', readingId: options.readingId ?? null } })
      if (aquarist?.active) {
        const body = `A later reading cleared the danger alert on ${tank.name}. Keep testing as the verdict asks.`
        writeNotice(t, {
          userId: aquarist.id, organisationId: tank.organisationId, kind: 'alert-resolved', title: `Cleared on ${tank.name}`,
          body, link: tankLink(tankId), alertId: alert.id,
          email: { subject: `Cleared: ${tank.name}`, text: `${body}\n\n${tankUrl(options.baseUrl, tankId)}`, html: plainHtml([body], { href: tankUrl(options.baseUrl, tankId), label: `Open ${tank.name}` }) },
        }, now)
        result.notifiedUserIds.push(aquarist.id)
      }
    }
  })
  return result
}

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

/** Hands every alert that stayed unacknowledged past its company's delay to the tank's supervisor. Returns who was told. */
export function escalateDueAlerts(db: Db, now: Date, baseUrl: string): { escalated: AlertRow[], notifiedUserIds: string[] } {
  const out = { escalated: [] as AlertRow[], notifiedUserIds: [] as string[] }
  const orgs = db.select({ id: organisations.id }).from(organisations).all()
  for (const org of orgs) {
    const { escalationMinutes: minutes, timeZone } = readOrganisationSettings(db, org.id)
    const due = new Date(now.getTime() - minutes * 60_000).toISOString()
    const candidates = db.select().from(alerts).where(and(
      eq(alerts.organisationId, org.id), eq(alerts.status, 'open'), isNull(alerts.escalatedAt), lte(alerts.openedAt, due),
    )).all()
    for (const candidate of candidates) {
      db.transaction((t) => {
        // Conditional update: an alert acknowledged meanwhile, or escalated by another tick, is left alone.
        const alert = t.update(alerts).set({ escalatedAt: now.toISOString(), updatedAt: now.toISOString() })
          .where(and(eq(alerts.id, candidate.id), eq(alerts.status, 'open'), isNull(alerts.escalatedAt))).returning().get()
        if (!alert) return
        out.escalated.push(alert)
        const tank = t.select().from(tanks).where(eq(tanks.id, alert.tankId)).get()
        if (!tank) return
        const recipients = tank.supervisorId
          ? [userRow(t, tank.supervisorId)].filter(u => u?.active)
          : t.select().from(users).where(and(eq(users.organisationId, org.id), inArray(users.role, ['supervisor', 'admin']), eq(users.active, true))).all()
        const aquaristName = userRow(t, tank.aquaristId)?.name ?? null
        const actions = Array.isArray(alert.detail.actions) ? alert.detail.actions as Verdict['actions'] : []
        for (const user of recipients) {
          if (!user) continue
          const words = alertEscalatedMail({
            tankName: tank.name, tankUrl: tankUrl(baseUrl, tank.id), finding: { message: alert.message, ruleId: alert.kind },
            actions, reading: measuredReading(t, alert.lastReadingId), units: user.units, timeZone, minutes, aquaristName,
          })
          writeNotice(t, {
            userId: user.id, organisationId: org.id, kind: 'alert-escalated', title: `Unanswered alert on ${tank.name}`,
            body: forReader(alert.message, mailReader({ units: user.units, timeZone, reading: null })), link: tankLink(tank.id), alertId: alert.id,
            email: { ...words, messageId: `<alert-${alert.id}-escalated-${user.id}@mail.tidewright.invalid>` },
          }, now)
          out.notifiedUserIds.push(user.id)
        }
      })
    }
  }
  return out
}
