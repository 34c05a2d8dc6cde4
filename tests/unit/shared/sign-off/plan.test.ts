import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../shared/cycle/engine'
import type { CycleInput, Verdict } from '../../../../shared/cycle/types'
import { acclimationSettingsOf, datedAcclimation, finalReadings, overrideGrounds, stockingSteps } from '../../../../shared/sign-off/plan'

const readiness = (allowed: boolean): Verdict['readiness'] => ({
  'fish': { allowed, earliest: '2026-12-01T00:00:00.000Z', blockers: allowed ? [] : ['Wait for zero nitrite.'] },
  'invertebrates': { allowed, earliest: '2026-12-01T00:00:00.000Z', blockers: [] },
  'soft-coral': { allowed: false, earliest: '2026-12-15T00:00:00.000Z', blockers: ['Two weeks after completion.'] },
  'lps-coral': { allowed: false, earliest: '2026-12-29T00:00:00.000Z', blockers: ['Later.'] },
  'sps-coral': { allowed: false, earliest: null, blockers: ['Later still.'] },
})

describe('overrideGrounds', () => {
  it('is empty when the phase is complete, no danger finding and no open alert', () => {
    expect(overrideGrounds({ phase: 'complete', findings: [{ ruleId: 'x', severity: 'caution', message: '', readingIds: [] }] }, 0)).toEqual([])
  })

  it('names each reason approving would go against the engine', () => {
    const grounds = overrideGrounds({ phase: 'nitrite', findings: [{ ruleId: 'a', severity: 'danger', message: '', readingIds: [] }] }, 2)
    expect(grounds).toHaveLength(3)
    expect(grounds[0]).toContain('"nitrite"')
    expect(grounds[1]).toContain('1 danger finding.')
    expect(grounds[2]).toContain('2 danger alerts are not resolved')
    expect(overrideGrounds({ phase: 'complete', findings: [] }, 1)).toEqual(['1 danger alert is not resolved.'])
  })
})

describe('stockingSteps', () => {
  it('lists the groups least to most demanding with the engine\'s dates and blockers', () => {
    const steps = stockingSteps({ readiness: readiness(true) })
    expect(steps.map(s => [s.order, s.group])).toEqual([[1, 'fish'], [2, 'invertebrates'], [3, 'soft-coral'], [4, 'lps-coral'], [5, 'sps-coral']])
    expect(steps[2]).toMatchObject({ allowed: false, earliest: '2026-12-15T00:00:00.000Z', blockers: ['Two weeks after completion.'], label: 'Soft corals' })
    expect(stockingSteps({ readiness: readiness(false) })[0]?.blockers).toEqual(['Wait for zero nitrite.'])
  })
})

describe('datedAcclimation', () => {
  it('dates the default four-week plan (30 % to 60 %, common practice, no published source) week by week', () => {
    const plan = datedAcclimation('2026-12-01T10:00:00.000Z')
    expect(plan.map(s => s.plateauPercent)).toEqual([30, 37.5, 45, 52.5, 60])
    expect(plan.map(s => s.from.slice(0, 10))).toEqual(['2026-12-01', '2026-12-08', '2026-12-15', '2026-12-22', '2026-12-29'])
  })

  it('refuses a start that is not a date', () => {
    expect(() => datedAcclimation('soon')).toThrow(RangeError)
  })

  it('follows the tank\'s own settings from its lighting-ramp stage, defaults where unset', () => {
    const own = acclimationSettingsOf([{ key: 'substrate', data: {} }, { key: 'lighting-ramp', data: { acclimationWeeks: 2, acclimationStartPercent: 20, acclimationEndPercent: 40 } }])
    expect(own).toEqual({ weeks: 2, startPercent: 20, endPercent: 40 })
    const plan = datedAcclimation('2026-12-01T10:00:00.000Z', own)
    expect(plan.map(s => s.plateauPercent)).toEqual([20, 30, 40])
    expect(plan.map(s => s.from.slice(0, 10))).toEqual(['2026-12-01', '2026-12-08', '2026-12-15'])
    expect(acclimationSettingsOf([{ key: 'lighting-ramp', data: { acclimationWeeks: 6, acclimationStartPercent: null } }])).toEqual({ weeks: 6, startPercent: 30, endPercent: 60 })
    expect(acclimationSettingsOf([])).toEqual({ weeks: 4, startPercent: 30, endPercent: 60 })
  })
})

describe('finalReadings', () => {
  it('takes the latest value of each test at or before the verdict time', () => {
    const input: Pick<CycleInput, 'readings' | 'now'> = {
      now: '2026-12-03T00:00:00.000Z',
      readings: [
        { id: 'a', takenAt: '2026-12-01T09:00:00.000Z', ammoniaN: 0.5, pH: 8.1, salinity: 34.8 },
        { id: 'b', takenAt: '2026-12-02T09:00:00.000Z', ammoniaN: 0, nitriteN: 0 },
        { id: 'c', takenAt: '2026-12-04T09:00:00.000Z', ammoniaN: 2 },
      ],
    }
    const byKey = Object.fromEntries(finalReadings(input).map(f => [f.key, [f.value, f.readingId]]))
    expect(byKey).toEqual({ ammoniaN: [0, 'b'], nitriteN: [0, 'b'], pH: [8.1, 'a'], salinity: [34.8, 'a'] })
  })
})

describe('a stored verdict snapshot', () => {
  it('survives JSON storage and reproduces the same verdict with the same rule set', () => {
    const start = Date.parse('2026-10-01T09:00:00.000Z')
    const day = 86_400_000
    const input: CycleInput = {
      tank: { volumeLitres: 200, cycleMethod: 'fishless', startedAt: new Date(start).toISOString() },
      readings: Array.from({ length: 30 }, (_, i) => ({
        id: `r${i}`,
        takenAt: new Date(start + i * day).toISOString(),
        ammoniaN: i < 10 ? 1.5 - i * 0.15 : 0,
        nitriteN: i < 8 ? 0.1 * i : i < 20 ? 2 - (i - 8) * 0.17 : 0,
        nitrateN: i * 0.5,
        pH: 8.1,
        temperatureC: 25.5,
        salinity: 35,
      })),
      events: [{ id: 'e1', at: new Date(start).toISOString(), kind: 'ammonia-dose', amount: 1.65 }],
      now: new Date(start + 30 * day).toISOString(),
    }
    const verdict = evaluateCycle(input)
    const stored = JSON.parse(JSON.stringify({ input, verdict })) as { input: CycleInput, verdict: Verdict }
    expect(evaluateCycle(stored.input)).toEqual(stored.verdict)
    // The snapshot would not hide a change: a different reading gives a different verdict.
    const changed = structuredClone(stored.input)
    changed.readings[29]!.ammoniaN = 3
    expect(evaluateCycle(changed)).not.toEqual(stored.verdict)
  })
})
