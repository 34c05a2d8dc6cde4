/**
 * The water change that brings a concentration under its limit, from the
 * dilution calculator, aiming a margin below the limit so one test's error does
 * not leave the tank straddling it.
 */

import { waterChangePercentToReach } from '../../calc/water-change'
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

/**
 * A water-change action now and the re-test after it. One change never exceeds
 * `waterChangeMaxPercent` (about half: a bigger swing in temperature and salinity
 * harms animals); when more is needed it is repeated after a re-test.
 */
export function waterChangeActions(ctx: RuleContext, what: string, current: number, limit: number, when = 'now'): CycleAction[] {
  const needed = percentToBringUnder(current, limit, ctx.thresholds.waterChangeTargetFraction)
  const percent = Math.min(needed, ctx.thresholds.waterChangeMaxPercent)
  const litres = (ctx.tank.volumeLitres * Math.ceil(percent)) / 100
  const volume = Number.isFinite(litres) && litres > 0 ? ` (about ${Math.round(litres)} L)` : ''
  const retestBy = ctx.nowMs + ctx.thresholds.dangerRetestHours * HOUR_MS
  const goal = needed > percent
    ? `to bring ${what} down from ${mgN(current)}; no more than ${formatPercent(percent)} at a time. Test again after it and repeat, a test between each change, until ${what} is under ${mgN(limit)}.`
    : `to bring ${what} from ${mgN(current)} to under ${mgN(limit)}.`
  return [
    {
      kind: 'water-change',
      message: `Change ${formatPercent(percent)} of the water${volume} ${when} ${goal} Match the new water's temperature and salinity to the tank.`,
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
