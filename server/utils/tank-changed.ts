import type { Verdict } from '#shared/cycle/types'
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
  const verdict = refreshVerdict(tankId, change.now)
  advanceToStockingIfLivestock(tankId)
  if (verdict) syncAlerts(tankId, verdict, { readingId: change.readingId, now: change.now, actor: change.actor })
  return verdict
}
