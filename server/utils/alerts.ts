/**
 * Nitro glue for the alert lifecycle: runs the framework-free commands in
 * server/domain/alerts/ against the process's database with the public base URL for
 * links, then wakes the live badges and the mail worker.
 */
import type { Verdict } from '#shared/cycle/types'
import { acknowledgeAlertInDb, resolveAlertInDb } from '#server/domain/alerts/actions'
import { escalateDueAlerts } from '#server/domain/alerts/escalation'
import { syncAlertsInDb, type AlertSyncResult } from '#server/domain/alerts/sync'
import { runTestReminders } from '#server/db/reminders'
import { runHousekeeping } from '#server/domain/housekeeping/housekeeping'
import { runWeeklyDigest } from '#server/domain/forecast/weekly-digest'
import type { Actor } from './access'

/** Opens, updates and resolves the tank's alerts to match its verdict; called from onTankDataChanged. */
export function syncAlerts(tankId: string, verdict: Verdict, options: { readingId?: string, now?: Date, actor?: Actor } = {}): AlertSyncResult {
  // Opened and cleared by the engine on behalf of whoever entered the reading (or the system).
  const result = syncAlertsInDb(useDB(), tankId, verdict, { readingId: options.readingId, now: options.now, baseUrl: publicBaseUrl(), actorId: options.actor?.id ?? null })
  announceNotices(result.notifiedUserIds)
  if (result.notifiedUserIds.length) kickMailWorker()
  return result
}

/** Acknowledges an alert for the actor; null if it was not open. */
export async function acknowledgeAlert(actor: Actor, alertId: string, note: string | null, now = new Date()) {
  const done = await writeTransaction(db => acknowledgeAlertInDb(db, alertId, actor, note, now))
  return done?.alert ?? null
}

/** Resolves an alert by hand; null if it was already resolved. */
export async function resolveAlert(actor: Actor, alertId: string, note: string, now = new Date()) {
  const done = await writeTransaction(db => resolveAlertInDb(db, alertId, actor, note, now))
  return done?.alert ?? null
}

/** The clocked jobs at `now`: verdicts made again where time alone may have changed them, then escalations, test reminders and weekly digests, then database housekeeping. */
export async function runClockedJobs(now: Date) {
  const verdicts = await refreshStaleVerdicts(now)
  // Each job in one write transaction, its lock waited for off the loop (its own per-row
  // transactions become savepoints): an import in the pool holds up no request while they wait.
  const escalation = await writeTransaction(db => escalateDueAlerts(db, now, publicBaseUrl()))
  const reminders = await writeTransaction(db => runTestReminders(db, now, publicBaseUrl()))
  const digests = await writeTransaction(db => runWeeklyDigest(db, now, publicBaseUrl()))
  announceNotices([...escalation.notifiedUserIds, ...reminders.notifiedUserIds])
  await runHousekeeping(useDB(), now, writeTransaction)
  return { verdicts, escalated: escalation.escalated.length, reminded: reminders.reminded.length, aquaristsTold: reminders.aquaristsTold.length, digests: digests.sent.length }
}
