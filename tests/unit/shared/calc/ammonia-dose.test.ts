import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  MOLAR_MASS_NH4CL,
  ammoniaFromN,
  ammoniaStockDose,
  ammoniaToN,
  ammoniumChlorideGrams,
  stockMgPerLFromPercent,
} from '../../../../shared/calc/ammonia-dose'
import type { AmmoniaBasis } from '../../../../shared/vocabulary'

const FC = { seed: 4, numRuns: 200 }

describe('ammonia stock dose', () => {
  it('NH4Cl molar mass 53.4912 g/mol from IUPAC 1996 atomic weights (computed)', () => {
    expect(MOLAR_MASS_NH4CL).toBeCloseTo(53.4912, 9)
  })

  it('2 mg/L N in 100 L from solid NH4Cl is 0.764 g (computed: 200 mg N x 53.4912 / 14.00674)', () => {
    expect(ammoniumChlorideGrams(100, 2, 'N')).toBeCloseTo(0.2 * 53.4912 / 14.00674, 9)
    expect(Math.abs(ammoniumChlorideGrams(100, 2, 'N') - 0.7638)).toBeLessThan(0.00005)
    expect(ammoniumChlorideGrams(100, 2, 'N', 3)).toBe(0)
  })

  it('kit basis matters: 2 ppm "as NH3" is 1.645 mg/L N', () => {
    // IUPAC 1996 factor 0.8224 (reference.md §3); tolerance 0.0005 for the printed figure
    expect(Math.abs(ammoniaToN(2, 'NH3') - 1.645)).toBeLessThan(0.0005)
    expect(ammoniaFromN(ammoniaToN(2, 'NH4'), 'NH4')).toBeCloseTo(2, 12)
  })

  it('10 % w/w stock at density 0.96 kg/L is 96 000 mg/L (unit arithmetic)', () => {
    expect(stockMgPerLFromPercent(10, 0.96)).toBeCloseTo(96000, 6)
  })

  it('100 L to 2 mg/L N from a 10 000 mg/L NH3 stock takes 24.3 mL', () => {
    const r = ammoniaStockDose({ tankVolumeL: 100, target: 2, basis: 'N', stockMgPerL: 10000, stockBasis: 'NH3' })
    expect(r.doseMl).toBeCloseTo((100 * 2) / (10000 * (14.00674 / 17.03056) - 2) * 1000, 9)
    expect(Math.abs(r.doseMl - 24.32)).toBeLessThan(0.01)
  })

  it('nothing to add when already at or above target', () => {
    expect(ammoniaStockDose({ tankVolumeL: 100, target: 1, current: 1.5, basis: 'N', stockMgPerL: 1000, stockBasis: 'N' }).doseMl).toBe(0)
  })

  it('property: the dose, mixed in, lands on the target (volume added included)', () => {
    const basis = fc.constantFrom<AmmoniaBasis>('N', 'NH3', 'NH4')
    fc.assert(fc.property(
      fc.double({ min: 5, max: 5000, noNaN: true }),
      fc.double({ min: 0.1, max: 5, noNaN: true }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      fc.double({ min: 100, max: 100000, noNaN: true }),
      basis, basis,
      (v, target, currentShare, stock, b, sb) => {
        const current = target * currentShare
        const r = ammoniaStockDose({ tankVolumeL: v, target, current, basis: b, stockMgPerL: stock, stockBasis: sb })
        const doseL = r.doseMl / 1000
        const after = (r.currentN * v + ammoniaToN(stock, sb) * doseL) / (v + doseL)
        return Math.abs(after - r.targetN) < 1e-9 * Math.max(1, r.targetN)
      },
    ), FC)
  })

  it('rejects a stock weaker than the target and bad volumes', () => {
    expect(() => ammoniaStockDose({ tankVolumeL: 100, target: 2, basis: 'N', stockMgPerL: 1.5, stockBasis: 'N' })).toThrow(/stockMgPerL/)
    expect(() => ammoniaStockDose({ tankVolumeL: 0, target: 2, basis: 'N', stockMgPerL: 1000, stockBasis: 'N' })).toThrow(/tankVolumeL/)
    expect(() => ammoniaStockDose({ tankVolumeL: 100, target: -2, basis: 'N', stockMgPerL: 1000, stockBasis: 'N' })).toThrow(/value/)
    expect(() => stockMgPerLFromPercent(120)).toThrow(/percentWw/)
  })
})
