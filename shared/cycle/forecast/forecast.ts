/**
 * The completion forecast: from a tank's tests and events so far, the range of
 * dates in which the rule engine is likely to prove the cycle complete, and from it
 * the earliest range for each livestock group. Pure and deterministic like the
 * engine (`now` is input). It says "not enough data yet" instead of guessing:
 * before the nitrite stage, with too few or too old tests, and for a curve that is
 * flat or erratic. See README.md beside this file for the model and its limits.
 */

import { evaluatePrepared } from '../engine'
import { eventsAsOf, nitrogenTestsAsOf, prepareInput, type PreparedInput, type TimedEvent } from '../history'
import { RULE_SET_VERSION } from '../registry'
import { resolveThresholds } from '../thresholds'
import { DAY_MS, HOUR_MS, requireTime, toIso } from '../time'
import { LIVESTOCK_GROUPS, type CycleInput, type LivestockGroup, type Verdict } from '../types'
import { fitDecline, type DeclineResult, type SeriesPoint } from './decline'
import { latestOfSeries, seriesOf, seriesSincePeak, type TimedTest } from './series'
import { DOSE_CHECK_HOURS, HORIZON_DAYS, INTERVAL_PROBABILITY, MAX_RANGE_DAYS, MAX_RELAPSE_DAYS, MIN_TESTS, RANGE_SLACK_DAYS } from './parameters'
import { firstProvingRoutine, futureTestTimes, projectCompletion, type ProjectionBase } from './project'
import type { CycleForecast, DeclineFit, ForecastBasis, ForecastGap, ForecastRange } from './types'
import { FORECAST_VERSION } from './version'
import { curveTests, curveTestsFrom, dosesOf, readsZero, type ProofDose } from './curve-tests'
import { CURRENT_RULE_OPTIONS } from '../options'
import { assertWindowFits, BeyondWindow, windowStart } from '../window'

const NO_GROUPS = (): Record<LivestockGroup, ForecastRange | null> =>
  Object.fromEntries(LIVESTOCK_GROUPS.map(g => [g, null])) as Record<LivestockGroup, ForecastRange | null>

function shell(status: CycleForecast['status'], gap: ForecastGap | null, basis: ForecastBasis): CycleForecast {
  return {
    forecastVersion: FORECAST_VERSION,
    ruleSetVersion: RULE_SET_VERSION,
    status,
    gap,
    probability: INTERVAL_PROBABILITY,
    completion: null,
    likely: null,
    groups: NO_GROUPS(),
    basis,
  }
}

/** The latest dose after the latest curve test, when no test at all has followed it yet. */
function uncheckedDose(doses: readonly ProofDose[], allTests: readonly TimedTest[], lastCurveTestMs: number): number | null {
  const last = doses[doses.length - 1]
  if (!last || last.t <= lastCurveTestMs) return null
  return allTests.some(t => t.t > last.t) ? null : last.t
}

/** Time of the last water change at or before now: dilution breaks a curve, so fits start after it. */
function lastWaterChange(events: readonly TimedEvent[]): number {
  return events.findLast(e => e.event.kind === 'water-change')?.t ?? Number.NEGATIVE_INFINITY
}

function completeForecast(verdict: Verdict, basis: ForecastBasis): CycleForecast {
  const done = verdict.completedOn!
  const forecast = shell('complete', null, basis)
  forecast.completion = { from: done, to: done }
  forecast.likely = done
  for (const g of LIVESTOCK_GROUPS) {
    const earliest = verdict.readiness[g].earliest
    forecast.groups[g] = earliest === null ? null : { from: earliest, to: earliest }
  }
  return forecast
}

/** The zero-reading window of both curves: each either reads zero now or has a fitted decline. */
function zeroWindow(results: readonly DeclineResult[], nextTestMs: number): { gap: ForecastGap } | { fromMs: number, midMs: number, toMs: number } {
  let fromMs = nextTestMs
  let midMs = nextTestMs
  let toMs = nextTestMs
  for (const r of results) {
    if (!r.ok) return { gap: r.gap }
    fromMs = Math.max(fromMs, r.zeroFromMs)
    midMs = Math.max(midMs, r.zeroMidMs)
    toMs = Math.max(toMs, r.zeroToMs)
  }
  return { fromMs, midMs, toMs }
}

