/**
 * Rules about proof while the readings look finished: a rise must have been seen,
 * nitrate must be present and rising, a fishless tank must clear proven doses on
 * consecutive days, and a tank with animals in must show a nitrite stage or a
 * nitrate rise under their load.
 */

import { animalsInAt, type RuleContext } from '../context'
import { DAY_MS, formatWhen, HOUR_MS, toIso } from '../time'
import { mgN, mgNWithIon } from '../words'
import type { DoseOutcome } from '../course'
import type { TimedReading } from '../history'
import { lastWhere, readingsFrom } from '../reads'
import { NITRIFICATION_STOICHIOMETRY } from '../thresholds'
import { COMMON_PRACTICE, NOTHING, report, type CycleRule, type RuleResult } from './rule'

/** A fishless tank with no animals proves itself with doses; one with animals in, under their load. */
export function needsDoseProof(ctx: RuleContext): boolean {
  return ctx.tank.cycleMethod === 'fishless' && !animalsInAt(ctx, ctx.nowMs)
}

function doseWords(ctx: RuleContext): string {
  return `about ${mgNWithIon(ctx.thresholds.clearanceDoseN, 'NH3')}`
}

function unproven(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'settling' || ctx.course.held !== null) return NOTHING
  const th = ctx.thresholds
  if (needsDoseProof(ctx)) {
    if (ctx.course.firstRise !== null) return NOTHING
    return report(
      'info',
      `Ammonia and nitrite read zero, but no test has shown ammonia or nitrite above ${mgN(th.riseN)}, so nothing shows the bacteria at work yet. Dose ammonia to ${doseWords(ctx)} and test the same day to see it rise, then test every day.`,
      [ctx.latest.ammoniaN, ctx.latest.nitriteN],
    )
  }
  if (ctx.course.nitriteStage !== null) return NOTHING
  return report(
    'info',
    `Ammonia and nitrite read zero, but no nitrite stage has shown yet. With animals in, the cycle is proven by a nitrite stage, or by nitrate rising by ${mgN(th.nitrateRiseN)} over ${th.seededNitrateRiseDays} days under their load (a seeded tank), with ${th.fishInStableDays} days of zero ammonia and nitrite. Keep testing ammonia, nitrite and nitrate every day.`,
    [ctx.latest.ammoniaN, ctx.latest.nitriteN, ctx.latest.nitrateN],
  )
}

/** How much nitrate has risen from its low point (fishless) or since the animals went in. */
export function nitrateRise(ctx: RuleContext): { from: TimedReading, to: TimedReading, rise: number } | null {
  const to = ctx.course.latestNitrate
  const from = needsDoseProof(ctx) ? ctx.course.nitrateLow : ctx.course.firstNitrateWithAnimals
  if (to === null || from === null) return null
  return { from, to, rise: (to.nitrateN ?? 0) - (from.nitrateN ?? 0) }
}

function nitrateMissing(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'settling' || ctx.course.held !== null || ctx.course.run === null) return NOTHING
  const test = ctx.course.latestNitrate
  const th = ctx.thresholds
  const retest = [{ kind: 'test-nitrate', message: 'Test nitrate with the next ammonia and nitrite test.', dueBy: toIso(ctx.nowMs + th.retestHours * HOUR_MS) }]
  if (test === null || (test.nitrateN ?? 0) <= th.nitratePresentN) {
    const said = test === null
      ? 'Nitrate has not been tested yet.'
      : `Nitrate is ${mgN(test.nitrateN ?? 0)} (test of ${formatWhen(test.t)}), not above ${mgN(th.nitratePresentN)}.`
    return report('info', `${said} A finished cycle leaves nitrate behind, so the cycle cannot be called complete without it.`, [test], retest)
  }
  const rise = nitrateRise(ctx)
  if (!needsDoseProof(ctx) || rise === null || rise.rise >= th.nitrateRiseN) return NOTHING
  return report(
    'info',
    `Nitrate is ${mgN(rise.to.nitrateN ?? 0)}, only ${mgN(Math.max(0, rise.rise))} above its lowest (${formatWhen(rise.from.t)}). Bacteria that process ammonia leave nitrate rising, by at least ${mgN(th.nitrateRiseN)} over the cycle: nitrate merely present may be from the salt or tap water.`,
    [rise.from, rise.to],
    retest,
  )
}

