/**
 * Testing discipline while the tank cycles: a test is expected at least every
 * `testIntervalHours`; a verdict on stale tests is a guess.
 */

import { latestNitrogen } from '../reads'
import { formatDuration, formatWhen, HOUR_MS, toIso } from '../time'
import type { RuleContext } from '../context'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'

function overdue(ctx: RuleContext): RuleResult {
  if (ctx.phase === 'complete' || ctx.phase === 'not-started') return NOTHING
  const last = latestNitrogen(ctx.history)
  // Before the first test the clock runs from when the cycle started.
  const since = Math.max(last?.t ?? Number.NEGATIVE_INFINITY, ctx.sourceT ?? ctx.startedMs)
  const limit = ctx.thresholds.testIntervalHours
  if (ctx.nowMs - since <= limit * HOUR_MS) return NOTHING
  const what = last === null ? 'No ammonia or nitrite test yet' : `No ammonia or nitrite test for ${formatDuration(ctx.nowMs - last.t)} (last ${formatWhen(last.t)})`
  return report(
    'caution',
    `${what}. While the tank cycles, test at least every ${limit} h.`,
    [last],
    [{ kind: 'test-now', message: 'Test ammonia, nitrite and nitrate now, with pH, temperature and salinity.', dueBy: toIso(ctx.nowMs) }],
  )
}

/** Testing rules. */
export const TESTING_RULES: readonly CycleRule[] = [
  {
    id: 'testing.overdue',
    description: 'While cycling, no ammonia or nitrite test for longer than the expected test interval.',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: overdue,
  },
]
