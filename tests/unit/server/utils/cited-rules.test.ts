/**
 * The rules an answer names for staff: exactly those its findings and livestock blockers cite,
 * each with the registry's own description and source.
 */
import { describe, expect, it } from 'vitest'
import { citedRules, rulesCitedBy } from '#server/utils/cited-rules'
import { ruleInfo } from '#shared/cycle/registry'
import type { GroupReadiness, Verdict } from '#shared/cycle/types'

const words = (id: string) => {
  const info = ruleInfo(id)!
  return { id, description: info.description, source: info.source }
}
const waiting = (...blockers: string[]): GroupReadiness => ({ allowed: blockers.length === 0, earliest: null, blockers })

describe('citedRules', () => {
  it('gives each named rule the registry\'s description and source, and leaves out an id it does not have', () => {
    expect(citedRules(['ammonia.action-threshold', 'no.such-rule'])).toEqual({ 'ammonia.action-threshold': words('ammonia.action-threshold') })
    expect(citedRules([])).toEqual({})
  })
})

describe('rulesCitedBy', () => {
  it('names the findings\' rules and the readiness rules that wrote the blockers, once each', () => {
    const verdict: Pick<Verdict, 'findings' | 'readiness'> = {
      findings: [
        { ruleId: 'ammonia.action-threshold', severity: 'danger', message: 'Ammonia is high.', readingIds: [] },
        { ruleId: 'ammonia.action-threshold', severity: 'danger', message: 'Ammonia is still high.', readingIds: [] },
      ],
      readiness: {
        'fish': waiting('Not yet: the cycle is in its nitrite stage.'),
        'invertebrates': waiting('Not yet: the cycle is in its nitrite stage.', 'Phosphate is 2 mg/L as PO4, above 1 for invertebrates.'),
        'soft-coral': waiting('A blocker in a form no rule writes'),
        'lps-coral': waiting(),
        'sps-coral': waiting(),
      },
    }
    expect(rulesCitedBy(verdict)).toEqual({
      'ammonia.action-threshold': words('ammonia.action-threshold'),
      'readiness.cycle-complete': words('readiness.cycle-complete'),
      'readiness.phosphate': words('readiness.phosphate'),
    })
  })
})
