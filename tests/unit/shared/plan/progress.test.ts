import { describe, expect, it } from 'vitest'
import { currentStage, elapsedHours, planFraction, whatHappensNext } from '../../../../shared/plan/progress'

const stages = [
  { key: 'site-survey', title: 'Site survey', status: 'done' as const },
  { key: 'leak-test', title: 'Leak test', status: 'skipped' as const },
  { key: 'substrate', title: 'Substrate', status: 'in-progress' as const },
  { key: 'custom-step', title: 'Custom step', status: 'not-started' as const },
]

describe('plan progress', () => {
  it('finds the first stage neither done nor skipped', () => {
    expect(currentStage(stages)?.key).toBe('substrate')
    expect(currentStage(stages.slice(0, 2))).toBeUndefined()
  })

  it('counts done and skipped as finished', () => {
    expect(planFraction(stages)).toBe(0.5)
    expect(planFraction([])).toBe(0)
  })

  it('says what happens next in plain words, for default and custom stages', () => {
    expect(whatHappensNext(stages)).toMatch(/^Under way now — Substrate\. Sand goes in/)
    expect(whatHappensNext([{ key: 'custom-step', title: 'Custom step', status: 'not-started' }])).toBe('Next — Custom step. Next in the plan: Custom step.')
    expect(whatHappensNext(stages.slice(0, 2))).toMatch(/^Every stage/)
  })

  it('measures elapsed hours and refuses an end before the start', () => {
    expect(elapsedHours('2026-03-01T09:00:00Z', '2026-03-02T21:00:00Z')).toBe(36)
    expect(elapsedHours('2026-03-02T09:00:00Z', '2026-03-01T09:00:00Z')).toBeNull()
    expect(elapsedHours(null, '2026-03-01T09:00:00Z')).toBeNull()
  })
})
