import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  ATOMIC_WEIGHT_N,
  MOLAR_MASS,
  fromNitrogen,
  nitrogenFraction,
  toNitrogen,
  type NitrogenSpecies,
} from '../../../../shared/chemistry/nitrogen'

const FC = { seed: 1996, numRuns: 300 }
const SPECIES: NitrogenSpecies[] = ['NH3', 'NH4', 'NO2', 'NO3']

describe('ion -> nitrogen factors (IUPAC 1996 atomic weights, Pure Appl. Chem. 68: 2339)', () => {
  // reference.md §3 factors; tolerance 0.00005 because they are printed to four decimals.
  const table: Array<[NitrogenSpecies, number]> = [
    ['NH3', 0.8224],
    ['NH4', 0.7765],
    ['NO2', 0.3045],
    ['NO3', 0.2259],
  ]
  for (const [species, factor] of table) {
    it(`${species} -> ${species}-N x ${factor}`, () => {
      expect(Math.abs(nitrogenFraction(species) - factor)).toBeLessThan(0.00005)
      expect(Math.abs(toNitrogen(10, species) - 10 * factor)).toBeLessThan(0.0005)
    })
  }

  it('molar masses are sums of the atomic weights (computed: NO3- 62.00494 g/mol)', () => {
    // computed regression anchor from 14.00674 + 3 x 15.9994
    expect(MOLAR_MASS.NO3).toBeCloseTo(62.00494, 9)
    expect(MOLAR_MASS.NH4).toBeCloseTo(18.0385, 9)
  })

  it('EPA 1989 saltwater criteria as nitrogen: 0.233 -> 0.1916, 0.035 -> 0.02879 mg NH3-N/L (computed in reference.md)', () => {
    // US EPA 440/5-88-004 gives the NH3 values; the N values are computed anchors, tolerance half the last printed digit.
    expect(Math.abs(toNitrogen(0.233, 'NH3') - 0.1916)).toBeLessThan(0.00005)
    expect(Math.abs(toNitrogen(0.035, 'NH3') - 0.02879)).toBeLessThan(0.000005)
  })

  it('catches the classic mix-up: a nitrate reading as ion is not the same number as nitrogen', () => {
    // 20 mg NO3-N/L (Camargo et al. 2005 limit) is about 88.5 mg/L as nitrate ion.
    expect(fromNitrogen(20, 'NO3')).toBeGreaterThan(88)
    expect(fromNitrogen(20, 'NO3')).toBeLessThan(89)
  })

  it('nitrogen fraction is below 1 and the nitrogen atom weight is N', () => {
    for (const s of SPECIES) expect(nitrogenFraction(s)).toBeLessThan(1)
    expect(ATOMIC_WEIGHT_N).toBe(14.00674)
  })
})

describe('properties', () => {
  const species = fc.constantFrom(...SPECIES)
  it('ion -> N -> ion round trip', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 1e6, noNaN: true }), species, (v, s) => {
      const back = fromNitrogen(toNitrogen(v, s), s)
      return Math.abs(back - v) <= 1e-12 * Math.max(1, v)
    }), FC)
  })

  it('N -> ion -> N round trip and N never exceeds the ion value', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 1e6, noNaN: true }), species, (v, s) => {
      const ion = fromNitrogen(v, s)
      return ion >= v && Math.abs(toNitrogen(ion, s) - v) <= 1e-12 * Math.max(1, v)
    }), FC)
  })

  it('rejects negative or non-finite readings', () => {
    fc.assert(fc.property(fc.double({ max: -1e-9, noNaN: true }), species, (v, s) => {
      expect(() => toNitrogen(v, s)).toThrow(/value/)
      expect(() => fromNitrogen(v, s)).toThrow(/valueN/)
    }), FC)
    expect(() => toNitrogen(Number.NaN, 'NO3')).toThrow(RangeError)
  })
})
