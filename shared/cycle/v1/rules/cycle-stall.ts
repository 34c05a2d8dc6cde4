/**
 * A stalled cycle: ammonia or nitrite high and flat for many days. Usually the
 * water, not time, is the problem, so the advice is what to check.
 */

import { DAY_MS, formatDuration, formatWhen, toIso } from '../time'
import { mgN } from '../words'
import type { RuleContext } from '../context'
import type { TimedReading } from '../history'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'

type Value = 'ammoniaN' | 'nitriteN'

interface Stretch {
  readonly first: TimedReading
  readonly last: TimedReading
  readonly peak: number
}

/** The unbroken run of tests, ending at the latest one, with `key` above `limit`; null if the latest is not above it. */
function highStretch(readings: readonly TimedReading[], key: Value, limit: number, notBefore: number): Stretch | null {
  let first: TimedReading | null = null
  let last: TimedReading | null = null
  let peak = 0
  for (let i = readings.length - 1; i >= 0; i -= 1) {
    const r = readings[i]
    if (r === undefined || r.t <= notBefore) break
    const value = r[key]
    if (value === undefined) continue
    if (value <= limit) break
    last ??= r
    first = r
    peak = Math.max(peak, value)
  }
  return first && last ? { first, last, peak } : null
}

function lastDoseTime(ctx: RuleContext): number {
  let t = Number.NEGATIVE_INFINITY
  for (const { event, t: at } of ctx.history.events) if (event.kind === 'ammonia-dose') t = at
  return t
}

function isStalled(ctx: RuleContext, stretch: Stretch | null, key: Value): stretch is Stretch {
  if (stretch === null) return false
  const flat = (stretch.last[key] ?? 0) > (1 - ctx.thresholds.fallFraction) * stretch.peak
  return flat && stretch.last.t - stretch.first.t >= ctx.thresholds.stallDays * DAY_MS
}

// Nitrifying bacteria slow down in acid, cold, poorly aerated or over-dosed water (common practice).
function checks(ctx: RuleContext): string {
  const th = ctx.thresholds
  return `Check that pH is 7.8-8.4, alkalinity is not low, temperature is ${th.temperatureMinC}-${th.temperatureMaxC} C, salinity is ${th.salinityMin}-${th.salinityMax}, and the water moves and is aerated. Stop dosing ammonia until nitrite falls; a dose of bottled nitrifying bacteria can help. If nitrite is very high, a partial water change lowers it.`
}

function stalled(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'ammonia' && ctx.phase !== 'nitrite') return NOTHING
  const th = ctx.thresholds
  const readings = ctx.history.readings
  const nitrite = highStretch(readings, 'nitriteN', th.nitriteStallN, Number.NEGATIVE_INFINITY)
  // A dose raises ammonia on purpose, so an ammonia stall is counted from the last dose.
  const ammonia = highStretch(readings, 'ammoniaN', th.ammoniaZeroN, lastDoseTime(ctx))
  const which: Array<[string, Stretch]> = []
  if (isStalled(ctx, nitrite, 'nitriteN')) which.push(['Nitrite', nitrite])
  if (isStalled(ctx, ammonia, 'ammoniaN')) which.push(['Ammonia', ammonia])
  if (which.length === 0) return NOTHING
  const parts = which.map(([name, s]) => `${name} has stayed above ${mgN(name === 'Nitrite' ? th.nitriteStallN : th.ammoniaZeroN)} for ${formatDuration(s.last.t - s.first.t)} (since ${formatWhen(s.first.t)}, peak ${mgN(s.peak)}) without falling.`)
  return report(
    'caution',
    `The cycle looks stalled. ${parts.join(' ')}`,
    which.flatMap(([, s]) => [s.first, s.last]),
    [{ kind: 'check-stall', message: checks(ctx), dueBy: toIso(ctx.nowMs) }],
  )
}

/** Stall rule. */
export const STALL_RULES: readonly CycleRule[] = [
  {
    id: 'cycle.stalled',
    description: 'Nitrite above the stall level, or ammonia above zero since the last dose, for the stall time without falling by the fall fraction.',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: stalled,
  },
]
