/**
 * Rules that say where the cycle stands and why: not started, still in the
 * ammonia or nitrite stage, settling, complete, or complete once and lost since.
 */

import { everyReading, latestNitrogen } from '../reads'
import { formatDuration, formatWhen, HOUR_MS, toIso } from '../time'
import { mgN, mgNWithIon } from '../words'
import type { RuleContext } from '../context'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'
import { needsDoseProof } from './cycle-proof'

function notStarted(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'not-started') return NOTHING
  const tests = everyReading(ctx.history).filter(r => r.ammoniaN !== undefined || r.nitriteN !== undefined)
  const zeros = tests.length > 0
    ? ` All ${tests.length} ammonia and nitrite tests read zero because nothing is feeding the bacteria yet; zero readings before the cycle starts prove nothing.`
    : ''
  return report(
    'info',
    `No ammonia source or bacteria has been recorded, so the cycle has not started.${zeros}`,
    tests,
    [{
      kind: 'start-cycle',
      message: `Dose ammonia to about ${mgNWithIon(ctx.thresholds.clearanceDoseN, 'NH3')}, add bottled nitrifying bacteria, and log both; then test ammonia and nitrite every day.`,
      dueBy: toIso(ctx.nowMs),
    }],
  )
}

function ammoniaStage(ctx: RuleContext): RuleResult {
  const test = ctx.latest.ammoniaN
  const last = latestNitrogen(ctx.history)
  if (test === undefined || last === null || ctx.sourceT === null || last.t < ctx.sourceT) {
    const since = ctx.sourceT === null ? '' : ` since ${formatWhen(ctx.sourceT)}`
    return report('info', `The ammonia source is in${since}, but ammonia has not been tested since. Test ammonia and nitrite now.`, [])
  }
  // Ammonia back after it had fallen is a new load outrunning bacteria that exist, not bacteria still to grow.
  const why = ctx.course.ammoniaFallen !== null && ctx.course.ammoniaFallen.t < test.t
    ? 'is back up after it had fallen: the bacteria have not caught up with the load'
    : 'has not started to fall: the first bacteria are still growing'
  return report(
    'info',
    `Ammonia is ${mgN(test.ammoniaN ?? 0)} (test of ${formatWhen(test.t)}) and ${why}. Keep testing ammonia and nitrite every day.`,
    [test],
  )
}

function nitriteStage(ctx: RuleContext): RuleResult {
  const test = ctx.latest.nitriteN
  const value = test?.nitriteN ?? 0
  return report(
    'info',
    `Ammonia is being turned into nitrite: nitrite is ${mgN(value)} (test of ${formatWhen(test?.t ?? ctx.nowMs)}). The cycle moves on when nitrite falls to zero.`,
    [test, ctx.latest.ammoniaN],
  )
}

function settlingStage(ctx: RuleContext): RuleResult {
  const run = ctx.course.run
  const th = ctx.thresholds
  const held = ctx.course.held
  if (held !== null) {
    return report(
      'info',
      `The cycle was proven complete on ${formatWhen(held.completion.reading.t)}; the test of ${formatWhen(held.by.t)} reads ammonia ${mgN(held.by.ammoniaN ?? 0)}, nitrite ${mgN(held.by.nitriteN ?? 0)}. If ammonia and nitrite read zero again by ${formatWhen(held.until)}, the completion stands; if not, the tank has to prove itself again.`,
      [held.completion.reading, held.by],
      [{ kind: 'retest', message: `Test ammonia and nitrite again before ${formatWhen(held.until)}.`, dueBy: toIso(Math.min(held.until, held.by.t + th.retestHours * HOUR_MS)) }],
    )
  }
  if (run === null) {
    return report('info', 'Ammonia and nitrite are low, but no test yet reads zero for both. Keep testing every day.', [ctx.latest.ammoniaN, ctx.latest.nitriteN])
  }
  // Only the zero tests after the first dose (or since the animals went in) count as evidence.
  const animals = !needsDoseProof(ctx)
  const counted = (animals ? run.withAnimals : run.afterDose) ?? { first: run.last, zeroTests: 0 }
  const since = animals ? 'since the animals went in' : 'after the first ammonia dose'
  const hours = animals ? Math.max(th.stableSpanHours, th.fishInStableDays * 24) : th.stableSpanHours
  const span = run.last.t - counted.first.t
  const sofar = counted.zeroTests === 0
    ? `no zero test yet ${since}`
    : `${counted.zeroTests} zero test(s) ${since}, over ${formatDuration(span)} from ${formatWhen(counted.first.t)}`
  return report(
    'info',
    `Ammonia and nitrite read zero: ${sofar}; the cycle needs at least ${th.stableMinTests} over ${formatDuration(hours * HOUR_MS)}, with nitrate present and proof that the tank processes ammonia.`,
    [counted.first, run.last],
  )
}

