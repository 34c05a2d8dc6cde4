/**
 * Tells the user which tests the engine could not use, so a verdict never
 * silently rests on less than was entered.
 */

import type { RuleContext } from '../context'
import { repairedReadings } from '../reads'
import { COMMON_PRACTICE, type CycleRule, type Hit, type RuleResult } from './rule'

function ignored(ctx: RuleContext): RuleResult {
  const hits: Hit[] = []
  const { ignoredReadingIds, repairedReadingIds } = ctx.history
  if (ignoredReadingIds.length > 0) {
    hits.push({
      severity: 'info',
      message: `${ignoredReadingIds.length} test(s) were left out because their time did not read as a date (${ignoredReadingIds.join(', ')}).`,
      readings: [],
    })
  }
  if (repairedReadingIds.length > 0) {
    hits.push({
      severity: 'info',
      message: `${repairedReadingIds.length} test(s) had a value that was negative or not a number; that value was left out.`,
      readings: repairedReadings(ctx.history),
    })
  }
  return { hits, actions: [] }
}

/** Input rules. */
export const INPUT_RULES: readonly CycleRule[] = [
  {
    id: 'input.ignored',
    description: 'Tests with an unreadable time are left out and negative or non-numeric values dropped, and the verdict says so. (Tests after the verdict time are silently outside it.)',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: ignored,
  },
]
