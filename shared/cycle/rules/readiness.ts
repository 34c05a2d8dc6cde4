/**
 * What keeps each livestock group out. Fish and invertebrates wait for a complete
 * cycle in a sound tank; stony corals also wait about a month after completion,
 * for steady salinity and, when tested, reef chemistry in range.
 */

import { DAY_MS, formatWhen } from '../time'
import { formatNumber, mgNWithIon } from '../words'
import type { ReadinessContext } from '../context'
import { LIVESTOCK_GROUPS } from '../../vocabulary'
import type { CyclePhase, LivestockGroup, Thresholds } from '../types'
import { pHProblem, reefChemistryProblems, reefChemistryUntested, salinityStability } from './environment'
import { COMMON_PRACTICE, type ReadinessRule } from './rule'
import { nextFishAllowedAt } from './stocking'

const ALL: readonly LivestockGroup[] = LIVESTOCK_GROUPS
const STONY: readonly LivestockGroup[] = ['lps-coral', 'sps-coral']

const GROUP_WORDS: Record<LivestockGroup, string> = {
  'fish': 'Fish',
  'invertebrates': 'Invertebrates',
  'soft-coral': 'Soft corals',
  'lps-coral': 'LPS (large-polyp stony) corals',
  'sps-coral': 'SPS (small-polyp stony) corals',
}

const PHASE_WORDS: Record<Exclude<CyclePhase, 'complete'>, string> = {
  'not-started': 'the cycle has not started',
  'ammonia': 'the tank is still in the ammonia stage',
  'nitrite': 'the tank is still in the nitrite stage',
  'settling': 'ammonia and nitrite read low, but the cycle is not yet proven',
}

/** Days after completion before `group` may go in; never negative, stony corals never before soft ones. */
export function delayDays(ctx: ReadinessContext, group: LivestockGroup): number {
  const th = ctx.thresholds
  const soft = Math.max(0, th.softCoralDelayDays)
  if (group === 'soft-coral') return soft
  if (group === 'lps-coral') return Math.max(soft, th.lpsCoralDelayDays)
  if (group === 'sps-coral') return Math.max(soft, th.spsCoralDelayDays)
  return 0
}

/** Earliest time the timeline allows `group`, or null while the cycle is not complete. */
export function earliestFor(ctx: ReadinessContext, group: LivestockGroup): number | null {
  const done = ctx.course.completion
  return done === null ? null : done.reading.t + delayDays(ctx, group) * DAY_MS
}

function cycleComplete(ctx: ReadinessContext): readonly string[] {
  if (ctx.phase === 'complete') return []
  return [`Not yet: ${PHASE_WORDS[ctx.phase]}.`]
}

function fishAlreadyIn(ctx: ReadinessContext, group: LivestockGroup): readonly string[] {
  if (group !== 'fish' || ctx.tank.cycleMethod !== 'fish-in' || ctx.phase === 'complete' || ctx.startedMs > ctx.nowMs) return []
  return ['Fish are already in the tank from the fish-in cycle; add no more until the cycle is complete.']
}

function noDanger(ctx: ReadinessContext): readonly string[] {
  return ctx.findings.filter(f => f.severity === 'danger').map(f => `Not while this is unresolved: ${f.message}`)
}

function environment(ctx: ReadinessContext): readonly string[] {
  return ctx.findings.filter(f => f.ruleId === 'salinity.range' || f.ruleId === 'temperature.range').map(f => f.message)
}

function coralWait(ctx: ReadinessContext, group: LivestockGroup): readonly string[] {
  const done = ctx.course.completion
  const earliest = earliestFor(ctx, group)
  if (done === null || earliest === null || ctx.nowMs >= earliest) return []
  return [`${GROUP_WORDS[group]} wait ${delayDays(ctx, group)} days after the cycle completed (${formatWhen(done.reading.t)}): not before ${formatWhen(earliest)}.`]
}

function salinitySteady(ctx: ReadinessContext): readonly string[] {
  const { stable, words } = salinityStability(ctx)
  return stable ? [] : [words]
}

function reefChemistry(ctx: ReadinessContext): readonly string[] {
  return [...reefChemistryUntested(ctx), ...reefChemistryProblems(ctx).map(p => p.words)]
}

const NITRATE_LIMIT: Record<LivestockGroup, keyof Thresholds> = {
  'fish': 'nitrateMaxFishN',
  'invertebrates': 'nitrateMaxInvertebratesN',
  'soft-coral': 'nitrateMaxSoftCoralN',
  'lps-coral': 'nitrateMaxStonyCoralN',
  'sps-coral': 'nitrateMaxStonyCoralN',
}

/** Nitrate limit for a group, mg/L as N. */
export function nitrateLimit(ctx: ReadinessContext, group: LivestockGroup): number {
  return ctx.thresholds[NITRATE_LIMIT[group]]
}

