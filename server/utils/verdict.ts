import { eq, sql } from 'drizzle-orm'
import { tankVerdicts } from '#server/db/schema'
import { preparedPerDb } from '#server/db/prepared'
import { tanksWithStaleVerdicts } from '#server/db/verdicts'
import { refreshVerdictOnLoop, type VerdictRefresh } from '#server/domain/tanks/newest-verdict'

const MINUTE_MS = 60_000
/** Time alone changes verdicts (a missed test, a coral date reached): none is kept longer than an hour. */
const LONGEST_MS = 60 * MINUTE_MS

/**
 * Re-evaluates a tank on the request loop after any change to its readings, events or profile,
 * and stores the verdict, noting the revision it was made from (server/domain/tanks/newest-verdict.ts).
 */
export function refreshVerdict(tankId: string, now = new Date()): VerdictRefresh | undefined {
  return refreshVerdictOnLoop(useDB(), tankId, now)
}

/**
 * How long a stored verdict stands before it is made again: the verdict round of the worker
 * (runtime config `verdictIntervalMs`, default 15 minutes, never more than an hour).
 */
export function verdictIntervalMs(): number {
  const configured = Number(useRuntimeConfig().verdictIntervalMs)
  return Number.isFinite(configured) && configured > 0 ? Math.min(configured, LONGEST_MS) : 15 * MINUTE_MS
}

/**
 * Makes again, as of `now`, every stored verdict that is missing or older than the verdict
 * interval (among `tankIds` when given, otherwise for every tank not archived), opening and
 * resolving alerts exactly as a new reading would. Returns how many were made again.
 */
export async function refreshStaleVerdicts(now: Date, tankIds?: readonly string[]): Promise<number> {
  const stale = tanksWithStaleVerdicts(useDB(), now, verdictIntervalMs(), tankIds)
  for (const tankId of stale) await onTankDataChanged(tankId, { now })
  return stale.length
}

/** One tank's stored verdict, prepared once; the forecast beside it is left to the routes that show it. */
const storedVerdict = preparedPerDb(db => db.select({ tankId: tankVerdicts.tankId, phase: tankVerdicts.phase, verdict: tankVerdicts.verdict,
  ruleSetVersion: tankVerdicts.ruleSetVersion, evaluatedAt: tankVerdicts.evaluatedAt, stale: tankVerdicts.stale })
  .from(tankVerdicts).where(eq(tankVerdicts.tankId, sql.placeholder('tankId'))).prepare())

/** The tank's stored verdict row as of `now`: made again first when it is missing or stale. */
export async function currentVerdictRow(tankId: string, now = new Date()) {
  await refreshStaleVerdicts(now, [tankId])
  return storedVerdict(useDB()).get({ tankId })
}
