/**
 * Escalation: an alert left unacknowledged past the company's delay goes to the tank's
 * supervisor (or, with none, the company's supervisors and admins), once. Framework-free;
 * the worker calls it on each clocked tick.
 */
import { and, eq, inArray, isNull, lte } from 'drizzle-orm'
import type { Verdict } from '#shared/cycle/types'
import { forReader } from '#shared/readings/reader-words'
import type { Db } from '#server/db/connection'
import { writeNotice } from '#server/db/notices'
import { alerts, organisations, tanks, users } from '#server/db/schema'
import { readOrganisationSettings } from '#server/db/settings'
import { alertEscalatedMail, mailReader } from './mail'
import { measuredReading, tankLink, tankUrl, userRow, type AlertRow } from './records'

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
