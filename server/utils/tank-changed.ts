import type { Verdict } from '#shared/cycle/types'
import { noteTankDataChanged, refreshVerdictOffLoop } from '#server/domain/tanks/verdict-off-loop'
import type { Actor } from './access'

export interface TankChange {
  /** The reading that was added or edited, when there is one: alerts record it. */
  readingId?: string
  actor?: Actor
  now?: Date
}

/**
 * The one place that reacts to a change in a tank's readings, events or profile: the
 * verdict is re-evaluated and stored, then everything that follows from a verdict
 * (alerts, notifications) runs from here. Routes call this after their write.
 */
export function onTankDataChanged(tankId: string, change: TankChange = {}): Verdict | undefined {
  noteTankDataChanged(tankId)
  const verdict = refreshVerdict(tankId, change.now)
  followVerdict(tankId, verdict, change)
  return verdict
}

/**
 * The same reaction with the engine run in the heavy-work pool, for a change over a long
 * history (a CSV import): the request loop stays free while it evaluates. A write that lands
 * meanwhile refreshes the verdict itself and makes this evaluation run again, so the stored
 * verdict is never older than the data (server/domain/tanks/verdict-off-loop.ts).
 */
export async function onTankDataChangedOffLoop(tankId: string, change: Omit<TankChange, 'now'> = {}): Promise<Verdict | undefined> {
  noteTankDataChanged(tankId)
  const verdict = await refreshVerdictOffLoop(useDB(), tankId, evaluateOffLoop)
  followVerdict(tankId, verdict, change)
  return verdict
}

/** What follows from a stored verdict: the move to stocking once livestock is logged, and the alerts. */
function followVerdict(tankId: string, verdict: Verdict | undefined, change: TankChange): void {
  advanceToStockingIfLivestock(tankId)
  if (verdict) syncAlerts(tankId, verdict, { readingId: change.readingId, now: change.now, actor: change.actor })
}
