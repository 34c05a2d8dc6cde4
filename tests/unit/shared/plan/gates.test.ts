import { describe, expect, it } from 'vitest'
import { LEAK_TEST_MIN_HOURS, leakTestIssues, siteSurveyIssues } from '../../../../shared/plan/gates'

const NOW = new Date('2026-03-10T12:00:00Z')
const ago = (hours: number) => new Date(NOW.getTime() - hours * 3_600_000).toISOString()

describe('leak test gate (24 h minimum: common practice, no published source)', () => {
  it('is 24 hours', () => {
    expect(LEAK_TEST_MIN_HOURS).toBe(24)
  })
  it('a pass after 0 h or 23.9 h is refused on the end time; 24 h passes', () => {
    expect(leakTestIssues({ startedAt: ago(1), endedAt: ago(1), result: 'pass' }, false, NOW)).toEqual([{ field: 'data.endedAt', message: 'A leak test stands at least 24 h before it can pass; this one stood 0 h.' }])
    expect(leakTestIssues({ startedAt: ago(24.9), endedAt: ago(1), result: 'pass' }, false, NOW)[0]!.message).toContain('23.9 h')
    expect(leakTestIssues({ startedAt: ago(25), endedAt: ago(1), result: 'pass' }, true, NOW)).toEqual([])
  })
  it('recording times without a result is fine until the stage closes', () => {
    expect(leakTestIssues({ startedAt: ago(3) }, false, NOW)).toEqual([])
    expect(leakTestIssues({ startedAt: ago(3) }, true, NOW).map(i => i.field)).toEqual(['data.endedAt', 'data.result'])
  })
  it('a failed test never closes the stage', () => {
    expect(leakTestIssues({ startedAt: ago(48), endedAt: ago(1), result: 'fail' }, true, NOW)).toEqual([{ field: 'data.result', message: 'The stage is done only once the leak test has passed.' }])
  })
})

describe('site survey gate', () => {
  it('under the design load closes freely; over it needs the check done and who did it', () => {
    expect(siteSurveyIssues({}, true, 0.9)).toEqual([])
    expect(siteSurveyIssues({}, true, null)).toEqual([])
    expect(siteSurveyIssues({}, false, 4.7)).toEqual([])
    expect(siteSurveyIssues({ structuralCheckDone: true }, true, 4.7)[0]!.message).toMatch(/^The footprint load is 470 % of the design live load/)
    expect(siteSurveyIssues({ structuralCheckDone: false, structuralCheckBy: 'A. Engineer' }, true, 4.7)).toHaveLength(1)
    expect(siteSurveyIssues({ structuralCheckDone: true, structuralCheckBy: 'A. Engineer' }, true, 4.7)).toEqual([])
  })
})
