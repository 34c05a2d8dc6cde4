/**
 * Livestock and ammonia: fish already in a fish-in cycle, and the re-test after
 * new animals go in (their waste can outrun the bacteria).
 */

import { DAY_MS, formatWhen, HOUR_MS, toIso } from '../time'
import { mgN } from '../words'
import type { RuleContext } from '../context'
import type { TimedEvent } from '../history'
import { anyAfter, lastWhere } from '../reads'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'

function fishPresent(ctx: RuleContext): RuleResult {
  if (ctx.tank.cycleMethod !== 'fish-in' || ctx.phase === 'complete' || ctx.startedMs > ctx.nowMs) return NOTHING
  return report(
    'info',
    `Fish are already in this tank (fish-in cycle, since ${formatWhen(ctx.startedMs)}). Feed lightly, test ammonia every day, and add no more livestock until the cycle is complete.`,
    [],
  )
}

function lastLivestock(ctx: RuleContext): TimedEvent | undefined {
  return ctx.livestock[ctx.livestock.length - 1]
}

function ammoniaBefore(ctx: RuleContext, t: number): number {
  return lastWhere(ctx.history, t, true, r => r.ammoniaN !== undefined)?.ammoniaN ?? 0
}

function ammoniaRise(ctx: RuleContext): RuleResult {
  const added = lastLivestock(ctx)
  const latest = ctx.latest.ammoniaN
  if (added === undefined || latest === undefined || latest.t <= added.t) return NOTHING
  const th = ctx.thresholds
  // Only while the latest test is still up: once ammonia is back down, re-test advice is stale.
  if (latest.t > added.t + th.livestockWatchDays * DAY_MS) return NOTHING
  const before = ammoniaBefore(ctx, added.t)
  const value = latest.ammoniaN ?? 0
  if (value <= Math.max(before, th.ammoniaZeroN)) return NOTHING
  return report(
    'caution',
    `Ammonia rose from ${mgN(before)} to ${mgN(value)} (test of ${formatWhen(latest.t)}) after livestock went in on ${formatWhen(added.t)}: the bacteria have not caught up with the new load. Feed lightly and test ammonia again within a day.`,
    [latest],
    [{ kind: 'retest', message: 'Test ammonia again within a day of the rise.', dueBy: toIso(ctx.nowMs + th.retestHours * HOUR_MS) }],
  )
}

function retestAfterAdding(ctx: RuleContext): RuleResult {
  const added = lastLivestock(ctx)
  if (added === undefined) return NOTHING
  const th = ctx.thresholds
  const tested = anyAfter(ctx.history, added.t, r => r.ammoniaN !== undefined)
  if (tested || ctx.nowMs > added.t + th.livestockWatchDays * DAY_MS) return NOTHING
  const dueBy = added.t + th.retestHours * HOUR_MS
  return report(
    'info',
    `Livestock went in on ${formatWhen(added.t)} and ammonia has not been tested since. Test ammonia by ${formatWhen(dueBy)}.`,
    [],
    [{ kind: 'retest', message: 'Test ammonia after adding livestock.', dueBy: toIso(dueBy) }],
  )
}

/** Livestock rules. */
export const LIVESTOCK_RULES: readonly CycleRule[] = [
  {
    id: 'livestock.fish-present',
    description: 'A fish-in tank has fish from the start of the cycle; none more until it is complete.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: fishPresent,
  },
  {
    id: 'livestock.ammonia-rise',
    description: 'The latest ammonia test, within the watch days after livestock went in, above its level before (and above zero): re-test.',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: ammoniaRise,
  },
  {
    id: 'livestock.retest',
    description: 'Test ammonia again whenever livestock is added.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: retestAfterAdding,
  },
]
