/**
 * The phase of the cycle, read from the course of the readings rather than from a
 * single test: ammonia that is still climbing, ammonia being turned into nitrite,
 * both at zero but unproven, or proven.
 */

import { latestNitrogen, type Latest } from './snapshot'
import type { Course } from './course'
import type { History, TimedReading } from './history'
import type { CyclePhase, CycleTank, Thresholds } from './types'

/** When something first fed the bacteria: a dose, livestock, the fish of a fish-in cycle, or a test showing ammonia. */
export function firstSourceTime(history: History, tank: CycleTank, startedMs: number, thresholds: Thresholds): number | null {
  let first = tank.cycleMethod === 'fish-in' ? startedMs : Number.POSITIVE_INFINITY
  for (const { event, t } of history.events) {
    if (event.kind === 'ammonia-dose' || event.kind === 'bacteria-dose' || event.kind === 'livestock-added') {
      first = Math.min(first, t)
      break
    }
  }
  // Ammonia nobody logged (rock, food, tap water) still feeds the bacteria.
  const shown = history.readings.find((r) => (r.ammoniaN ?? 0) > thresholds.ammoniaZeroN || (r.nitriteN ?? 0) > thresholds.nitriteZeroN)
  if (shown) first = Math.min(first, shown.t)
  return Number.isFinite(first) ? first : null
}

/** True when the latest ammonia is at least `fallFraction` below its peak since the last dose. */
export function ammoniaFalling(history: History, latest: TimedReading, fallFraction: number): boolean {
  let since = Number.NEGATIVE_INFINITY
  for (const { event, t } of history.events) if (event.kind === 'ammonia-dose' && t <= latest.t) since = t
  let peak = 0
  for (const r of history.readings) {
    if (r.t > latest.t) break
    // A dose raises ammonia on purpose, so the peak that matters is the one since the last dose.
    if (r.t > since && r.ammoniaN !== undefined) peak = Math.max(peak, r.ammoniaN)
  }
  return (latest.ammoniaN ?? 0) <= (1 - fallFraction) * peak
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
  if (sourceT === null) return 'not-started'
  const lastTest = latestNitrogen(history.readings)
  // The source went in after the last test: ammonia is expected, not yet measured.
  if (lastTest === null || lastTest.t < sourceT) return 'ammonia'
  const ammonia = latest.ammoniaN
  const nitriteUp = (latest.nitriteN?.nitriteN ?? 0) > thresholds.nitriteZeroN
  const ammoniaUp = ammonia !== undefined && (ammonia.ammoniaN ?? 0) > thresholds.ammoniaZeroN
  if (!ammoniaUp) return nitriteUp ? 'nitrite' : 'settling'
  const established = course.ammoniaFallen !== null
  if (nitriteUp && (established || ammoniaFalling(history, ammonia, thresholds.fallFraction))) return 'nitrite'
  // Ammonia from a clearance dose that is still inside its window is the test under way, not a relapse.
  if (established && !nitriteUp && course.openDoses.some((d) => d.t < ammonia.t)) return 'settling'
  return 'ammonia'
}
