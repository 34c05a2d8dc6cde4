/**
 * Rules about proof while the readings look finished: a rise must have been seen,
 * nitrate must be present, and a fishless tank must clear a fresh ammonia dose.
 */

import { animalsInAt, type RuleContext } from '../context'
import { formatWhen, HOUR_MS, toIso } from '../time'
import { mgN, mgNWithIon } from '../words'
import type { DoseOutcome } from '../course'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'

function needsClearance(ctx: RuleContext): boolean {
  return ctx.tank.cycleMethod === 'fishless' && !animalsInAt(ctx, ctx.nowMs)
}

function doseWords(ctx: RuleContext): string {
  return `about ${mgNWithIon(ctx.thresholds.clearanceDoseN, 'NH3')}`
}

function unproven(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'settling' || ctx.course.firstRise !== null) return NOTHING
  const advice = ctx.tank.cycleMethod === 'fish-in'
    ? 'Keep testing every day: the fish make ammonia, so a rise is expected before the cycle can finish.'
    : `Dose ammonia to ${doseWords(ctx)} and test the same day to see it rise, then test every day.`
  return report(
    'info',
    `Ammonia and nitrite read zero, but no test has shown ammonia or nitrite above ${mgN(ctx.thresholds.riseN)}, so nothing shows the bacteria at work yet. ${advice}`,
    [ctx.latest.ammoniaN, ctx.latest.nitriteN],
  )
}

function nitrateMissing(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'settling' || ctx.course.run === null) return NOTHING
  const test = ctx.course.latestNitrate
  const limit = ctx.thresholds.nitratePresentN
  if (test !== null && (test.nitrateN ?? 0) > limit) return NOTHING
  const said = test === null
    ? 'Nitrate has not been tested yet.'
    : `Nitrate is ${mgN(test.nitrateN ?? 0)} (test of ${formatWhen(test.t)}), not above ${mgN(limit)}.`
  return report(
    'info',
    `${said} A finished cycle leaves nitrate behind, so the cycle cannot be called complete without it.`,
    [test],
    [{ kind: 'test-nitrate', message: 'Test nitrate with the next ammonia and nitrite test.', dueBy: toIso(ctx.nowMs + ctx.thresholds.retestHours * HOUR_MS) }],
  )
}

function clearedInRun(ctx: RuleContext): boolean {
  return (ctx.course.run?.clearedDoses.length ?? 0) > 0
}

function clearanceTest(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'settling' || !needsClearance(ctx) || ctx.course.firstRise === null) return NOTHING
  if (ctx.course.run === null || clearedInRun(ctx)) return NOTHING
  const retestBy = (from: number): string => toIso(from + ctx.thresholds.retestHours * HOUR_MS)
  const open = ctx.course.openDoses[ctx.course.openDoses.length - 1]
  if (open !== undefined) {
    return report(
      'info',
      `Clearance test under way: ammonia was dosed on ${formatWhen(open.t)}. Test ammonia and nitrite about ${ctx.thresholds.retestHours} h after the dose; both must read zero within ${ctx.thresholds.clearanceWindowHours} h.`,
      [],
      [{ kind: 'retest', message: 'Test ammonia and nitrite for the clearance test.', dueBy: retestBy(open.t) }],
    )
  }
  return report(
    'info',
    `Ammonia and nitrite read zero. To prove the cycle, dose ammonia to ${doseWords(ctx)}, log the dose, and test ammonia and nitrite ${ctx.thresholds.retestHours} h later: both must read zero. A test in between may still show the dose; only the result within ${ctx.thresholds.clearanceWindowHours} h counts.`,
    [ctx.course.run.last],
    [{ kind: 'clearance-test', message: `Dose ammonia to ${doseWords(ctx)} now; test ammonia and nitrite ${ctx.thresholds.retestHours} h later.`, dueBy: retestBy(ctx.nowMs) }],
  )
}

function readZeroBefore(ctx: RuleContext, t: number): boolean {
  const th = ctx.thresholds
  let zero = false
  for (const r of ctx.history.readings) {
    if (r.t >= t) break
    if (r.ammoniaN === undefined || r.nitriteN === undefined) continue
    zero = r.ammoniaN <= th.ammoniaZeroN && r.nitriteN <= th.nitriteZeroN
  }
  return zero
}

function lastAttempt(ctx: RuleContext): DoseOutcome | undefined {
  const dose = ctx.course.doses[ctx.course.doses.length - 1]
  // A dose given while ammonia or nitrite still showed is feeding the bacteria, not a clearance test.
  return dose !== undefined && readZeroBefore(ctx, dose.t) ? dose : undefined
}

function clearanceFailed(ctx: RuleContext): RuleResult {
  if (ctx.phase === 'complete' || !needsClearance(ctx)) return NOTHING
  const dose = lastAttempt(ctx)
  const windowMs = ctx.thresholds.clearanceWindowHours * HOUR_MS
  if (dose === undefined || dose.clearedBy !== null || ctx.nowMs <= dose.t + windowMs) return NOTHING
  const hours = ctx.thresholds.clearanceWindowHours
  const last = dose.lastInWindow
  let why: string
  if (dose.diluted) why = `a water change came within ${hours} h of it, so any fall may be dilution. Repeat the test without a water change.`
  else if (last === null) why = `no ammonia and nitrite test was taken within ${hours} h of it. Repeat the test and test on time.`
  else why = `the last test in that time (${formatWhen(last.t)}) read ammonia ${mgN(last.ammoniaN ?? 0)}, nitrite ${mgN(last.nitriteN ?? 0)}. The bacteria need more time: keep testing and repeat the test when both read zero.`
  return report('caution', `The ammonia dose of ${formatWhen(dose.t)} was not cleared: ${why}`, [last])
}

/** Proof rules. */
export const PROOF_RULES: readonly CycleRule[] = [
  {
    id: 'cycle.unproven',
    description: 'Zero tests prove nothing until a test has shown ammonia or nitrite rising: an unfed tank also reads zero.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: unproven,
  },
  {
    id: 'cycle.nitrate-missing',
    description: 'A finished cycle leaves nitrate behind; without nitrate present the cycle is not complete.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: nitrateMissing,
  },
  {
    id: 'cycle.clearance-test',
    description: 'A fishless tank that reads zero proves itself by clearing a fresh ammonia dose (about 2 ppm as NH3) to zero ammonia and nitrite within about a day.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: clearanceTest,
  },
  {
    id: 'cycle.clearance-failed',
    description: 'A clearance dose not cleared within the window (or diluted by a water change, or not tested in time) does not count.',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: clearanceFailed,
  },
]
