import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { partitionPoint } from '../../../shared/sorted'

describe('partitionPoint', () => {
  it('finds the first item not before the point, as a scan from the start does', () => {
    fc.assert(fc.property(fc.array(fc.integer({ min: -50, max: 50 })), fc.integer({ min: -60, max: 60 }), (values, point) => {
      const sorted = [...values].sort((a, b) => a - b)
      const scanned = sorted.findIndex(v => !(v < point))
      expect(partitionPoint(sorted, v => v < point)).toBe(scanned === -1 ? sorted.length : scanned)
      const scannedAfter = sorted.findIndex(v => !(v <= point))
      expect(partitionPoint(sorted, v => v <= point)).toBe(scannedAfter === -1 ? sorted.length : scannedAfter)
    }))
  })

  it('answers 0 for an empty list and the length when every item comes before', () => {
    expect(partitionPoint([], () => true)).toBe(0)
    expect(partitionPoint([1, 2, 3], () => true)).toBe(3)
    expect(partitionPoint([1, 2, 3], () => false)).toBe(0)
  })
})
