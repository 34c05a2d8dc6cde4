/**
 * Salinity, temperature and (for stony corals) alkalinity, calcium and magnesium
 * against the company's ranges.
 */

import { DAY_MS, formatWhen } from '../time'
import { formatNumber } from '../words'
import { animalsInAt, type RuleContext } from '../context'
import type { TimedReading } from '../history'
import { readingsFrom } from '../reads'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'

type RangeKey = 'salinity' | 'temperatureC' | 'pH' | 'alkalinityDkh' | 'calciumMgL' | 'magnesiumMgL'

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

/**
 * A value outside its hard limits with animals in is a danger (it alerts); outside the
 * usual range otherwise a caution.
 */
function guarded(ctx: RuleContext, usual: Range, hard: Range, advice: string): RuleResult {
  const danger = outOfRange(ctx, hard)
  if (danger !== null && animalsInAt(ctx, danger.test.t)) {
    return report('danger', `${danger.words} That is beyond what reef animals survive for long. ${advice}`, [danger.test])
  }
  const bad = outOfRange(ctx, usual)
  if (bad === null) return NOTHING
  return report('caution', `${bad.words} ${advice}`, [bad.test])
}

function salinityRange(ctx: RuleContext): RuleResult {
  const th = ctx.thresholds
  return guarded(
    ctx,
    { key: 'salinity', name: 'Salinity', unit: '', min: th.salinityMin, max: th.salinityMax },
    { key: 'salinity', name: 'Salinity', unit: '', min: th.salinityHardMin, max: th.salinityHardMax },
    'Bring it back slowly, by no more than about 1 a day, with fresh water or salt mix.',
  )
}

function temperatureRange(ctx: RuleContext): RuleResult {
  const th = ctx.thresholds
  return guarded(
    ctx,
    { key: 'temperatureC', name: 'Temperature', unit: ' C', min: th.temperatureMinC, max: th.temperatureMaxC },
    { key: 'temperatureC', name: 'Temperature', unit: ' C', min: th.temperatureHardMinC, max: th.temperatureHardMaxC },
    'Check the heater, the chiller and the room now; warm water holds less oxygen.',
  )
}

function pHRange(ctx: RuleContext): RuleResult {
  const th = ctx.thresholds
  return guarded(
    ctx,
    { key: 'pH', name: 'pH', unit: '', min: th.pHMin, max: th.pHMax },
    { key: 'pH', name: 'pH', unit: '', min: th.pHHardMin, max: th.pHHardMax },
    'Re-test to confirm; low pH usually means low alkalinity or too little gas exchange (aerate, check alkalinity), high pH an overdose of buffer or kalkwasser.',
  )
}

/** The usual-range pH problem on the latest test, for the readiness gate. */
export function pHProblem(ctx: RuleContext): string | null {
  const th = ctx.thresholds
  const test = ctx.latest.pH
  if (test === undefined) return 'pH has not been tested: test it before adding livestock.'
  return outOfRange(ctx, { key: 'pH', name: 'pH', unit: '', min: th.pHMin, max: th.pHMax })?.words ?? null
}

function reefRanges(ctx: RuleContext): Range[] {
  const th = ctx.thresholds
  return [
    { key: 'alkalinityDkh', name: 'Alkalinity', unit: ' dKH', min: th.alkalinityMinDkh, max: th.alkalinityMaxDkh },
    { key: 'calciumMgL', name: 'Calcium', unit: ' mg/L', min: th.calciumMinMgL, max: th.calciumMaxMgL },
    { key: 'magnesiumMgL', name: 'Magnesium', unit: ' mg/L', min: th.magnesiumMinMgL, max: th.magnesiumMaxMgL },
  ]
}

/** Alkalinity, calcium and magnesium problems on their latest tests; untested values raise none. */
export function reefChemistryProblems(ctx: RuleContext): Array<{ test: TimedReading, words: string }> {
  return reefRanges(ctx).map(range => outOfRange(ctx, range)).filter(p => p !== null)
}

/** Alkalinity, calcium and magnesium never tested: stony corals cannot be judged ready. */
export function reefChemistryUntested(ctx: RuleContext): string[] {
  return reefRanges(ctx).filter(range => ctx.latest[range.key] === undefined)
    .map(range => `${range.name} has never been tested; stony corals need it at ${formatNumber(range.min)}-${formatNumber(range.max)}${range.unit}.`)
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
  const values = readingsFrom(ctx.history, from).filter(r => r.salinity !== undefined).map(r => r.salinity ?? 0)
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
    description: 'Latest salinity outside the company range (default 30-37): a caution, and a danger with animals in past the hard limits.',
    source: COMMON_PRACTICE,
    severities: ['danger', 'caution'],
    evaluate: salinityRange,
  },
  {
    id: 'temperature.range',
    description: 'Latest temperature outside the company range (default 22-29 C): a caution, and a danger with animals in past the hard limits.',
    source: COMMON_PRACTICE,
    severities: ['danger', 'caution'],
    evaluate: temperatureRange,
  },
  {
    id: 'ph.range',
    description: 'Latest pH outside the usual reef range (default 7.8-8.5): a caution, and a danger with animals in past the hard limits (7.8-8.6).',
    source: 'reference ranges of reef keeping (common practice, no published source)',
    severities: ['danger', 'caution'],
    evaluate: pHRange,
  },
  {
    id: 'reef-chemistry.range',
    description: 'Latest alkalinity, calcium or magnesium outside the range stony corals need; only tested values are judged.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: reefChemistry,
  },
]
