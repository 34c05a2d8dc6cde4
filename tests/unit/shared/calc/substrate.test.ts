import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { SAND_BED_DEPTH_RANGE_MM, sandBulkDensity, substrateAmount } from '../../../../shared/calc/substrate'
import { convertLength } from '../../../../shared/units'

const FC = { seed: 11, numRuns: 200 }

describe('sand bed', () => {
  it('aragonite (2.93 g/cm3) at 40-50 % porosity is 1.47-1.76 g/cm3 (reference.md §7, computed; porosity from memory)', () => {
    // tolerance 0.005: printed to two decimals
    expect(Math.abs(sandBulkDensity(2.93, 0.5) - 1.47)).toBeLessThan(0.005)
    expect(Math.abs(sandBulkDensity(2.93, 0.4) - 1.76)).toBeLessThan(0.005)
  })

  it('default depth range is 1-2 in, about 25-50 mm (common practice, no published source)', () => {
    // tolerance 1 mm: the metric figures in reference.md §9 are rounded
    expect(Math.abs(SAND_BED_DEPTH_RANGE_MM[0] - 25)).toBeLessThan(1)
    expect(Math.abs(SAND_BED_DEPTH_RANGE_MM[1] - 50)).toBeLessThan(1)
    expect(SAND_BED_DEPTH_RANGE_MM[1]).toBeCloseTo(convertLength(2, 'in', 'mm'), 12)
  })

  it('1200 x 500 mm at 40 mm: 24 L, 38.7 kg at the default bulk density, 5 bags of 9.07 kg', () => {
    const r = substrateAmount({ shape: { kind: 'rectangular', lengthMm: 1200, widthMm: 500, heightMm: 500 }, depthMm: 40, bagKg: 9.07 })
    expect(r.volumeL).toBeCloseTo(24, 10)
    expect(r.massKg).toBeCloseTo(24 * 2.93 * 0.55, 10)
    expect(r.bags).toBe(5)
    expect(r.depthWithBagsMm).toBeGreaterThan(40)
  })

  it('an exact multiple of the bag does not buy an extra bag', () => {
    const r = substrateAmount({ footprintM2: 0.1, depthMm: 100, bulkDensityGCm3: 1.5, bagKg: 5 })
    expect(r.massKg).toBeCloseTo(15, 10)
    expect(r.bags).toBe(3)
  })

  it('property: whole bags cover the mass, one bag fewer would not', () => {
    fc.assert(fc.property(
      fc.double({ min: 0.01, max: 5, noNaN: true }),
      fc.double({ min: 5, max: 150, noNaN: true }),
      fc.double({ min: 1, max: 25, noNaN: true }),
      (area, depth, bag) => {
        const r = substrateAmount({ footprintM2: area, depthMm: depth, bagKg: bag })
        return r.bags * bag >= r.massKg - 1e-9 && (r.bags - 1) * bag < r.massKg && r.depthWithBagsMm >= depth - 1e-9
      },
    ), FC)
  })

  it('rejects missing footprint and bad values', () => {
    expect(() => substrateAmount({ depthMm: 40, bagKg: 10 })).toThrow(/footprintM2/)
    expect(() => substrateAmount({ footprintM2: 0.1, depthMm: -1, bagKg: 10 })).toThrow(/depthMm/)
    expect(() => substrateAmount({ footprintM2: 0.1, depthMm: 40, bagKg: 0 })).toThrow(/bagKg/)
    expect(() => sandBulkDensity(2.93, 1)).toThrow(/porosity/)
  })
})
