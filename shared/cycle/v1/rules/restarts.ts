/**
 * Why the count of zero tests started again: a long gap between tests, or a water
 * change. Both would otherwise let missing days or dilution pass for bacteria.
 */

import { formatDuration, formatWhen } from '../time'
import type { RuleContext } from '../context'
import { COMMON_PRACTICE, type CycleRule, type Hit, type RuleResult } from './rule'

function gaps(ctx: RuleContext): RuleResult {
  const hits: Hit[] = []
  for (const restart of ctx.course.restarts) {
    if (restart.reason !== 'gap') continue
    hits.push({
      severity: 'info',
      message: `No ammonia or nitrite test from ${formatWhen(restart.from.t)} to ${formatWhen(restart.to.t)} (${formatDuration(restart.to.t - restart.from.t)}): what happened in between is unknown${restart.endedRun ? ', so the count of zero tests started again after it' : ''}.`,
      readings: [restart.from, restart.to],
    })
  }
  return { hits, actions: [] }
}

function dilution(ctx: RuleContext): RuleResult {
  const hits: Hit[] = []
  for (const restart of ctx.course.restarts) {
    if (restart.reason !== 'water-change') continue
    const effects = [
      restart.endedRun ? 'the count of zero tests started again after it' : null,
      restart.dilutedDose ? 'the ammonia dose before it cannot count as cleared' : null,
    ].filter(e => e !== null)
    hits.push({
      severity: 'info',
      message: `The water change of ${formatWhen(restart.t)} lowers ammonia and nitrite by dilution, not by bacteria: ${effects.join(', and ')}.`,
      readings: [],
    })
  }
  return { hits, actions: [] }
}

/** Restart rules. */
export const RESTART_RULES: readonly CycleRule[] = [
  {
    id: 'testing.gap',
    description: 'Before completion, a gap between ammonia or nitrite tests longer than the set maximum restarts the count of zero tests.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: gaps,
  },
  {
    id: 'water-change.dilution',
    description: 'Before completion, a water change restarts the count of zero tests and voids an ammonia dose still inside its window: dilution is not nitrification.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: dilution,
  },
]
