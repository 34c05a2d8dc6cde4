/**
 * Saving the company settings with a version check: a form loaded before someone else's
 * save is refused (409) instead of silently overwriting it. The audit row (before/after
 * in effective values) and, when a threshold changed, the stale marks on the company's
 * verdicts are written in the same transaction. Framework-free.
 */
import { and, desc, eq } from 'drizzle-orm'
import { resolveThresholds } from '#shared/cycle/thresholds'
import { parseStoredSettings, type CompanySettingsUpdate, type OrganisationSettings } from '#shared/schemas/settings'
import type { CompanySettingsView } from '#shared/types/settings'
import type { Db } from '#server/db/connection'
import { recordAudit } from '#server/domain/audit/record'
import { markCompanyVerdictsStale } from './reevaluation'
import { auditLog, organisations, users } from '#server/db/schema'

/** The company's name, settings (defaults filled in) and the version a form must send back. */
export function readCompanySettings(db: Db, organisationId: string): CompanySettingsView | undefined {
  const row = db.select().from(organisations).where(eq(organisations.id, organisationId)).get()
  if (!row) return undefined
  return { name: row.name, settings: parseStoredSettings(row.settings), version: row.settingsVersion }
}

export type SettingsSaveResult
  = | { ok: true, view: CompanySettingsView, thresholdsChanged: string[] }
    | { ok: false, status: 404 | 409, message: string }

/** The threshold keys whose effective value differs between two sets of overrides. */
export function changedThresholds(before: OrganisationSettings['thresholds'], after: OrganisationSettings['thresholds']): string[] {
  const a = resolveThresholds(before)
  const b = resolveThresholds(after)
  return (Object.keys(a) as Array<keyof typeof a>).filter(key => a[key] !== b[key])
}

/** Only what changed, section by section; thresholds as effective values so a reset to default reads as a value. */
function auditDiff(before: CompanySettingsView, after: { name: string, settings: OrganisationSettings }, thresholdKeys: string[]) {
  const was: Record<string, unknown> = {}
  const now: Record<string, unknown> = {}
  if (before.name !== after.name) {
    was.name = before.name
    now.name = after.name
  }
  const sections = Object.keys(after.settings) as Array<keyof OrganisationSettings>
  for (const section of sections) {
    if (section === 'thresholds') continue
    if (JSON.stringify(before.settings[section]) === JSON.stringify(after.settings[section])) continue
    was[section] = before.settings[section]
    now[section] = after.settings[section]
  }
  if (thresholdKeys.length) {
    const a = resolveThresholds(before.settings.thresholds)
    const b = resolveThresholds(after.settings.thresholds)
    was.thresholds = Object.fromEntries(thresholdKeys.map(k => [k, a[k as keyof typeof a]]))
    now.thresholds = Object.fromEntries(thresholdKeys.map(k => [k, b[k as keyof typeof b]]))
  }
  return { was, now }
}

function conflictMessage(db: Db, organisationId: string): string {
  const last = db.select({ at: auditLog.at, name: users.name }).from(auditLog).leftJoin(users, eq(users.id, auditLog.actorId))
    .where(and(eq(auditLog.organisationId, organisationId), eq(auditLog.action, 'organisation.settings')))
    .orderBy(desc(auditLog.id)).limit(1).get()
  const who = last?.name ? `${last.name} saved` : 'Someone saved'
  return `${who} the company settings after you opened them. Reload to see their changes, then make yours again.`
}

/** Saves the company name and settings if `version` is still current; returns the new view and which thresholds changed. */
export function saveCompanySettings(db: Db, actor: { id: string, organisationId: string }, input: CompanySettingsUpdate, now = new Date()): SettingsSaveResult {
  return db.transaction((t) => {
    const current = readCompanySettings(t, actor.organisationId)
    if (!current) return { ok: false, status: 404, message: 'Company not found' }
    if (current.version !== input.version) return { ok: false, status: 409, message: conflictMessage(t, actor.organisationId) }
    const thresholdKeys = changedThresholds(current.settings.thresholds, input.settings.thresholds)
    const { was, now: after } = auditDiff(current, input, thresholdKeys)
    if (!Object.keys(after).length && !Object.keys(was).length) return { ok: true, view: current, thresholdsChanged: [] }
    const row = t.update(organisations)
      .set({ name: input.name, settings: input.settings, settingsVersion: current.version + 1, updatedAt: now.toISOString() })
      .where(and(eq(organisations.id, actor.organisationId), eq(organisations.settingsVersion, input.version)))
      .returning().get()
    if (!row) return { ok: false, status: 409, message: conflictMessage(t, actor.organisationId) }
    recordAudit(t, actor, { action: 'organisation.settings', entity: 'organisation', entityId: actor.organisationId, before: was, after })
    // No verdict made under the old limits may be read as current once the new ones are saved.
    if (thresholdKeys.length) markCompanyVerdictsStale(t, actor.organisationId)
    return { ok: true, view: { name: row.name, settings: parseStoredSettings(row.settings), version: row.settingsVersion }, thresholdsChanged: thresholdKeys }
  })
}
