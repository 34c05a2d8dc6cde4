/**
 * The phase of the cycle, read from the course of the readings rather than from a
 * single test: ammonia that is still climbing, ammonia being turned into nitrite,
 * both at zero but unproven, or proven.
 */

import { firstShown, lastWhere, latestNitrogen, readingsAfter } from './reads'
import type { Latest } from './snapshot'
import { HOUR_MS } from './time'
import type { Course } from './course'
import type { History, TimedReading } from './history'
import type { CyclePhase, CycleTank, Thresholds } from './types'

/**
 * When something first fed the bacteria, as of `nowMs`: a dose, bacteria, livestock, the fish of a
 * fish-in cycle, or a test showing ammonia or nitrite. Null when nothing has yet.
 */
export function firstSourceTime(history: History, tank: CycleTank, startedMs: number, thresholds: Thresholds, nowMs: number): number | null {
  // History is already cut at `now`; the fish of a fish-in start that lies in the future are not in yet.
  let first = tank.cycleMethod === 'fish-in' && startedMs <= nowMs ? startedMs : Number.POSITIVE_INFINITY
  for (const { event, t } of history.events) {
    if (event.kind === 'ammonia-dose' || event.kind === 'bacteria-dose' || event.kind === 'livestock-added') {
      first = Math.min(first, t)
      break
    }
  }
  // Ammonia nobody logged (rock, food, tap water) still feeds the bacteria.
  const shown = firstShown(history, thresholds)
  if (shown) first = Math.min(first, shown.t)
  return Number.isFinite(first) ? first : null
}

/**
 * True when the latest ammonia is at least `fallFraction` below its peak since the last
 * dose, water change or zero ammonia test.
 */
export function ammoniaFalling(history: History, latest: TimedReading, fallFraction: number, zeroN: number): boolean {
  let since = Number.NEGATIVE_INFINITY
  for (const { event, t } of history.events) {
    // A dose raises ammonia on purpose and a water change lowers it by dilution: neither is the bacteria's doing.
    if ((event.kind === 'ammonia-dose' || event.kind === 'water-change') && t <= latest.t) since = t
  }
  // Ammonia back after reading zero is a new rise (a relapse): its peak starts there.
  const zero = lastWhere(history, latest.t, false, r => r.ammoniaN !== undefined && r.ammoniaN <= zeroN, since)
  if (zero !== null) since = zero.t
  let peak = 0
  for (const r of readingsAfter(history, since, latest.t)) {
    if (r.ammoniaN !== undefined) peak = Math.max(peak, r.ammoniaN)
  }
  return (latest.ammoniaN ?? 0) <= (1 - fallFraction) * peak
}

/** True when `t` falls within `windowHours` after an ammonia dose. */
function insideDoseWindow(history: History, t: number, windowHours: number): boolean {
  return history.events.some(({ event, t: at }) => event.kind === 'ammonia-dose' && at < t && t <= at + windowHours * HOUR_MS)
}

/** Everything the phase decision looks at. */
export interface PhaseInput {
  readonly history: History
  readonly course: Course
  readonly latest: Latest
  readonly thresholds: Thresholds
  readonly sourceT: number | null
}

/** Decides the phase; `complete` only when the course holds a completion that no later test has ended. */
export function decidePhase({ history, course, latest, thresholds, sourceT }: PhaseInput): CyclePhase {
  if (course.completion) return 'complete'
  // A proven tank working off a dose or a spike is settling, not back in the ammonia or nitrite stage.
  if (course.held) return 'settling'
  if (sourceT === null) return 'not-started'
  const lastTest = latestNitrogen(history)
  // The source went in after the last test: ammonia is expected, not yet measured.
  if (lastTest === null || lastTest.t < sourceT) return 'ammonia'
  const ammonia = latest.ammoniaN
  const nitriteUp = (latest.nitriteN?.nitriteN ?? 0) > thresholds.nitriteZeroN
  const ammoniaUp = ammonia !== undefined && (ammonia.ammoniaN ?? 0) > thresholds.ammoniaZeroN
  if (!ammoniaUp) return nitriteUp ? 'nitrite' : 'settling'
  // Once ammonia has fallen, ammonia inside a dose's window is that dose being worked off: feeding
  // during the nitrite stage, or a clearance test under way. Anywhere else it is a relapse.
  const dosed = course.ammoniaFallen !== null && insideDoseWindow(history, ammonia.t, thresholds.clearanceWindowHours)
  if (nitriteUp && (dosed || ammoniaFalling(history, ammonia, thresholds.fallFraction, thresholds.ammoniaZeroN))) return 'nitrite'
  if (dosed) return 'settling'
  return 'ammonia'
}
