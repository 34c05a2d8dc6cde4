/**
 * Every rule set Tidewright has signed verdicts with, selectable by version, so a
 * verdict re-runs from its snapshot under the rules it was made with. Old rule sets
 * live frozen in their own folder (`v1/`); the versions of rule set 2 share one engine and
 * differ only by the switches in `options.ts`, so each re-runs exactly without a copy.
 */

import { evaluateCycle } from './engine'
import { RULE_OPTIONS_2 } from './options'
import type { CycleInput, Verdict } from './types'
import { evaluateCycle as evaluateCycleV1 } from './v1/engine'
import { RULE_SET_VERSION as RULE_SET_VERSION_V1 } from './v1/registry'
import type { CycleInput as CycleInputV1 } from './v1/types'

type Evaluator = (input: CycleInput) => Verdict

/** Rule set version -> engine. */
export const RULE_SETS: Readonly<Record<string, Evaluator>> = Object.freeze({
  [RULE_SET_VERSION_V1]: (input: CycleInput) => evaluateCycleV1(input as CycleInputV1) as unknown as Verdict,
  ...Object.fromEntries(RULE_OPTIONS_2.map(options => [options.version, (input: CycleInput) => evaluateCycle(input, options)])),
})

/** A signed snapshot: the engine input and the rule set version its verdict names. */
export interface VersionedSnapshot {
  input: CycleInput
  verdict: { ruleSetVersion: string }
}

/**
 * Re-runs a snapshot under the rule set it was made with. Throws a RangeError for a
 * version this build does not know: guessing with other rules would misstate what was signed.
 */
export function evaluateCycleVersion(snapshot: VersionedSnapshot): Verdict {
  const evaluate = RULE_SETS[snapshot.verdict.ruleSetVersion]
  if (evaluate === undefined) throw new RangeError(`unknown rule set ${snapshot.verdict.ruleSetVersion}`)
  return evaluate(snapshot.input)
}
