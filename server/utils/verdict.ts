import type { Verdict } from '#shared/cycle/types'
import type { CitedRules } from '#shared/types/readings'
import { parsedOncePerText } from '#server/db/parsed-text'
import { storedVerdictRow, tanksWithStaleVerdicts, verdictNeedsRemaking } from '#server/db/verdicts'
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

/** Most stored verdict texts kept read at once (one per tank read lately; this bounds memory, not a tank count). */
export const READ_VERDICTS_KEPT = 512

/**
 * A stored verdict's text read once per distinct text, with the rules it cites: a read of the
 * verdict paid for the JSON and the rules' words on every request, though a verdict's text only
 * changes when it is made again (a new text, read at once). Frozen, shared by every reader.
 */
const verdictOfText = parsedOncePerText((text): { verdict: Verdict, rules: CitedRules } => {
  const verdict = JSON.parse(text) as Verdict
  return { verdict, rules: rulesCitedBy(verdict) }
}, READ_VERDICTS_KEPT)

/**
 * The tank's stored verdict as of `now`, with the rules its findings and livestock blockers cite:
 * made again first when it is missing or stale (`verdictNeedsRemaking`, as the worker's round
 * decides). The verdict and rules are frozen: readers share them.
 */
export async function currentVerdictRow(tankId: string, now = new Date()) {
  const db = useDB()
  let row = storedVerdictRow(db, tankId)
  if (!row || verdictNeedsRemaking(row, now, verdictIntervalMs())) {
    await refreshStaleVerdicts(now, [tankId])
    row = storedVerdictRow(db, tankId)
  }
  if (!row) return undefined
  const { verdict, rules } = verdictOfText(row.verdictText)
  return { tankId, phase: row.phase, verdict, rules, ruleSetVersion: row.ruleSetVersion, evaluatedAt: row.evaluatedAt, stale: row.stale }
}
