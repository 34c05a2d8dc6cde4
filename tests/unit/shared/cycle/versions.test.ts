import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../shared/cycle/engine'
import { RULE_SET_VERSION } from '../../../../shared/cycle/registry'
import type { CycleInput, Verdict } from '../../../../shared/cycle/types'
import { evaluateCycleVersion, RULE_SETS } from '../../../../shared/cycle/versions'

/** Verdicts made by rule set 2.0.0 as it was on main before 2.0.1 (scenarios 2.0.1 judges differently), as snapshots store them. */
const signed200 = JSON.parse(readFileSync(new URL('./fixtures/signed-2.0.0.json', import.meta.url), 'utf8')) as Array<{ scenario: string, input: CycleInput, verdict: Verdict }>

/** A verdict signed under rule set 1.0.0 (a fishless tank proven by one cleared dose), as the sign-off snapshot stores it. */
const signed = JSON.parse(readFileSync(new URL('./fixtures/signed-1.0.0.json', import.meta.url), 'utf8')) as { input: CycleInput, verdict: Verdict }

describe('rule sets by version', () => {
  it('knows the frozen 1.0.0 rule set and the current one', () => {
    expect(Object.keys(RULE_SETS).sort()).toEqual(['tidewright-cycle-1.0.0', 'tidewright-cycle-2.0.0', RULE_SET_VERSION].sort())
    expect(RULE_SET_VERSION).toBe('tidewright-cycle-2.0.1')
  })

  it('reproduces a verdict signed under 1.0.0 exactly from its snapshot', () => {
    expect(signed.verdict.ruleSetVersion).toBe('tidewright-cycle-1.0.0')
    expect(signed.verdict.phase).toBe('complete')
    expect(evaluateCycleVersion(signed)).toEqual(signed.verdict)
  })

  it('judges the same history differently under 2.0.0: one cleared dose is not proof', () => {
    const now = evaluateCycle(signed.input)
    expect(now.ruleSetVersion).toBe(RULE_SET_VERSION)
    expect(now.phase).toBe('settling')
    expect(evaluateCycleVersion({ input: signed.input, verdict: now })).toEqual(now)
  })

  it('reproduces verdicts made under 2.0.0 exactly from their snapshots, though 2.0.1 now judges them differently', () => {
    expect(signed200.map(s => s.scenario)).toEqual(['fishless-textbook', 'phosphate-high', 'natural-seawater-lps-before-sps', 'nitrite-top-of-kit-with-fish', 'stall-by-time-alone'])
    for (const snapshot of signed200) {
      expect(snapshot.verdict.ruleSetVersion).toBe('tidewright-cycle-2.0.0')
      expect(evaluateCycleVersion(snapshot)).toEqual(snapshot.verdict)
      const current = evaluateCycle(snapshot.input)
      expect(current.ruleSetVersion).toBe('tidewright-cycle-2.0.1')
      expect({ ...current, ruleSetVersion: snapshot.verdict.ruleSetVersion }).not.toEqual(snapshot.verdict)
    }
  })

  it('refuses a version it does not know rather than guess', () => {
    expect(() => evaluateCycleVersion({ input: signed.input, verdict: { ruleSetVersion: 'tidewright-cycle-0.9.0' } })).toThrow(RangeError)
  })
})
