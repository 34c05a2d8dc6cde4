import type { Verdict } from '#shared/cycle/types'
import type { AppendedTest } from '#server/domain/readings/engine-input-cache'
import { hasLongHistory } from '#server/domain/tanks/long-history'
import { noteTankDataChanged, type VerdictRefresh } from '#server/domain/tanks/newest-verdict'
import { refreshVerdictOffLoop } from '#server/domain/tanks/verdict-off-loop'
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
 * stays free meanwhile: one evaluation per tank at a time, changes that arrive while it runs
 * joining the next one (server/domain/tanks/verdict-off-loop.ts). Every other tank is
 * evaluated here, at once. Either way the verdict is stored only if none made from newer
 * data was stored first (server/domain/tanks/newest-verdict.ts).
 */
export async function onTankDataChanged(tankId: string, change: TankChange = {}): Promise<Verdict | undefined> {
  noteTankDataChanged(tankId)
  const db = useDB()
  // Past the bound (SAVED_BUT_BUSY) the stored verdict stays behind the data until the next change or the worker's verdict round.
  if (hasLongHistory(db, tankId)) {
    // Its store waits for the write lock off the loop too (an import's lock is likeliest on such a tank).
    const refreshed = await answeredBusy(refreshVerdictOffLoop(db, tankId, evaluateOffLoop, () => change.now ?? new Date(), change.appended, writeWaitMs()), SAVED_BUT_BUSY)
    await writeTransaction(() => followVerdict(tankId, refreshed, change), SAVED_BUT_BUSY)
    return refreshed?.verdict
  }
  // Evaluated, stored and followed in one write transaction, its lock waited for off the loop once:
  // nothing else of this loop runs between the read, the store and the alerts.
  return writeTransaction(() => {
    const refreshed = refreshVerdict(tankId, change.now)
    followVerdict(tankId, refreshed, change)
    return refreshed?.verdict
  }, SAVED_BUT_BUSY)
}

/** What follows from a verdict: the move to stocking once livestock is logged, and the alerts. */
function followVerdict(tankId: string, refreshed: VerdictRefresh | undefined, change: TankChange): void {
  advanceToStockingIfLivestock(tankId)
  // Alerts follow the stored verdict: one from older data, not stored, would undo what the newer one's change did.
  if (refreshed?.stored) syncAlerts(tankId, refreshed.verdict, { readingId: change.readingId, now: change.now, actor: change.actor })
}