function phaseReason(ctx: RuleContext): RuleResult {
  if (ctx.phase === 'ammonia') return ammoniaStage(ctx)
  if (ctx.phase === 'nitrite') return nitriteStage(ctx)
  if (ctx.phase === 'settling') return settlingStage(ctx)
  return NOTHING
}

function complete(ctx: RuleContext): RuleResult {
  const done = ctx.course.completion
  if (done === null) return NOTHING
  const span = formatDuration(done.reading.t - done.runStart.t)
  const nitrate = done.nitrate?.nitrateN
  const low = done.nitrateLow
  const risen = low ? ` (up from ${mgN(low.nitrateN ?? 0)} on ${formatWhen(low.t)})` : ''
  const doses = done.provenDoses
  const last = doses[doses.length - 1]
  const how = done.withAnimals
    ? done.runStart.t - (ctx.course.nitriteStage?.t ?? done.runStart.t) > 0
      ? ', after a nitrite stage, with the animals in'
      : ', with nitrate rising under the animals\' load'
    : last?.clearedBy
      ? `, and the ammonia doses of ${doses.length} consecutive days each arrived and cleared, the last within ${formatDuration(last.clearedBy.t - last.t)}`
      : ''
  return report(
    'info',
    `The cycle was proven complete on ${formatWhen(done.reading.t)}: ammonia and nitrite read zero on ${done.zeroTests} tests over ${span}, nitrate was ${mgN(nitrate ?? 0)}${risen}${how}.`,
    [done.runStart, done.reading, low, done.nitrate, ...doses.flatMap(d => [d.arrivedBy, d.clearedBy])],
  )
}

function lost(ctx: RuleContext): RuleResult {
  const last = ctx.course.lost[ctx.course.lost.length - 1]
  if (ctx.course.completion !== null || ctx.course.held !== null || last === undefined || last.lostBy === null) return NOTHING
  const by = last.lostBy
  const th = ctx.thresholds
  // With animals in the tank proves itself over the longer fish-in run.
  const hours = needsDoseProof(ctx) ? th.stableSpanHours : Math.max(th.stableSpanHours, th.fishInStableDays * 24)
  const values = [
    by.ammoniaN !== undefined ? `ammonia ${mgN(by.ammoniaN)}` : null,
    by.nitriteN !== undefined ? `nitrite ${mgN(by.nitriteN)}` : null,
  ].filter(v => v !== null).join(', ')
  return report(
    'caution',
    `The cycle was complete on ${formatWhen(last.reading.t)}, but the test of ${formatWhen(by.t)} shows ${values}. The tank has to prove itself again: zero ammonia and nitrite for ${formatDuration(hours * HOUR_MS)}.`,
    [last.reading, by],
    [{ kind: 'retest', message: 'Test ammonia and nitrite again within a day.', dueBy: toIso(ctx.nowMs + ctx.thresholds.retestHours * HOUR_MS) }],
  )
}

/** Progress rules, in the order their findings read best. */
export const PROGRESS_RULES: readonly CycleRule[] = [
  {
    id: 'cycle.not-started',
    description: 'No ammonia source, bacteria or livestock recorded and no test showing ammonia: the cycle has not started, whatever the tests read.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: notStarted,
  },
  {
    id: 'cycle.phase',
    description: 'Explains the phase from the course of the tests: ammonia not yet falling; ammonia falling or gone while nitrite is up; both low but not yet proven.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: phaseReason,
  },
  {
    id: 'cycle.complete',
    description: 'Complete: consecutive zero ammonia and nitrite tests over the set span, nitrate present, a rise seen, and for a fishless tank a fresh ammonia dose cleared within about a day.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: complete,
  },
  {
    id: 'cycle.lost',
    description: 'A completed cycle is no longer complete once a later test shows ammonia or nitrite above the zero limits.',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: lost,
  },
]
