/**
 * Turns "ammonia and nitrite read zero from time T" into the time the rule engine
 * would prove the cycle complete, and each livestock group's earliest time, by
 * running the engine itself on the tank's real history followed by a routine of
 * future tests. The forecast therefore copies none of the engine's limits: a
 * longer zero run, a clearance dose or a coral wait in any rule set moves the
 * forecast exactly as it moves the verdict.
 *
 * The routine assumed for the days ahead (said to the reader as an assumption):
 * - a test every `testEveryHours` (the engine's ordinary re-test interval), at the
 *   time of day of the latest test;
 * - before T the test still shows ammonia or nitrite above the kit's zero; from T
 *   on it reads zero for both, with nitrate present (nitrification makes nitrate);
 * - a fishless tank with no livestock gets the engine's clearance dose after each
 *   zero test and clears it by the next test; rule sets differ in how a dose is shown
 *   to arrive, so two routines are tried in turn (ROUTINES): with a check test a few
 *   hours after each dose showing it arrived, and without one. The first the engine
 *   accepts as proof is the one the forecast follows;
 * - no water change, and nothing else that restarts the engine's count.
 */

import { evaluatePrepared } from '../engine'
import { continuedHistory, type PreparedInput } from '../history'
import { DAY_MS, HOUR_MS, toIso } from '../time'
import { LIVESTOCK_GROUPS, type CycleEvent, type CycleReading, type LivestockGroup, type Thresholds } from '../types'
import { HORIZON_DAYS } from './parameters'

/** What the engine decides under one assumed future. */
export interface Projection {
  completedMs: number
  /** Earliest time per group from the engine's readiness (null where the engine gives none). */
  groups: Record<LivestockGroup, number | null>
}

/** The tank's state the routine continues from. */
export interface ProjectionBase {
  /** The tank's input, its whole history prepared: each projection continues it as of now instead of preparing years again. */
  input: PreparedInput
  thresholds: Thresholds
  /** Time of the latest real test. */
  lastTestMs: number
  nowMs: number
  /** Which series still read above zero now (they stay above zero until T). */
  ammoniaAbove: boolean
  nitriteAbove: boolean
  /** Nitrate assumed present from T on, mg/L as N. */
  nitrateN: number
  /** Add the clearance dose after each zero test (fishless, no livestock yet). */
  doseAfterZeroTests: boolean
  /** The latest real test read zero and no dose followed it: the routine doses right after now. */
  doseNow: boolean
  /** A real dose after the latest test whose arrival no test has shown yet (time), or null. */
  uncheckedDoseMs: number | null
  testEveryHours: number
}

/** Most proofs need a few days of zero tests; the engine first runs on this many days past T, then on the whole horizon. */
const FIRST_TRY_DAYS = 14

/** Hours after a clearance dose at which the check test shows it arrived (the trade's "a few hours later"). */
const ARRIVAL_CHECK_HOURS = 3

/** How the assumed future shows each clearance dose: with a check test that it arrived, or without. */
export type Routine = 'checked' | 'unchecked'

/** Tried in this order; a routine the rule set does not accept as proof never proves the cycle. */
export const ROUTINES: readonly Routine[] = ['checked', 'unchecked']

/** Times of the assumed future tests: on the latest test's rhythm, from the first one after now, up to `untilMs`. */
export function futureTestTimes(base: ProjectionBase, untilMs = base.lastTestMs + HORIZON_DAYS * DAY_MS): number[] {
  const step = base.testEveryHours * HOUR_MS
  const end = Math.min(untilMs, base.lastTestMs + HORIZON_DAYS * DAY_MS)
  const times: number[] = []
  let t = base.lastTestMs + step
  // A test already due is taken within the hour; after a dose given now, a full interval later.
  if (t <= base.nowMs) t = base.nowMs + (base.doseNow ? step : HOUR_MS)
  for (; t <= end; t += step) times.push(t)
  return times
}

