/**
 * Stocking after the cycle: a large water change when a fishless cycle has left
 * nitrate high, feeding the bacteria of a cycled tank that waits for its animals, and
 * adding fish a few at a time with a re-test schedule.
 */

import { animalsInAt, type RuleContext } from '../context'
import type { TimedEvent } from '../history'
import { DAY_MS, formatWhen, HOUR_MS, toIso } from '../time'
import { mgNWithIon } from '../words'
import { NITRIFICATION_STOICHIOMETRY } from '../thresholds'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'
import { waterChangeActions } from './water-change'

/** When more fish may go in after the latest fish addition, or null when no fish were added. */
export function nextFishAllowedAt(ctx: RuleContext): { t: number, count: number, after: TimedEvent, large: boolean } | null {
  const fish = ctx.livestock.filter(e => (e.event.group ?? 'fish') === 'fish')
  const after = fish[fish.length - 1]
  if (after === undefined) return null
  const th = ctx.thresholds
  const count = Math.max(1, Math.round(after.event.amount ?? 1))
  const large = count > th.stockingBatchMax
  return { t: after.t + (large ? th.stockingLargeIntervalDays : th.stockingIntervalDays) * DAY_MS, count, after, large }
}

function beforeStocking(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'complete' || ctx.tank.cycleMethod !== 'fishless' || animalsInAt(ctx, ctx.nowMs)) return NOTHING
  const test = ctx.latest.nitrateN
  const limit = ctx.thresholds.nitrateMaxFishN
  const value = test?.nitrateN ?? 0
  if (test === undefined || value <= limit) return NOTHING
  return report(
    'info',
    `The cycle has left nitrate at ${mgNWithIon(value, 'NO3')} (test of ${formatWhen(test.t)}), above the ${mgNWithIon(limit, 'NO3')} fish can go in at. A large water change before stocking is usual.`,
    [test],
    waterChangeActions(ctx, 'nitrate', value, limit, 'before stocking'),
  )
}

function keepFeeding(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'complete' || ctx.tank.cycleMethod !== 'fishless' || animalsInAt(ctx, ctx.nowMs)) return NOTHING
  const th = ctx.thresholds
  let lastDose = Number.NEGATIVE_INFINITY
  for (const { event, t } of ctx.history.events) if (event.kind === 'ammonia-dose') lastDose = t
  if (ctx.nowMs - lastDose <= th.ghostFeedHours * HOUR_MS) return NOTHING
  return report(
    'caution',
    `The tank is cycled but has no livestock, and no ammonia has been dosed since ${formatWhen(lastDose)}. Without food the bacteria die back within days: keep dosing about ${mgNWithIon(th.clearanceDoseN, 'NH3')} every day until the first animals go in.`,
    [],
    [{ kind: 'dose-ammonia', message: 'Dose ammonia today and every day until stocking.', dueBy: toIso(ctx.nowMs) }],
  )
}

function stockingRate(ctx: RuleContext): RuleResult {
  const next = nextFishAllowedAt(ctx)
  if (next === null || ctx.nowMs >= next.t) return NOTHING
  const th = ctx.thresholds
  const days = Math.min(th.livestockWatchDays, Math.ceil((next.t - next.after.t) / DAY_MS))
  const schedule = Array.from({ length: days }, (_, i) => formatWhen(next.after.t + (i + 1) * DAY_MS).slice(0, 10)).join(', ')
  const size = next.large ? `a large addition (${next.count} animals, more than ${th.stockingBatchMax})` : `${next.count} animal(s)`
  return report(
    next.large ? 'caution' : 'info',
    `${size} went in on ${formatWhen(next.after.t)}. Add no more fish before ${formatWhen(next.t)}, and test ammonia and nitrite each day: ${schedule}.`,
    [],
    [{ kind: 'retest', message: 'Test ammonia and nitrite the day after adding livestock, then daily for a week.', dueBy: toIso(Math.max(ctx.nowMs, next.after.t + th.retestHours * HOUR_MS)) }],
  )
}

/** Stocking rules. */
export const STOCKING_RULES: readonly CycleRule[] = [
  {
    id: 'water-change.before-stocking',
    description: 'A fishless cycle that leaves nitrate above the fish limit calls for a large water change before stocking.',
    source: `${NITRIFICATION_STOICHIOMETRY}; a large water change before stocking is ${COMMON_PRACTICE}`,
    severities: ['info'],
    evaluate: beforeStocking,
  },
  {
    id: 'cycle.keep-feeding',
    description: 'A cycled tank without livestock must be fed ammonia every day or two, or the bacteria starve.',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: keepFeeding,
  },
  {
    id: 'livestock.stocking-rate',
    description: 'After an addition of fish, more wait a week (two after a large addition), with ammonia and nitrite tested daily.',
    source: COMMON_PRACTICE,
    severities: ['info', 'caution'],
    evaluate: stockingRate,
  },
]
