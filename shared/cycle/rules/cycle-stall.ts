/**
 * A stalled cycle, judged on the trend over a window of tests rather than the latest
 * value against a peak, so it does not flicker from one test to the next: ammonia or
 * nitrite high over the whole window, not trending down, and no nitrate being made.
 * Nitrite at the top of the kit while nitrate climbs is progress, not a stall. Usually
 * the water, not time, is the problem, so the advice names what to check.
 */

import { DAY_MS, formatDuration, formatWhen, toIso } from '../time'
import { formatNumber, mgN, mgNWithIon } from '../words'
import type { RuleContext } from '../context'
import type { TimedReading } from '../history'
import { lastReading, readingsFrom } from '../reads'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'

type Value = 'ammoniaN' | 'nitriteN'

interface Trend {
  readonly first: TimedReading
  readonly last: TimedReading
  readonly peak: number
}

/**
 * Start and end of the stall window. From rule set 2.0.1 it ends at the latest test, so a
 * stall seen yesterday does not vanish while nobody tests; 2.0.0 ended it at now.
 */
function stallWindow(ctx: RuleContext): { from: number, to: number } {
  const last = lastReading(ctx.history)
  const to = ctx.options.stallWindowAtLatestTest && last !== undefined ? Math.min(ctx.nowMs, last.t) : ctx.nowMs
  return { from: to - ctx.thresholds.stallDays * DAY_MS, to }
}

function mean(values: readonly number[]): number {
  return values.reduce((a, b) => a + b, 0) / Math.max(1, values.length)
}

/** The window's tests of `key` when every one is above `limit` and the last third is not below the first by the fall fraction. */
function flatHigh(ctx: RuleContext, key: Value, limit: number): Trend | null {
  const { from, to } = stallWindow(ctx)
  const tests = readingsFrom(ctx.history, from, to).filter(r => r[key] !== undefined)
  const first = tests[0]
  const last = tests[tests.length - 1]
  // The window must be covered by tests: a stall is a trend, and two tests are not one.
  if (first === undefined || last === undefined || tests.length < 4 || last.t - first.t < (ctx.thresholds.stallDays - 2) * DAY_MS) return null
  const values = tests.map(r => r[key] ?? 0)
  if (values.some(v => v <= limit)) return null
  const third = Math.max(1, Math.floor(values.length / 3))
  const falling = mean(values.slice(-third)) < (1 - ctx.thresholds.fallFraction) * mean(values.slice(0, third))
  return falling ? null : { first, last, peak: Math.max(...values) }
}

/** Nitrate made over the window: the bacteria are working even if nitrite stays high. */
function nitrateClimbing(ctx: RuleContext): boolean {
  const { from, to } = stallWindow(ctx)
  const tests = readingsFrom(ctx.history, from, to).filter(r => r.nitrateN !== undefined)
  const first = tests[0]
  const last = tests[tests.length - 1]
  return first !== undefined && last !== undefined && (last.nitrateN ?? 0) - (first.nitrateN ?? 0) >= ctx.thresholds.nitrateRiseN
}

// Nitrifying bacteria slow down in acid, low-alkalinity, cold, poorly aerated or over-dosed water (common practice).
function checks(ctx: RuleContext): string {
  const th = ctx.thresholds
  const alk = ctx.latest.alkalinityDkh
  const pH = ctx.latest.pH
  const known = [
    alk ? `alkalinity read ${formatNumber(alk.alkalinityDkh ?? 0)} dKH on ${formatWhen(alk.t)}` : 'alkalinity has not been tested',
    pH ? `pH read ${formatNumber(pH.pH ?? 0)} on ${formatWhen(pH.t)}` : 'pH has not been tested',
  ].join(' and ')
  return `Usual causes: low alkalinity or pH (nitrification uses up alkalinity: keep it at ${th.alkalinityMinDkh}-${th.alkalinityMaxDkh} dKH and pH at ${th.pHMin}-${th.pHMax}; ${known}), or too high a dose (keep doses near ${mgNWithIon(th.clearanceDoseN, 'NH3')}, lower them while nitrite is off the kit). Also check temperature ${th.temperatureMinC}-${th.temperatureMaxC} C, salinity ${th.salinityMin}-${th.salinityMax}, and that the water moves and is aerated. A dose of bottled nitrifying bacteria can help; if nitrite is very high, a partial water change lowers it.`
}

function stalled(ctx: RuleContext): RuleResult {
  if (ctx.phase === 'complete' || ctx.phase === 'not-started') return NOTHING
  // Nitrate being made clears a stall whatever the curves do: asked first, so the window's curves are read only when it is not.
  if (nitrateClimbing(ctx)) return NOTHING
  const th = ctx.thresholds
  const which: Array<[string, Trend, number]> = []
  const nitrite = flatHigh(ctx, 'nitriteN', th.nitriteStallN)
  const ammonia = flatHigh(ctx, 'ammoniaN', th.riseN)
  if (nitrite) which.push(['Nitrite', nitrite, th.nitriteStallN])
  if (ammonia) which.push(['Ammonia', ammonia, th.riseN])
  if (which.length === 0) return NOTHING
  const parts = which.map(([name, s, limit]) => `${name} has stayed above ${mgN(limit)} on every test for ${formatDuration(s.last.t - s.first.t)} (since ${formatWhen(s.first.t)}, peak ${mgN(s.peak)}) without trending down, and nitrate is not rising.`)
  return report(
    'caution',
    `The cycle looks stalled. ${parts.join(' ')}`,
    which.flatMap(([, s]) => [s.first, s.last]),
    [{ kind: 'check-stall', message: checks(ctx), dueBy: toIso(ctx.nowMs) }],
  )
}

function lowerDose(ctx: RuleContext): RuleResult {
  if (ctx.phase === 'complete' || ctx.tank.cycleMethod !== 'fishless') return NOTHING
  const th = ctx.thresholds
  const test = ctx.latest.nitriteN
  if (test === undefined || (test.nitriteN ?? 0) < th.doseLowerNitriteN) return NOTHING
  const half = th.clearanceDoseN / 2
  return report(
    'info',
    `Nitrite is ${mgNWithIon(test.nitriteN ?? 0, 'NO2')} (test of ${formatWhen(test.t)}), at the top of common kits. Very high nitrite slows the bacteria that remove it: lower the doses to about ${mgNWithIon(half, 'NH3')} until nitrite reads below ${mgNWithIon(th.doseLowerNitriteN, 'NO2')}.`,
    [test],
    [{ kind: 'lower-dose', message: `Dose about ${mgNWithIon(half, 'NH3')} instead of ${mgNWithIon(th.clearanceDoseN, 'NH3')} until nitrite falls.`, dueBy: toIso(ctx.nowMs) }],
  )
}

/** Stall and dosing rules. */
export const STALL_RULES: readonly CycleRule[] = [
  {
    id: 'cycle.stalled',
    description: 'Over the stall window, ammonia or nitrite high on every test with no downward trend, and nitrate not rising.',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: stalled,
  },
  {
    id: 'dosing.lower',
    description: 'Fishless, nitrite at the top of common kits (5 ppm as NO2): lower the ammonia doses until it falls.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: lowerDose,
  },
]