/** The dose whose outcome is still open at `now`, if any. */
function openDose(ctx: RuleContext): DoseOutcome | undefined {
  return ctx.course.openDoses[ctx.course.openDoses.length - 1]
}

function proofProgress(ctx: RuleContext): RuleResult {
  if (ctx.phase !== 'settling' || ctx.course.held !== null || !needsDoseProof(ctx) || ctx.course.firstRise === null || ctx.course.run === null) return NOTHING
  const th = ctx.thresholds
  const proven = ctx.course.run.provenChain.length
  const soFar = proven === 0 ? 'No day is proven yet.' : `${proven} of ${th.clearanceDays} days proven so far (latest dose ${formatWhen(ctx.course.run.provenChain[proven - 1]!.t)}).`
  const how = `To prove the cycle, dose ammonia to ${doseWords(ctx)} once a day for ${th.clearanceDays} days running and log each amount. Test ammonia a few hours after each dose to show it arrived, and again before the next dose: ammonia and nitrite must both read zero within ${th.clearanceWindowHours} h.`
  const open = openDose(ctx)
  if (open !== undefined) {
    const step = open.arrivedBy === null
      ? `Test ammonia now to show the dose of ${formatWhen(open.t)} arrived, then again before ${formatWhen(open.t + th.clearanceWindowHours * HOUR_MS)}.`
      : `The dose of ${formatWhen(open.t)} arrived; ammonia and nitrite must read zero by ${formatWhen(open.t + th.clearanceWindowHours * HOUR_MS)}.`
    const dueBy = open.arrivedBy === null ? ctx.nowMs : open.t + th.retestHours * HOUR_MS
    return report('info', `Proof under way. ${step} ${soFar}`, [open.arrivedBy], [{ kind: 'retest', message: step, dueBy: toIso(dueBy) }])
  }
  return report(
    'info',
    `Ammonia and nitrite read zero. ${how} ${soFar}`,
    [ctx.course.run.last],
    [{ kind: 'clearance-test', message: `Dose ammonia to ${doseWords(ctx)} now and log the amount; test ammonia a few hours later, and ammonia and nitrite before the next dose.`, dueBy: toIso(ctx.nowMs) }],
  )
}

/** True when the last ammonia and nitrite test before `t` read zero for both. */
function readZeroBefore(ctx: RuleContext, t: number): boolean {
  const th = ctx.thresholds
  const last = lastWhere(ctx.history, t, false, r => r.ammoniaN !== undefined && r.nitriteN !== undefined)
  return last !== null && (last.ammoniaN ?? 0) <= th.ammoniaZeroN && (last.nitriteN ?? 0) <= th.nitriteZeroN
}

/** The latest dose, if it was a proof attempt that is decided and did not prove anything, with why. */
function failedDose(ctx: RuleContext): { dose: DoseOutcome, why: string } | null {
  const th = ctx.thresholds
  const windowMs = th.clearanceWindowHours * HOUR_MS
  const dose = ctx.course.doses[ctx.course.doses.length - 1]
  if (dose === undefined) return null
  const amount = dose.event.amount
  // Whatever the dose was for, without its amount it can never prove anything.
  if (amount === undefined) return { dose, why: 'it was logged without its amount, so nothing shows how much the tank had to clear. Log the amount with every dose.' }
  // A dose given while ammonia or nitrite still showed is feeding the bacteria, not proof.
  if (!readZeroBefore(ctx, dose.t)) return null
  if (amount < th.clearanceMinDoseN) return { dose, why: `it was ${mgN(amount)}, smaller than the ${mgNWithIon(th.clearanceMinDoseN, 'NH3')} that counts as proof.` }
  if (dose.clearedBy !== null || ctx.nowMs <= dose.t + windowMs) return null
  if (dose.diluted) return { dose, why: `a water change came within ${th.clearanceWindowHours} h of it, so any fall may be dilution. Repeat without a water change.` }
  if (dose.arrivedBy === null) return { dose, why: 'no test after the dose showed the ammonia arrived. Test ammonia a few hours after dosing, then again the next day.' }
  const last = dose.lastInWindow
  if (last === null) return { dose, why: `no ammonia and nitrite test was taken within ${th.clearanceWindowHours} h of it. Repeat and test on time.` }
  return { dose, why: `the last test in that time (${formatWhen(last.t)}) read ammonia ${mgN(last.ammoniaN ?? 0)}, nitrite ${mgN(last.nitriteN ?? 0)}. The bacteria need more time: keep dosing and testing.` }
}