/**
 * Time the late end leaves for nitrite to come back once: the first full proof doses
 * often overwhelm nitrite bacteria that grew on smaller feeding doses, and nitrite then
 * falls again at about the pace it fell the first time (common practice, no published
 * source). Only for a fishless proof that has not yet seen a full dose cleared.
 */
function relapseAllowanceMs(base: ProjectionBase, tests: readonly TimedTest[], doses: readonly ProofDose[], fromMs: number, zeroMidMs: number): number {
  if (!base.doseAfterZeroTests) return 0
  const th = base.thresholds
  const cleared = doses.some((d) => {
    if (d.amount < th.clearanceMinDoseN) return false
    const before = [...tests].reverse().find(x => x.t < d.t)
    const after = tests.find(x => x.t > d.t + DOSE_CHECK_HOURS * HOUR_MS)
    return before !== undefined && after !== undefined && readsZero(before, th) && readsZero(after, th)
  })
  if (cleared) return 0
  const nitrite = seriesOf(tests, 'nitriteN', fromMs)
  let peak: SeriesPoint | undefined
  for (const p of nitrite) if (!peak || p.value >= peak.value) peak = p
  if (!peak || peak.value <= th.nitriteZeroN) return 0
  const firstZero = nitrite.find(p => p.t > peak.t && p.value <= th.nitriteZeroN)?.t ?? zeroMidMs
  return Math.min(Math.max(0, firstZero - peak.t), MAX_RELAPSE_DAYS * DAY_MS)
}

/**
 * Forecasts when the cycle will be proven complete. Throws a RangeError for the same
 * bad input the engine refuses (`now`, `tank.startedAt`, thresholds). `verdict`, when
 * given, must be the engine's verdict on this same input (the server stores both from
 * one evaluation, so the engine does not run twice).
 */
export function forecastCycle(input: CycleInput, verdict?: Verdict): CycleForecast {
  return forecastPrepared(prepareInput(input), verdict)
}

/**
 * `forecastCycle` for an input whose history was prepared already (see `evaluatePrepared`):
 * the forecast `forecastCycle` gives for the readings and events it was prepared from.
 */
