import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { changesNeeded, concentrationAfterChanges, waterChangePercentToReach } from '../../../../shared/calc/water-change'

const FC = { seed: 42, numRuns: 300 }

describe('waterChangePercentToReach (mixing c\' = c(1 - f) + r f)', () => {
  it('halving with clean water takes 50 %', () => {
    expect(waterChangePercentToReach({ current: 1, target: 0.5 })).toBeCloseTo(50, 12)
  })

  it('accounts for the new water\'s own concentration', () => {
    // c 2, r 0.5, target 1: f = (2 - 1) / (2 - 0.5) = 2/3
    expect(waterChangePercentToReach({ current: 2, target: 1, replacement: 0.5 })).toBeCloseTo(200 / 3, 10)
  })

  it('returns 0 when already at or below target', () => {
    expect(waterChangePercentToReach({ current: 0.25, target: 0.5 })).toBe(0)
    expect(waterChangePercentToReach({ current: 0.5, target: 0.5 })).toBe(0)
  })

  it('throws when the target is at or below the new water\'s concentration', () => {
    expect(() => waterChangePercentToReach({ current: 2, target: 0.5, replacement: 0.5 })).toThrow(RangeError)
    expect(() => waterChangePercentToReach({ current: 2, target: 0.4, replacement: 0.5 })).toThrow(/target/)
  })

  it('rejects negative and non-finite concentrations', () => {
    expect(() => waterChangePercentToReach({ current: -1, target: 0.5 })).toThrow(/current/)
    expect(() => waterChangePercentToReach({ current: 1, target: Number.NaN })).toThrow(/target/)
    expect(() => waterChangePercentToReach({ current: 1, target: 0.5, replacement: -0.1 })).toThrow(/replacement/)
  })

  it('property: the returned percentage reaches the target exactly and lies in [0, 100]', () => {
    fc.assert(fc.property(
      fc.double({ min: 0, max: 10, noNaN: true }),
      fc.double({ min: 0.001, max: 100, noNaN: true }),
      fc.double({ min: 0.001, max: 100, noNaN: true }),
      (r, gap, excess) => {
        const target = r + gap
        const current = target + excess
        const p = waterChangePercentToReach({ current, target, replacement: r })
        const after = concentrationAfterChanges(current, r, p, 1)
        return p > 0 && p < 100 && Math.abs(after - target) <= 1e-9 * current
      },
    ), FC)
  })
})

describe('changesNeeded', () => {
  it('two 50 % changes take 1 -> 0.25 (no extra change from rounding)', () => {
    expect(changesNeeded({ current: 1, target: 0.25, replacement: 0, percentPerChange: 50 })).toBe(2)
  })

  it('25 % changes: 2 -> 0.5 needs 5 (0.75^5 = 0.237)', () => {
    expect(changesNeeded({ current: 2, target: 0.5, replacement: 0, percentPerChange: 25 })).toBe(5)
  })

  it('0 when already there, 1 for a full change', () => {
    expect(changesNeeded({ current: 0.1, target: 0.5, replacement: 0, percentPerChange: 10 })).toBe(0)
    expect(changesNeeded({ current: 5, target: 0.5, replacement: 0, percentPerChange: 100 })).toBe(1)
  })

  it('rejects bad sizes and unreachable targets', () => {
    expect(() => changesNeeded({ current: 1, target: 0.5, replacement: 0, percentPerChange: 0 })).toThrow(/percentPerChange/)
    expect(() => changesNeeded({ current: 1, target: 0.5, replacement: 0, percentPerChange: 101 })).toThrow(/percentPerChange/)
    expect(() => changesNeeded({ current: 1, target: 0.5, replacement: 0.6, percentPerChange: 20 })).toThrow(/target/)
  })

  it('property: n changes reach the target and n - 1 do not', () => {
    fc.assert(fc.property(
      fc.double({ min: 0, max: 5, noNaN: true }),
      fc.double({ min: 0.01, max: 10, noNaN: true }),
      fc.double({ min: 0.01, max: 100, noNaN: true }),
      fc.double({ min: 1, max: 99, noNaN: true }),
      (r, gap, excess, pct) => {
        const target = r + gap
        const current = target + excess
        const n = changesNeeded({ current, target, replacement: r, percentPerChange: pct })
        const slack = 1e-9 * current
        return n >= 1
          && concentrationAfterChanges(current, r, pct, n) <= target + slack
          && concentrationAfterChanges(current, r, pct, n - 1) > target - slack
      },
    ), FC)
  })
})
