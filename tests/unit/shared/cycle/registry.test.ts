import { describe, expect, it } from 'vitest'
import { FINDING_RULES, READINESS_RULES, RULES, RULE_SET_VERSION, ruleInfo } from '../../../../shared/cycle/registry'
import { COMMON_PRACTICE } from '../../../../shared/cycle/rules/rule'

describe('rule registry', () => {
  it('lists every rule once, with a description and a source', () => {
    const ids = RULES.map(r => r.id)
    expect(new Set(ids).size).toBe(ids.length)
    expect(RULES).toHaveLength(FINDING_RULES.length + READINESS_RULES.length)
    for (const rule of RULES) {
      expect(rule.id).toMatch(/^[a-z-]+\.[a-z-]+$/)
      expect(rule.description.length).toBeGreaterThan(20)
      // A citation with a year, the common-practice marker, or a value marked as recalled.
      expect(rule.source.includes(COMMON_PRACTICE) || /\(\d{4}\)/.test(rule.source) || rule.source.includes('from memory')).toBe(true)
    }
  })

  it('cites the EPA saltwater criteria for the free-ammonia rules', () => {
    for (const id of ['ammonia.free-acute', 'ammonia.free-chronic']) {
      expect(ruleInfo(id)?.source).toMatch(/EPA 440\/5-88-004/)
      expect(ruleInfo(id)?.source).toMatch(/Emerson/)
    }
    expect(ruleInfo('ammonia.action-threshold')?.source).toBe(COMMON_PRACTICE)
  })

  it('declares the severities each finding rule can report', () => {
    expect(ruleInfo('ammonia.action-threshold')?.severities).toEqual(['danger'])
    expect(ruleInfo('readiness.coral-wait')?.kind).toBe('readiness')
    expect(ruleInfo('no.such-rule')).toBeUndefined()
  })

  it('has a version', () => {
    expect(RULE_SET_VERSION).toMatch(/\d+\.\d+\.\d+$/)
  })
})