function nitrate(ctx: ReadinessContext, group: LivestockGroup): readonly string[] {
  const test = ctx.latest.nitrateN
  const limit = nitrateLimit(ctx, group)
  const value = test?.nitrateN ?? 0
  if (test === undefined || value <= limit) return []
  return [`Nitrate is ${mgNWithIon(value, 'NO3')} (test of ${formatWhen(test.t)}), above ${mgNWithIon(limit, 'NO3')} for ${GROUP_WORDS[group].toLowerCase()}: change water first.`]
}

function phosphate(ctx: ReadinessContext, group: LivestockGroup): readonly string[] {
  const test = ctx.latest.phosphateMgL
  const limit = group === 'fish' || group === 'invertebrates' ? ctx.thresholds.phosphateMaxFishMgL : ctx.thresholds.phosphateMaxCoralMgL
  const value = test?.phosphateMgL ?? 0
  if (test === undefined || value <= limit) return []
  return [`Phosphate is ${formatNumber(value)} mg/L as PO4 (test of ${formatWhen(test.t)}), above ${formatNumber(limit)} for ${GROUP_WORDS[group].toLowerCase()}: lower it (water changes, a phosphate remover) first.`]
}

function pH(ctx: ReadinessContext): readonly string[] {
  const problem = pHProblem(ctx)
  return problem === null ? [] : [problem]
}

function stockingRate(ctx: ReadinessContext): readonly string[] {
  const next = nextFishAllowedAt(ctx)
  if (next === null || ctx.nowMs >= next.t) return []
  return [`${next.count} animals went in on ${formatWhen(next.after.t)}; more fish wait until ${formatWhen(next.t)} so the bacteria catch up with that load, with ammonia tested every day.`]
}

function fishFirst(ctx: ReadinessContext, _group: LivestockGroup, soFar: readonly string[]): readonly string[] {
  // Only said when nothing else stands in the way, so the guard never hides the real reason.
  if (soFar.length > 0 || ctx.decided.fish !== false) return []
  return ['Corals go in only after the tank is ready for fish.']
}

/** Readiness rules, checked in this order for every group they name. */
export const READINESS_RULES: readonly ReadinessRule[] = [
  {
    id: 'readiness.cycle-complete',
    description: 'No livestock goes in until the cycle is complete.',
    source: COMMON_PRACTICE,
    groups: ALL,
    block: cycleComplete,
  },
  {
    id: 'readiness.fish-already-in',
    description: 'A fish-in tank already holds its fish; no more go in until the cycle is complete.',
    source: COMMON_PRACTICE,
    groups: ['fish'],
    block: fishAlreadyIn,
  },
  {
    id: 'readiness.no-danger',
    description: 'No livestock goes in while a danger finding stands.',
    source: COMMON_PRACTICE,
    groups: ALL,
    block: noDanger,
  },
  {
    id: 'readiness.environment',
    description: 'No livestock goes in while salinity or temperature is out of range.',
    source: COMMON_PRACTICE,
    groups: ALL,
    block: environment,
  },
  {
    id: 'readiness.coral-wait',
    description: 'Soft corals may go in at completion (a young tank suits them); LPS corals wait about 30 days after completion, SPS about 90.',
    source: COMMON_PRACTICE,
    groups: ['soft-coral', ...STONY],
    block: coralWait,
  },
  {
    id: 'readiness.salinity-stable',
    description: 'Stony corals need salinity steady inside the target band over the set days.',
    source: COMMON_PRACTICE,
    groups: STONY,
    block: salinitySteady,
  },
  {
    id: 'readiness.reef-chemistry',
    description: 'Stony corals need alkalinity, calcium and magnesium tested and in range.',
    source: COMMON_PRACTICE,
    groups: STONY,
    block: reefChemistry,
  },
  {
    id: 'readiness.nitrate',
    description: 'Nitrate under each group\'s limit before it goes in (default 40 ppm as NO3 for fish, 20 for invertebrates and soft corals, 10 for stony corals).',
    source: 'stocking gates before livestock (common practice, no published source)',
    groups: ALL,
    block: nitrate,
  },
  {
    id: 'readiness.phosphate',
    description: 'Phosphate, when tested, under each group\'s limit (default 1 mg/L as PO4 for fish and invertebrates, 0.1 for corals).',
    source: 'stocking gates before livestock (common practice, no published source)',
    groups: ALL,
    block: phosphate,
  },
  {
    id: 'readiness.ph',
    description: 'pH tested and inside the usual reef range before any livestock.',
    source: 'stocking gates before livestock (common practice, no published source)',
    groups: ALL,
    block: pH,
  },
  {
    id: 'readiness.stocking-rate',
    description: 'Fish go in a few at a time: after an addition more fish wait about a week, after a large one about two.',
    source: COMMON_PRACTICE,
    groups: ['fish'],
    block: stockingRate,
  },
  {
    id: 'readiness.fish-first',
    description: 'Corals never go in before the tank is ready for fish.',
    source: COMMON_PRACTICE,
    groups: ['soft-coral', ...STONY],
    block: fishFirst,
  },
]
