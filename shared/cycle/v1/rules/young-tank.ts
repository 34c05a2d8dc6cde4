/**
 * Soft corals tolerate a young tank, so they may go in at completion, ahead of
 * stony corals; the caution says to go slowly while the bacteria catch up.
 */

import { DAY_MS, formatWhen } from '../time'
import type { RuleContext } from '../context'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'

function youngTank(ctx: RuleContext): RuleResult {
  const done = ctx.course.completion
  if (done === null) return NOTHING
  const th = ctx.thresholds
  const softFrom = done.reading.t + Math.max(0, th.softCoralDelayDays) * DAY_MS
  const stonyFrom = done.reading.t + Math.min(th.lpsCoralDelayDays, th.spsCoralDelayDays) * DAY_MS
  if (ctx.nowMs < softFrom || ctx.nowMs >= stonyFrom) return NOTHING
  return report(
    'caution',
    `The tank is young (cycle complete on ${formatWhen(done.reading.t)}). Hardy soft corals may go in now, a few at a time, with ammonia tested the day after each addition.`,
    [done.reading],
  )
}

/** Young-tank rule. */
export const YOUNG_TANK_RULES: readonly CycleRule[] = [
  {
    id: 'readiness.soft-coral-young-tank',
    description: 'Between completion and the stony-coral wait, soft corals may go in with a caution.',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: youngTank,
  },
]
