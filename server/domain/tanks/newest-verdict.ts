/**
 * A tank's stored verdict is never replaced by one made from older data. Verdicts are made in
 * two places: on the request loop, at once, for an ordinary tank; in the heavy-work pool for a
 * tank with a long history (verdict-off-loop.ts), where the data may move while the engine runs.
 * A tank crosses LONG_HISTORY_TESTS both ways (an import, a delete), so a result from the pool
 * can come back after the loop stored a verdict made from newer data.
 *
 * The tank's data revision counts the changes this process has reacted to: every write to a
 * tank's readings, events or profile goes through onTankDataChanged, which notes it here once
 * the write is committed and before the verdict is refreshed. An evaluation is labelled with the
 * revision as it stood before it read anything, so its data is at least that new; the revision
 * each tank's stored verdict was made from is kept, and a result labelled older is not stored.
 * Both are kept in this process's memory, as only the serving process stores verdicts after a
 * change: after a restart the first store sets the mark again. Framework-free: takes a `Db`.
 */
import type { Verdict } from '#shared/cycle/types'
import type { Db } from '#server/db/connection'
import { evaluateTankNow, storeVerdict, type TankEvaluation } from '#server/db/verdicts'

const revisions = new Map<string, number>()
/** The revision each tank's stored verdict was made from. */
const storedRevisions = new Map<string, number>()

/** Notes that the tank's data changed (called once the change is committed, before the verdict is refreshed). */
export function noteTankDataChanged(tankId: string): void {
  revisions.set(tankId, (revisions.get(tankId) ?? 0) + 1)
}

/** The tank's data revision in this process: moves on every noted change. */
export function tankDataRevision(tankId: string): number {
  return revisions.get(tankId) ?? 0
}

/** A verdict made after a change, and whether it was stored (false: one made from newer data was stored first). */
export interface VerdictRefresh {
  verdict: Verdict
  stored: boolean
}

/**
 * Stores the evaluation made as of `now` from data at least as new as `revision`, unless the
 * stored verdict was made from a newer revision. Made from the same revision, it is stored (the
 * same data; the later store is the later ask). Returns whether it was stored.
 */
export function storeVerdictIfNewer(db: Db, tankId: string, evaluation: TankEvaluation, now: Date, revision: number): boolean {
  // Compared and stored in one synchronous step: no other store on this loop can come between.
  if (revision < (storedRevisions.get(tankId) ?? -Infinity)) return false
  storeVerdict(db, tankId, evaluation, now.toISOString())
  storedRevisions.set(tankId, revision)
  return true
}

/**
 * Evaluates the tank here, at once, and stores the verdict (the request loop's path, for a tank
 * without a long history); undefined when there is no such tank. Read and evaluated in one
 * synchronous step, so it is made from the newest data and always stored; the revision is noted
 * so that a pool result from older data cannot overwrite it.
 */
export function refreshVerdictOnLoop(db: Db, tankId: string, now: Date): VerdictRefresh | undefined {
  const revision = tankDataRevision(tankId)
  const evaluation = evaluateTankNow(db, tankId, now)
  if (!evaluation) return undefined
  return { verdict: evaluation.verdict, stored: storeVerdictIfNewer(db, tankId, evaluation, now, revision) }
}
