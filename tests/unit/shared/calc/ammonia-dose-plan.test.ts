import { describe, expect, it } from 'vitest'
import { ammoniumChlorideGrams, ammoniumChlorideStockN, plannedAmmoniaDose } from '../../../../shared/calc/ammonia-dose'

describe('a planned ammonium chloride dose', () => {
  // Molar masses from IUPAC 1996 standard atomic weights (reference.md §3): NH4Cl 53.4912, N 14.00674.
  it('in grams of the dry salt: 100 L to 2 ppm as NH3 is 1.6448 mg/L N, 0.628 g (computed)', () => {
    const dose = plannedAmmoniaDose(100, 2, 0, 'NH3', { kind: 'dry' })
    expect(dose).toEqual({ kind: 'dry', grams: ammoniumChlorideGrams(100, 2, 'NH3') })
    if (dose.kind !== 'dry') throw new Error('dry dose expected')
    expect(Math.abs(dose.grams - 0.6281)).toBeLessThan(0.0005)
  })

  it('from a stock of 100 g per litre: the same salt, so mL times strength gives the same grams', () => {
    expect(ammoniumChlorideStockN(100)).toBeCloseTo((100_000 * 14.00674) / 53.4912, 6)
    const dose = plannedAmmoniaDose(100, 2, 0, 'NH3', { kind: 'stock', gramsPerLitre: 100 })
    if (dose.kind !== 'stock') throw new Error('stock dose expected')
    // The stock also adds its own volume, so slightly more than the dry mass in solution.
    expect((dose.millilitres / 1000) * 100).toBeCloseTo(0.6281, 3)
    expect((dose.millilitres / 1000) * 100).toBeGreaterThan(ammoniumChlorideGrams(100, 2, 'NH3'))
  })

  it('only tops up what the tank does not already read, and scales with the water', () => {
    const half = plannedAmmoniaDose(100, 2, 1, 'NH3', { kind: 'dry' })
    const full = plannedAmmoniaDose(100, 2, 0, 'NH3', { kind: 'dry' })
    const big = plannedAmmoniaDose(400, 2, 0, 'NH3', { kind: 'dry' })
    if (half.kind !== 'dry' || full.kind !== 'dry' || big.kind !== 'dry') throw new Error('dry doses expected')
    expect(half.grams).toBeCloseTo(full.grams / 2, 9)
    expect(big.grams).toBeCloseTo(full.grams * 4, 9)
    expect(plannedAmmoniaDose(100, 2, 2.5, 'NH3', { kind: 'stock', gramsPerLitre: 100 })).toEqual({ kind: 'stock', millilitres: 0 })
    expect(() => ammoniumChlorideStockN(0)).toThrow(RangeError)
  })
})
