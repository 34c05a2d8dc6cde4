import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { SAND_BED_DEPTH_RANGE_CM, sandBulkDensity, substrateAmount } from '../../../../shared/calc/substrate'
import { inchesToCm } from '../../../../shared/units'

const FC = { seed: 11, numRuns: 200 }

describe('sand bed', () => {
  it('aragonite (2.93 g/cm3) at 40-50 % porosity is 1.47-1.76 g/cm3 (reference.md §7, computed; porosity from memory)', () => {
    // tolerance 0.005: printed to two decimals
    expect(Math.abs(sandBulkDensity(2.93, 0.5) - 1.47)).toBeLessThan(0.005)
    expect(Math.abs(sandBulkDensity(2.93, 0.4) - 1.76)).toBeLessThan(0.005)
  })

  it('default depth range is 1-2 in, about 25-50 mm (common practice, no published source)', () => {
    // tolerance 0.1 cm: the metric figures in reference.md §9 are rounded
    expect(Math.abs(SAND_BED_DEPTH_RANGE_CM[0] - 2.5)).toBeLessThan(0.1)
    expect(Math.abs(SAND_BED_DEPTH_RANGE_CM[1] - 5)).toBeLessThan(0.1)
    expect(SAND_BED_DEPTH_RANGE_CM[1]).toBeCloseTo(inchesToCm(2), 12)
  })

  it('120 x 50 cm at 4 cm: 24 L, 38.7 kg at the default bulk density, 5 bags of 9.07 kg', () => {
    const r = substrateAmount({ shape: { kind: 'rectangular', lengthCm: 120, widthCm: 50, heightCm: 50 }, depthCm: 4, bagKg: 9.07 })
    expect(r.volumeL).toBeCloseTo(24, 10)
    expect(r.massKg).toBeCloseTo(24 * 2.93 * 0.55, 10)
    expect(r.bags).toBe(5)
    expect(r.depthWithBagsCm).toBeGreaterThan(4)
  })

  it('an exact multiple of the bag does not buy an extra bag', () => {
    const r = substrateAmount({ footprintCm2: 1000, depthCm: 10, bulkDensityGCm3: 1.5, bagKg: 5 })
    expect(r.massKg).toBeCloseTo(15, 10)
    expect(r.bags).toBe(3)
  })

  it('property: whole bags cover the mass, one bag fewer would not', () => {
    fc.assert(fc.property(
      fc.double({ min: 100, max: 50000, noNaN: true }),
      fc.double({ min: 0.5, max: 15, noNaN: true }),
      fc.double({ min: 1, max: 25, noNaN: true }),
      (area, depth, bag) => {
        const r = substrateAmount({ footprintCm2: area, depthCm: depth, bagKg: bag })
        return r.bags * bag >= r.massKg - 1e-9 && (r.bags - 1) * bag < r.massKg && r.depthWithBagsCm >= depth - 1e-9
      },
    ), FC)
  })

  it('rejects missing footprint and bad values', () => {
    expect(() => substrateAmount({ depthCm: 4, bagKg: 10 })).toThrow(/footprintCm2/)
    expect(() => substrateAmount({ footprintCm2: 100, depthCm: -1, bagKg: 10 })).toThrow(/depthCm/)
    expect(() => substrateAmount({ footprintCm2: 100, depthCm: 4, bagKg: 0 })).toThrow(/bagKg/)
    expect(() => sandBulkDensity(2.93, 1)).toThrow(/porosity/)
  })
})