export function forecastPrepared(input: PreparedInput, verdict?: Verdict): CycleForecast {
  const nowMs = requireTime('now', input.now)
  const thresholds = resolveThresholds(input.thresholds)
  verdict ??= evaluatePrepared(input)
  // The events at or before now (their time parses), oldest first.
  const events = eventsAsOf(input.history, nowMs)
  const doses = dosesOf(events)
  // The tests in the forecast's order (time, then id), with their values as given; a windowed
  // history folded its curve tests as they streamed past (the latest, and how many).
  const held = windowStart(input.history) > Number.NEGATIVE_INFINITY ? input.history.window : undefined
  if (held) assertWindowFits(held, { thresholds, method: input.tank.cycleMethod, startedMs: requireTime('tank.startedAt', input.tank.startedAt), options: CURRENT_RULE_OPTIONS }, nowMs)
  // A window holds the tests from its start on: its curve tests are the whole history's from
  // there, replayed from the curve fold as it stood then. What the curves need of older tests
  // throws BeyondWindow below.
  const allTests = held ? input.history.nitrogenTests : nitrogenTestsAsOf(input.history, nowMs)
  const tests = held ? curveTestsFrom(held.curve.atStart, allTests, doses, thresholds) : curveTests(allTests, doses, thresholds)
  const lastTest = held ? held.curve.last ?? undefined : tests[tests.length - 1]
  const curveCount = held ? held.curve.count : tests.length
  const testEveryHours = thresholds.retestHours
  const basis: ForecastBasis = { fits: [], readingZero: false, testEveryHours, latestTest: lastTest ? toIso(lastTest.t) : null, relapseDays: 0 }
  if (verdict.completedOn !== null) return completeForecast(verdict, basis)
  if (verdict.phase === 'not-started') return shell('not-enough-data', 'not-started', basis)
  if (!lastTest || curveCount < MIN_TESTS) return shell('not-enough-data', 'sparse', basis)
  if (verdict.phase === 'ammonia') return shell('not-enough-data', 'before-nitrite', basis)
  // The engine expects a test at least every testIntervalHours; twice that missed leaves the curve unknown.
  if (nowMs - lastTest.t > 2 * thresholds.testIntervalHours * HOUR_MS) return shell('not-enough-data', 'stale', basis)
  const fromMs = lastWaterChange(events)
  // The curves are fitted from the last water change on, and read from the latest test back: a
  // window must hold both (nothing before the change counts).
  if (held && (fromMs < held.startMs || lastTest.t < held.startMs)) throw new BeyondWindow('the forecast\'s curves since the last water change')

  const limits = { ammoniaN: thresholds.ammoniaZeroN, nitriteN: thresholds.nitriteZeroN } as const
  const above = (key: 'ammoniaN' | 'nitriteN') => (latestOfSeries(tests, key, fromMs) ?? 0) > limits[key]
  const ammoniaAbove = above('ammoniaN')
  const nitriteAbove = above('nitriteN')
  const results: DeclineResult[] = []
  if (ammoniaAbove) results.push(fitDecline('ammonia', seriesSincePeak(tests, 'ammoniaN', fromMs), limits.ammoniaN))
  if (nitriteAbove) results.push(fitDecline('nitrite', seriesSincePeak(tests, 'nitriteN', fromMs), limits.nitriteN))
  basis.fits = results.flatMap(r => (r.ok ? [r.fit] : [] as DeclineFit[]))
  basis.readingZero = !ammoniaAbove && !nitriteAbove

  const nitrateTest = tests.findLast(x => x.nitrateN !== undefined)
  if (held && nitrateTest === undefined) throw new BeyondWindow('the latest nitrate of the curves')
  const lastNitrate = nitrateTest?.nitrateN ?? 0
  const livestockIn = events.some(e => e.event.kind === 'livestock-added')
  const doseAfterZeroTests = input.tank.cycleMethod === 'fishless' && !livestockIn
  const base: ProjectionBase = {
    input,
    thresholds,
    lastTestMs: lastTest.t,
    nowMs,
    ammoniaAbove,
    nitriteAbove,
    nitrateN: Math.max(lastNitrate, 2 * thresholds.nitratePresentN),
    doseAfterZeroTests,
    // The latest test read zero and no dose followed it yet: the routine starts with that dose.
    doseNow: doseAfterZeroTests && basis.readingZero && !doses.some(d => d.t > lastTest.t),
    uncheckedDoseMs: uncheckedDose(doses, allTests, lastTest.t),
    testEveryHours,
  }
  // A fishless proof's relapse allowance weighs every dose the tank was ever given.
  if (held && base.doseAfterZeroTests) throw new BeyondWindow('the doses of a fishless proof')
  const nextTestMs = futureTestTimes(base)[0] ?? nowMs
  const window = zeroWindow(results, nextTestMs)
  if ('gap' in window) return shell('not-enough-data', window.gap, basis)
  if (window.toMs - lastTest.t > HORIZON_DAYS * DAY_MS) return shell('not-enough-data', 'too-far', basis)

  const first = firstProvingRoutine(base, nextTestMs)
  if (!first) return shell('not-enough-data', 'too-far', basis)
  const soonest = first.projection
  const early = projectCompletion(base, window.fromMs, first.routine)
  const likely = projectCompletion(base, window.midMs, first.routine)
  const late = projectCompletion(base, window.toMs, first.routine)
  if (!early || !likely || !late) return shell('not-enough-data', 'too-far', basis)

  const slack = RANGE_SLACK_DAYS * DAY_MS
  // Nothing can beat the engine's proof with zeros from the very next test.
  const fromMsDone = Math.max(soonest.completedMs, early.completedMs - slack)
  const relapseMs = relapseAllowanceMs(base, tests, doses, fromMs, window.midMs)
  const toMsDone = late.completedMs + slack + relapseMs
  if (toMsDone - fromMsDone > MAX_RANGE_DAYS * DAY_MS) return shell('not-enough-data', 'too-far', basis)

  basis.relapseDays = Math.round(relapseMs / DAY_MS)
  const forecast = shell('forecast', null, basis)
  forecast.completion = { from: toIso(fromMsDone), to: toIso(toMsDone) }
  forecast.likely = toIso(Math.min(Math.max(likely.completedMs, fromMsDone), toMsDone))
  for (const g of LIVESTOCK_GROUPS) {
    const lo = early.groups[g]
    const hi = late.groups[g]
    if (lo === null || hi === null) continue
    // A group waits a fixed time after completion, so its range is the completion range moved by that wait.
    forecast.groups[g] = { from: toIso(fromMsDone + lo - early.completedMs), to: toIso(toMsDone + hi - late.completedMs) }
  }
  return forecast
}
