/**
 * The shape every rule takes: data (id, description, source) plus one small
 * function. The registry lists them; the engine runs them in registry order.
 */

import type { ReadinessContext, RuleContext } from '../context'
import type { TimedReading } from '../history'
import type { CycleAction, LivestockGroup, Severity } from '../types'

/** Source string for trade practice with no primary publication. */
export { COMMON_PRACTICE } from '../thresholds'

/** A finding before the engine stamps the rule id on it. */
export interface Hit {
  readonly severity: Severity
  readonly message: string
  readonly readings: readonly TimedReading[]
}

/** What one rule adds to a verdict. */
export interface RuleResult {
  readonly hits: readonly Hit[]
  readonly actions: readonly CycleAction[]
}

/** A rule that reports findings and proposes actions. */
export interface CycleRule {
  readonly id: string
  readonly description: string
  /** A published citation, or COMMON_PRACTICE. */
  readonly source: string
  /** Severities this rule can report. */
  readonly severities: readonly Severity[]
  readonly evaluate: (ctx: RuleContext) => RuleResult
}

/** A rule that can keep a livestock group out. */
export interface ReadinessRule {
  readonly id: string
  readonly description: string
  readonly source: string
  readonly groups: readonly LivestockGroup[]
  /** Plain-word reasons the group may not go in now; empty when this rule does not object. `soFar` holds earlier rules' reasons. */
  readonly block: (ctx: ReadinessContext, group: LivestockGroup, soFar: readonly string[]) => readonly string[]
}

/** Nothing to report. */
export const NOTHING: RuleResult = Object.freeze({ hits: [], actions: [] })

/** One finding, with optional actions. */
export function report(severity: Severity, message: string, readings: readonly (TimedReading | null | undefined)[], actions: readonly CycleAction[] = []): RuleResult {
  const kept = readings.filter((r): r is TimedReading => r !== null && r !== undefined)
  return { hits: [{ severity, message, readings: kept }], actions }
}
