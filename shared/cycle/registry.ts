/**
 * The one list of Tidewright's cycle rules. A verdict names the rule set version
 * it was made with, so a signed verdict can be explained and re-run later.
 * Change the version whenever a rule, a default threshold or a message changes.
 */

import { AMMONIA_RULES } from './rules/ammonia'
import { PROOF_RULES } from './rules/cycle-proof'
import { PROGRESS_RULES } from './rules/cycle-progress'
import { STALL_RULES } from './rules/cycle-stall'
import { ENVIRONMENT_RULES } from './rules/environment'
import { INPUT_RULES } from './rules/input'
import { LIVESTOCK_RULES } from './rules/livestock'
import { NITRITE_RULES } from './rules/nitrite'
import { READINESS_RULES } from './rules/readiness'
import { RESTART_RULES } from './rules/restarts'
import { STOCKING_RULES } from './rules/stocking'
import { TESTING_RULES } from './rules/testing'
import { YOUNG_TANK_RULES } from './rules/young-tank'
import { CURRENT_RULE_OPTIONS } from './options'
import type { CycleRule } from './rules/rule'
import type { Severity } from './types'

/** Version of the rules and defaults below; part of every verdict. Older 2.x versions differ only by the switches in `options.ts`. */
export const RULE_SET_VERSION = CURRENT_RULE_OPTIONS.version

/** Rules that report findings and propose actions, in evaluation order. */
export const FINDING_RULES: readonly CycleRule[] = [
  ...PROGRESS_RULES,
  ...PROOF_RULES,
  ...STALL_RULES,
  ...RESTART_RULES,
  ...TESTING_RULES,
  ...AMMONIA_RULES,
  ...NITRITE_RULES,
  ...ENVIRONMENT_RULES,
  ...LIVESTOCK_RULES,
  ...STOCKING_RULES,
  ...YOUNG_TANK_RULES,
  ...INPUT_RULES,
]

/** Rules that keep livestock groups out. */
export { READINESS_RULES }

/** What the registry says about one rule, for explanations and the rules page. */
export interface RuleInfo {
  readonly id: string
  readonly kind: 'finding' | 'readiness'
  readonly description: string
  readonly source: string
  /** Severities a finding rule can report; empty for readiness rules, which block instead. */
  readonly severities: readonly Severity[]
}

/** Every rule as plain data, finding rules first. */
export const RULES: readonly RuleInfo[] = Object.freeze([
  ...FINDING_RULES.map(r => ({ id: r.id, kind: 'finding' as const, description: r.description, source: r.source, severities: r.severities })),
  ...READINESS_RULES.map(r => ({ id: r.id, kind: 'readiness' as const, description: r.description, source: r.source, severities: [] })),
])

/** Looks a rule up by id; undefined for an id this rule set does not have. */
export function ruleInfo(id: string): RuleInfo | undefined {
  return RULES.find(r => r.id === id)
}
