import type { Verdict } from '#shared/cycle/types'
import { computeAndStoreVerdict } from '../db/verdicts'

/** Re-evaluates a tank after any change to its readings, events or profile, and stores the verdict. */
export function refreshVerdict(tankId: string, now = new Date()): Verdict | undefined {
  return computeAndStoreVerdict(useDB(), tankId, now)
}
