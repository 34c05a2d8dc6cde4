/**
 * Salinity, temperature and (for stony corals) alkalinity, calcium and magnesium
 * against the company's ranges.
 */

import { DAY_MS, formatWhen } from '../time'
import { formatNumber } from '../words'
import type { RuleContext } from '../context'
import type { TimedReading } from '../history'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'

type RangeKey = 'salinity' | 'temperatureC' | 'alkalinityDkh' | 'calciumMgL' | 'magnesiumMgL'

interface Range {
  readonly key: RangeKey
  readonly name: string
  readonly unit: string
  readonly min: number
  readonly max: number
}

function outOfRange(ctx: RuleContext, range: Range): { test: TimedReading, words: string } | null {
  const test = ctx.latest[range.key]
  const value = test?.[range.key]
  if (test === undefined || value === undefined || (value >= range.min && value <= range.max)) return null
  const words = `${range.name} is ${formatNumber(value)}${range.unit} (test of ${formatWhen(test.t)}), outside ${formatNumber(range.min)}-${formatNumber(range.max)}${range.unit}.`
  return { test, words }
}

function salinityRange(ctx: RuleContext): RuleResult {
  const th = ctx.thresholds
  const bad = outOfRange(ctx, { key: 'salinity', name: 'Salinity', unit: '', min: th.salinityMin, max: th.salinityMax })
  if (bad === null) return NOTHING
  return report('caution', `${bad.words} Bring it back slowly, by no more than about 1 a day, with fresh water or salt mix.`, [bad.test])
}

function temperatureRange(ctx: RuleContext): RuleResult {
  const th = ctx.thresholds
  const bad = outOfRange(ctx, { key: 'temperatureC', name: 'Temperature', unit: ' C', min: th.temperatureMinC, max: th.temperatureMaxC })
  if (bad === null) return NOTHING
  return report('caution', `${bad.words} Check the heater and the room; warm water holds less oxygen.`, [bad.test])
}

/** Alkalinity, calcium and magnesium problems on their latest tests; untested values raise none. */
export function reefChemistryProblems(ctx: RuleContext): Array<{ test: TimedReading, words: string }> {
  const th = ctx.thresholds
  const ranges: Range[] = [
    { key: 'alkalinityDkh', name: 'Alkalinity', unit: ' dKH', min: th.alkalinityMinDkh, max: th.alkalinityMaxDkh },
    { key: 'calciumMgL', name: 'Calcium', unit: ' mg/L', min: th.calciumMinMgL, max: th.calciumMaxMgL },
    { key: 'magnesiumMgL', name: 'Magnesium', unit: ' mg/L', min: th.magnesiumMinMgL, max: th.magnesiumMaxMgL },
  ]
  return ranges.map(range => outOfRange(ctx, range)).filter(p => p !== null)
}

function reefChemistry(ctx: RuleContext): RuleResult {
  const problems = reefChemistryProblems(ctx)
  if (problems.length === 0) return NOTHING
  return report(
    'info',
    `${problems.map(p => p.words).join(' ')} This matters for stony corals, which wait until it is in range.`,
    problems.map(p => p.test),
  )
}

/** Whether salinity has held inside the target band, within the allowed spread, over the set days. */
export function salinityStability(ctx: RuleContext): { stable: boolean, words: string } {
  const th = ctx.thresholds
  const from = ctx.nowMs - th.salinityStableDays * DAY_MS
  const values = ctx.history.readings.filter(r => r.t >= from && r.salinity !== undefined).map(r => r.salinity ?? 0)
  const band = `${formatNumber(th.salinityTargetMin)}-${formatNumber(th.salinityTargetMax)}`
  const want = `salinity held at ${band}, varying by no more than ${formatNumber(th.salinityStableSpread)}, over the last ${th.salinityStableDays} days`
  if (values.length < 2) return { stable: false, words: `Stony corals need ${want}; there are ${values.length} salinity test(s) in that time, at least 2 are needed.` }
  const low = Math.min(...values)
  const high = Math.max(...values)
  const stable = low >= th.salinityTargetMin && high <= th.salinityTargetMax && high - low <= th.salinityStableSpread
  return { stable, words: stable ? '' : `Stony corals need ${want}; it ranged ${formatNumber(low)}-${formatNumber(high)}.` }
}

/** Environment rules. */
export const ENVIRONMENT_RULES: readonly CycleRule[] = [
  {
    id: 'salinity.range',
    description: 'Latest salinity outside the company range (default 30-37, target 33-35 practical salinity).',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: salinityRange,
  },
  {
    id: 'temperature.range',
    description: 'Latest temperature outside the company range (default 22-29 C).',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: temperatureRange,
  },
  {
    id: 'reef-chemistry.range',
    description: 'Latest alkalinity, calcium or magnesium outside the range stony corals need; only tested values are judged.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: reefChemistry,
  },
]
