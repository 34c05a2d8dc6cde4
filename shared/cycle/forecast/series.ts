/**
 * One curve of the forecast (ammonia or nitrite) as points in time, read from the tests in
 * order: the whole series, the stretch from its peak that a decline is fitted to, and its
 * latest value. The last two are read without building the whole series (every save's
 * forecast asks them over a year of tests).
 */
import type { SeriesPoint } from './decline'

/** A test as the forecast's curves read it (time in epoch ms). */
export interface TimedTest {
  t: number
  ammoniaN?: number
  nitriteN?: number
  nitrateN?: number
}

/** A value the curves take: measured, a finite number, not below zero. */
function curveValue(value: number | undefined): value is number {
  return value !== undefined && Number.isFinite(value) && value >= 0
}

/**
 * Each curve's value read by name: the tests come in many shapes (whichever values a test
 * carries), and a read by a key held in a variable (`test[key]`) found its property the slow way
 * for every one of them, twice a curve on every save.
 */
const CURVE_VALUE = {
  ammoniaN: (test: TimedTest) => test.ammoniaN,
  nitriteN: (test: TimedTest) => test.nitriteN,
} as const

/** The points of one curve (a measured, usable value) taken after `fromMs`, in the tests' order. */
export function seriesOf(tests: readonly TimedTest[], key: 'ammoniaN' | 'nitriteN', fromMs: number): SeriesPoint[] {
  return pointsFrom(tests, 0, key, fromMs)
}

/** `seriesOf` over `tests` from index `start` on, without slicing them. */
function pointsFrom(tests: readonly TimedTest[], start: number, key: 'ammoniaN' | 'nitriteN', fromMs: number): SeriesPoint[] {
  const read = CURVE_VALUE[key]
  const points: SeriesPoint[] = []
  for (let i = start; i < tests.length; i++) {
    const test = tests[i]!
    const value = read(test)
    if (curveValue(value) && test.t > fromMs) points.push({ t: test.t, value })
  }
  return points
}

/**
 * `seriesOf(tests, key, fromMs)` from its peak on (the latest highest point), the stretch a decline
 * is fitted to, without building the points before the peak: `fitDecline` cuts at the peak again
 * and finds it at the first point (every later one is lower), so it fits the same stretch.
 */
export function seriesSincePeak(tests: readonly TimedTest[], key: 'ammoniaN' | 'nitriteN', fromMs: number): SeriesPoint[] {
  const read = CURVE_VALUE[key]
  let peak = -1
  let peakValue = Number.NEGATIVE_INFINITY
  for (let i = 0; i < tests.length; i++) {
    const test = tests[i]!
    const value = read(test)
    if (curveValue(value) && test.t > fromMs && value >= peakValue) {
      peak = i
      peakValue = value
    }
  }
  return peak < 0 ? [] : pointsFrom(tests, peak, key, fromMs)
}

/** The last value of `seriesOf(tests, key, fromMs)`, found from the end instead of building the series. */
export function latestOfSeries(tests: readonly TimedTest[], key: 'ammoniaN' | 'nitriteN', fromMs: number): number | undefined {
  const read = CURVE_VALUE[key]
  for (let i = tests.length - 1; i >= 0; i--) {
    const test = tests[i]!
    const value = read(test)
    if (curveValue(value) && test.t > fromMs) return value
  }
  return undefined
}
