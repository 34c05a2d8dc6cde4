import { describe, expect, it } from 'vitest'
import { EPA_CRITERIA_N, freeAmmoniaOf, phaseSpans, type ChartPoint } from '../../../../shared/readings/chart'

const DAY = 86_400_000
const limits = { ammoniaZeroN: 0.05, nitriteZeroN: 0.05, riseN: 0.2 }
const point = (day: number, ammoniaN: number, nitriteN: number): ChartPoint => ({ t: day * DAY, ammoniaN, nitriteN, nitrateN: null, pH: null, temperatureC: null, salinity: null })

describe('phaseSpans', () => {
  it('follows a fishless course: ammonia, nitrite, settling, then complete from the engine\'s date', () => {
    const points = [point(0, 1.6, 0), point(3, 1.6, 0.1), point(6, 1, 1), point(9, 0, 1.2), point(12, 0, 0), point(14, 0, 0), point(16, 0, 0)]
    const spans = phaseSpans(points, 'complete', 14 * DAY, limits, 20 * DAY)
    expect(spans.map(s => [s.phase, s.from / DAY, s.to / DAY])).toEqual([
      ['ammonia', 0, 3], ['nitrite', 3, 12], ['settling', 12, 14], ['complete', 14, 20],
    ])
  })

  it('gives the last span the engine\'s current phase', () => {
    const spans = phaseSpans([point(0, 1.6, 0), point(2, 1.6, 0)], 'nitrite', null, limits, 5 * DAY)
    expect(spans.map(s => [s.phase, s.from / DAY, s.to / DAY])).toEqual([['ammonia', 0, 2], ['nitrite', 2, 5]])
    expect(phaseSpans([point(0, 0, 0)], 'not-started', null, limits, DAY).map(s => s.phase)).toEqual(['not-started'])
    expect(phaseSpans([], 'not-started', null, limits, DAY)).toEqual([])
  })
})

describe('free ammonia for the chart', () => {
  it('matches Bower & Bidwell (1978): 4.28 % NH3 at 25 C, pH 8.0, S 34, within 1.5 %', () => {
    expect(freeAmmoniaOf({ ammoniaN: 1, pH: 8, temperatureC: 25, salinity: 34 })! / 0.0428).toBeCloseTo(1, 1)
  })

  it('is null when a condition is missing or outside the formula\'s range', () => {
    expect(freeAmmoniaOf({ ammoniaN: 1, pH: null, temperatureC: 25, salinity: 35 })).toBeNull()
    expect(freeAmmoniaOf({ ammoniaN: 1, pH: 8, temperatureC: 45, salinity: 35 })).toBeNull()
  })

  it('converts the EPA (1989) criteria to nitrogen: 0.02879 and 0.1916 mg NH3-N/L (computed, reference.md section 2)', () => {
    expect(EPA_CRITERIA_N.chronic).toBeCloseTo(0.02879, 5)
    expect(EPA_CRITERIA_N.acute).toBeCloseTo(0.1916, 4)
  })
})
