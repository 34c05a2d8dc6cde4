/** Public entry of the cycle rule engine. */
export { evaluateCycle, evaluatePrepared } from './engine'
export { DEFAULT_THRESHOLDS, resolveThresholds } from './thresholds'
export { RULES, RULE_SET_VERSION, ruleInfo, type RuleInfo } from './registry'
export * from './types'
