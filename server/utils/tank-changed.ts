import type { Verdict } from '#shared/cycle/types'
import type { AppendedTest } from '#server/domain/readings/engine-input-cache'
import { hasLongHistory } from '#server/domain/tanks/long-history'
import { noteTankDataChanged, refreshVerdictOffLoop } from '#server/domain/tanks/verdict-off-loop'
import type { Actor } from './access'

export interface TankChange {
  /** The reading that was added or edited, when there is one: alerts record it. */
  readingId?: string
  actor?: Actor
  now?: Date
  /** A test just saved (not a correction): a tank evaluated in the pool places it into the pool's kept history. */
  appended?: AppendedTest
}

/**
 * The one place that reacts to a change in a tank's readings, events or profile: the
 * verdict is re-evaluated and stored, then everything that follows from a verdict
 * (alerts, notifications) runs from here. Routes call this after their write, and answer
 * once it is done, so the answer carries the verdict that includes the change.
 *
 * A tank with a long history (server/domain/tanks/long-history.ts: an imported log of years)
 * is evaluated in the heavy-work pool, so the request loop every company is served from
 * stays free meanwhile; a write that lands during it refreshes the verdict itself and makes
 * this evaluation run again, so the stored verdict is never older than the data
 * (server/domain/tanks/verdict-off-loop.ts). Every other tank is evaluated here, at once.
 */
export async function onTankDataChanged(tankId: string, change: TankChange = {}): Promise<Verdict | undefined> {
  noteTankDataChanged(tankId)
  const db = useDB()
  const verdict = hasLongHistory(db, tankId)
    ? await refreshVerdictOffLoop(db, tankId, evaluateOffLoop, () => change.now ?? new Date(), change.appended)
    : refreshVerdict(tankId, change.now)
  followVerdict(tankId, verdict, change)
  return verdict
}

/** What follows from a stored verdict: the move to stocking once livestock is logged, and the alerts. */
function followVerdict(tankId: string, verdict: Verdict | undefined, change: TankChange): void {
  advanceToStockingIfLivestock(tankId)
  if (verdict) syncAlerts(tankId, verdict, { readingId: change.readingId, now: change.now, actor: change.actor })
}