function assumedTest(base: ProjectionBase, t: number, zero: boolean, index: number): CycleReading {
  const th = base.thresholds
  // Before T only "above the kit's zero" matters to the proof; twice the limit says exactly that.
  return {
    id: `forecast-${index}`,
    takenAt: toIso(t),
    ammoniaN: zero || !base.ammoniaAbove ? 0 : 2 * th.ammoniaZeroN,
    nitriteN: zero || !base.nitriteAbove ? 0 : 2 * th.nitriteZeroN,
    nitrateN: base.nitrateN,
  }
}

/**
 * Runs the engine on the real history plus the assumed routine in which ammonia and
 * nitrite read zero from `zeroFromMs`; null when the engine would not prove the cycle
 * inside the horizon.
 */
export function projectCompletion(base: ProjectionBase, zeroFromMs: number, routine: Routine): Projection | null {
  return projectUntil(base, zeroFromMs, zeroFromMs + FIRST_TRY_DAYS * DAY_MS, routine) ?? projectUntil(base, zeroFromMs, Number.POSITIVE_INFINITY, routine)
}

/** The first routine under which the engine proves the cycle with zeros from `zeroFromMs`, with that projection. */
export function firstProvingRoutine(base: ProjectionBase, zeroFromMs: number): { routine: Routine, projection: Projection } | null {
  for (const routine of base.doseAfterZeroTests ? ROUTINES : ROUTINES.slice(0, 1)) {
    const projection = projectCompletion(base, zeroFromMs, routine)
    if (projection) return { routine, projection }
  }
  return null
}

function projectUntil(base: ProjectionBase, zeroFromMs: number, untilMs: number, routine: Routine): Projection | null {
  // The assumed future, all after now.
  const readings: CycleReading[] = []
  const events: CycleEvent[] = []
  const times = futureTestTimes(base, untilMs)
  const last = times[times.length - 1]
  if (last === undefined) return null
  const dose = (t: number, key: string) => {
    const amount = base.thresholds.clearanceDoseN
    events.push({ id: `forecast-dose-${key}`, at: toIso(t + 60_000), kind: 'ammonia-dose', amount } satisfies CycleEvent)
    if (routine === 'checked') {
      readings.push({ id: `forecast-check-${key}`, takenAt: toIso(t + ARRIVAL_CHECK_HOURS * HOUR_MS), ammoniaN: amount, nitriteN: 0, nitrateN: base.nitrateN })
    }
  }
  if (base.doseNow) dose(base.nowMs, 'now')
  // A dose given today is checked a few hours later, as the routine checks its own doses.
  if (routine === 'checked' && base.uncheckedDoseMs !== null) {
    const at = Math.max(base.uncheckedDoseMs + ARRIVAL_CHECK_HOURS * HOUR_MS, base.nowMs + 60_000)
    if (times[0] === undefined || at < times[0]) readings.push({ id: 'forecast-check-pending', takenAt: toIso(at), ammoniaN: base.thresholds.clearanceDoseN, nitriteN: 0, nitrateN: base.nitrateN })
  }
  times.forEach((t, i) => {
    const zero = t >= zeroFromMs
    readings.push(assumedTest(base, t, zero, i))
    // The routine ends on a test before the next dose: the engine judges the proof there.
    if (zero && base.doseAfterZeroTests && t !== last) dose(t, String(i))
  })
  // The tank's history as of now continued by the assumed future. Every assumed test and dose is
  // after now by construction (futureTestTimes); one that were not would be no routine to follow.
  const history = continuedHistory(base.input.history, base.nowMs, { readings, events }, last)
  if (!history) return null
  const verdict = evaluatePrepared({ ...base.input, history, now: toIso(last) })
  if (verdict.completedOn === null) return null
  const groups = {} as Record<LivestockGroup, number | null>
  for (const g of LIVESTOCK_GROUPS) {
    const earliest = verdict.readiness[g].earliest
    groups[g] = earliest === null ? null : Date.parse(earliest)
  }
  return { completedMs: Date.parse(verdict.completedOn), groups }
}
