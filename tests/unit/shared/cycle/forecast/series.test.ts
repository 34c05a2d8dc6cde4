import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { fitDecline } from '../../../../../shared/cycle/forecast/decline'
import { latestOfSeries, seriesOf, seriesSincePeak, type TimedTest } from '../../../../../shared/cycle/forecast/series'

const DAY_MS = 86_400_000
const RUNS = { seed: 20261203, numRuns: 400 }

// Values as tests bring them: missing, zero, repeated peaks (ties), tiny and large, and the unusable ones the curves skip.
const value = fc.oneof(
  { arbitrary: fc.constant(undefined), weight: 1 },
  { arbitrary: fc.constantFrom(0, 0.25, 0.5, 1, 2), weight: 4 },
  { arbitrary: fc.constantFrom(-1, Number.NaN, Number.POSITIVE_INFINITY), weight: 1 },
  { arbitrary: fc.double({ min: 0, max: 2, noNaN: true }), weight: 2 },
)

// Tests in time order (the forecast hands them over so), some at the same instant.
const testsArb = fc.array(fc.record({ gapHours: fc.constantFrom(0, 1, 6, 12, 24, 48), ammoniaN: value, nitriteN: value }), { maxLength: 60 })
  .map(rows => rows.reduce<TimedTest[]>((tests, row) => {
    const t = (tests.at(-1)?.t ?? 0) + row.gapHours * 3_600_000
    return [...tests, { t, ammoniaN: row.ammoniaN, nitriteN: row.nitriteN }]
  }, []))

// A cut the series starts after: before every test, inside them, or after them all (a water change).
const fromArb = fc.integer({ min: -1, max: 70 }).map(days => (days < 0 ? Number.NEGATIVE_INFINITY : days * DAY_MS))

const key = fc.constantFrom('ammoniaN' as const, 'nitriteN' as const)

/** The stretch from the latest highest point, as the decline fit cuts a whole series. */
function fromLatestPeak<T extends { value: number }>(points: readonly T[]): T[] {
  let peak = 0
  points.forEach((p, i) => {
    if (p.value >= points[peak]!.value) peak = i
  })
  return points.slice(peak)
}

describe('a forecast curve read without building the whole series', () => {
  it('the stretch since the peak is the whole series cut at its latest highest point', () => {
    fc.assert(fc.property(testsArb, key, fromArb, (tests, k, fromMs) => {
      expect(seriesSincePeak(tests, k, fromMs)).toEqual(fromLatestPeak(seriesOf(tests, k, fromMs)))
    }), RUNS)
  })

  it('a decline fitted to the stretch is the one fitted to the whole series', () => {
    fc.assert(fc.property(testsArb, key, fromArb, fc.constantFrom(0, 0.02, 0.25), (tests, k, fromMs, zeroLimit) => {
      const series = k === 'ammoniaN' ? 'ammonia' : 'nitrite'
      expect(fitDecline(series, seriesSincePeak(tests, k, fromMs), zeroLimit)).toEqual(fitDecline(series, seriesOf(tests, k, fromMs), zeroLimit))
    }), RUNS)
  })

  it('the latest value is the last point of the series', () => {
    fc.assert(fc.property(testsArb, key, fromArb, (tests, k, fromMs) => {
      expect(latestOfSeries(tests, k, fromMs)).toBe(seriesOf(tests, k, fromMs).at(-1)?.value)
    }), RUNS)
  })

  it('a falling curve after an earlier equal peak is fitted from the later peak', () => {
    const hours = (h: number) => h * 3_600_000
    const tests: TimedTest[] = [2, 1, 2, 1.5, 1, 0.6, 0.3].map((n, i) => ({ t: hours(24 * i), nitriteN: n }))
    expect(seriesSincePeak(tests, 'nitriteN', Number.NEGATIVE_INFINITY).map(p => p.value)).toEqual([2, 1.5, 1, 0.6, 0.3])
  })
})
