/**
 * `readingsBetween` (shared/cycle/snapshot.ts), the binary search the stall, salinity and
 * nitrate-kit rules use for their window of days, against filtering the whole history by time:
 * random histories with many tests at the same instant, windows whose ends fall on a test,
 * between tests, before the first and after the last, and empty windows. Any difference fails.
 */

import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import type { TimedReading } from '../../../../shared/cycle/history'
import { readingsBetween } from '../../../../shared/cycle/snapshot'

const timesArb = fc.array(fc.integer({ min: 0, max: 40 }), { maxLength: 60 })

describe('readingsBetween', () => {
  it('is the history filtered to the window, in order', () => {
    fc.assert(fc.property(timesArb, fc.integer({ min: -5, max: 45 }), fc.integer({ min: -5, max: 45 }), fc.boolean(), (times, from, to, open) => {
      const readings: TimedReading[] = [...times].sort((a, b) => a - b).map((t, i) => ({ id: `r${i}`, t, entered: 0 }))
      const end = open ? Number.POSITIVE_INFINITY : to
      const found = readingsBetween(readings, from, open ? undefined : to)
      expect(found).toEqual(readings.filter(r => r.t >= from && r.t <= end))
      // The very objects, not copies: findings cite them.
      found.forEach(r => expect(readings).toContain(r))
    }), { seed: 20261203, numRuns: 500 })
  })
})