function proofFailed(ctx: RuleContext): RuleResult {
  if (ctx.phase === 'complete' || !needsDoseProof(ctx)) return NOTHING
  const failed = failedDose(ctx)
  if (failed === null) return NOTHING
  return report('caution', `The ammonia dose of ${formatWhen(failed.dose.t)} does not count toward proof: ${failed.why}`, [failed.dose.arrivedBy, failed.dose.lastInWindow])
}

function nitrateKitStuck(ctx: RuleContext): RuleResult {
  if (!needsDoseProof(ctx)) return NOTHING
  const th = ctx.thresholds
  const cleared = ctx.course.doses.filter(d => d.clearedBy !== null && !d.diluted && (d.event.amount ?? 0) >= th.clearanceMinDoseN)
  if (cleared.length < th.clearanceDays) return NOTHING
  const since = cleared[0]!.t - DAY_MS
  const nitrate = readingsFrom(ctx.history, since).filter(r => r.nitrateN !== undefined)
  if (nitrate.length < th.clearanceDays) return NOTHING
  const first = nitrate[0]!
  const last = nitrate[nitrate.length - 1]!
  if ((last.nitrateN ?? 0) - (first.nitrateN ?? 0) >= th.nitrateRiseN * 0.5) return NOTHING
  if (nitrate.some(r => r.nitrateN !== first.nitrateN)) return NOTHING
  const total = cleared.reduce((sum, d) => sum + (d.event.amount ?? 0), 0)
  return report(
    'caution',
    `${cleared.length} ammonia doses (${mgN(total)} in all) have cleared, yet every nitrate test since ${formatWhen(first.t)} reads ${mgN(first.nitrateN ?? 0)}. Cleared ammonia becomes nitrate, so the nitrate kit is the likely fault: check its expiry date and method, or test with another kit.`,
    [first, last],
    [{ kind: 'test-nitrate', message: 'Test nitrate with a fresh or different kit.', dueBy: toIso(ctx.nowMs + th.retestHours * HOUR_MS) }],
  )
}

/** Proof rules. */
export const PROOF_RULES: readonly CycleRule[] = [
  {
    id: 'cycle.unproven',
    description: 'Zero tests prove nothing until a rise has been seen (fishless), or a nitrite stage or a nitrate rise under the animals\' load (with animals in).',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: unproven,
  },
  {
    id: 'cycle.nitrate-missing',
    description: 'A finished cycle leaves nitrate behind and, fishless, nitrate rising over the cycle; nitrate merely present proves nothing.',
    source: `${NITRIFICATION_STOICHIOMETRY}; the step is ${COMMON_PRACTICE}`,
    severities: ['info'],
    evaluate: nitrateMissing,
  },
  {
    id: 'cycle.clearance-test',
    description: 'A fishless tank that reads zero proves itself by clearing doses of about 2 ppm as NH3 on consecutive days: each seen to arrive, then zero ammonia and nitrite within about a day.',
    source: COMMON_PRACTICE,
    severities: ['info'],
    evaluate: proofProgress,
  },
  {
    id: 'cycle.clearance-failed',
    description: 'A dose logged without an amount, too small, never seen to arrive, diluted by a water change, or not cleared in time does not count toward proof.',
    source: COMMON_PRACTICE,
    severities: ['caution'],
    evaluate: proofFailed,
  },
  {
    id: 'testing.nitrate-kit',
    description: 'Doses clear but nitrate never moves: the nitrate kit is the likely fault.',
    source: NITRIFICATION_STOICHIOMETRY,
    severities: ['caution'],
    evaluate: nitrateKitStuck,
  },
]
