/**
 * What every rule sees: the ordered history, the traced course, the phase and the
 * latest values, all computed once per verdict.
 */

import type { Course } from './course'
import type { History, TimedEvent } from './history'
import type { RuleOptions } from './options'
import type { Latest } from './snapshot'
import type { CyclePhase, CycleTank, Finding, LivestockGroup, Thresholds } from './types'

/** Read-only facts shared by the rules of one verdict. */
export interface RuleContext {
  readonly tank: CycleTank
  readonly startedMs: number
  readonly nowMs: number
  readonly thresholds: Thresholds
  /** The behaviours of the rule set version being run. */
  readonly options: RuleOptions
  readonly history: History
  readonly course: Course
  readonly phase: CyclePhase
  readonly latest: Latest
  /** First time anything fed the bacteria, or null. */
  readonly sourceT: number | null
  /** livestock-added events, oldest first. */
  readonly livestock: readonly TimedEvent[]
}

/** The rule context plus the findings, for the readiness rules that weigh them. */
export interface ReadinessContext extends RuleContext {
  readonly findings: readonly Finding[]
  /** Groups already decided, in LIVESTOCK_GROUPS order (fish first). */
  readonly decided: Readonly<Partial<Record<LivestockGroup, boolean>>>
}

/** Animals are in the water at `t`: the fish of a fish-in cycle, or any livestock added by then. */
export function animalsInAt(ctx: RuleContext, t: number): boolean {
  if (ctx.tank.cycleMethod === 'fish-in' && ctx.startedMs <= t) return true
  return ctx.livestock.some(e => e.t <= t)
}
