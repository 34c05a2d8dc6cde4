/**
 * The water change that brings a concentration under its limit, from the
 * dilution calculator, aiming a margin below the limit so one test's error does
 * not leave the tank straddling it.
 */

import { waterChangePercentToReach } from '../../../calc/water-change'
import { formatWhen, HOUR_MS, toIso } from '../time'
import { formatPercent, mgN } from '../words'
import type { RuleContext } from '../context'
import type { CycleAction } from '../types'

/** Percent of the volume to replace so `current` falls to `limit` x the target fraction (new water assumed free of it). */
export function percentToBringUnder(current: number, limit: number, targetFraction: number): number {
  const target = limit * Math.min(1, targetFraction)
  if (target <= 0) return 100
  return waterChangePercentToReach({ current, target, replacement: 0 })
}

/** A water-change action now and the re-test after it. */
export function waterChangeActions(ctx: RuleContext, what: string, current: number, limit: number): CycleAction[] {
  const percent = percentToBringUnder(current, limit, ctx.thresholds.waterChangeTargetFraction)
  const litres = (ctx.tank.volumeLitres * Math.ceil(percent)) / 100
  const volume = Number.isFinite(litres) && litres > 0 ? ` (about ${Math.round(litres)} L)` : ''
  const retestBy = ctx.nowMs + ctx.thresholds.dangerRetestHours * HOUR_MS
  return [
    {
      kind: 'water-change',
      message: `Change ${formatPercent(percent)} of the water${volume} now to bring ${what} from ${mgN(current)} to under ${mgN(limit)}. Match the new water's temperature and salinity to the tank.`,
      waterChangePercent: percent,
      dueBy: toIso(ctx.nowMs),
    },
    {
      kind: 'retest',
      message: `Test ammonia and nitrite again after the water change, by ${formatWhen(retestBy)}.`,
      dueBy: toIso(retestBy),
    },
  ]
}
