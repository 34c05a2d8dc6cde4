import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  freeAmmonia,
  freeAmmoniaFraction,
  ionicStrengthFromSalinity,
  pKaAmmonium,
  pKaAmmoniumFreshwater,
} from '../../../../shared/chemistry/ammonia'

const FC = { seed: 20261201, numRuns: 300 }

describe('freshwater NH3 fraction (Emerson et al. 1975)', () => {
  // Emerson, Russo, Lund & Thurston 1975, J. Fish. Res. Board Can. 32: 2379, table values.
  // Tolerance 0.00006 absolute: the table prints four decimals, so +-0.00005 rounding plus float slack.
  const table: Array<[t: number, pH: number, fraction: number]> = [
    [20, 8.0, 0.0381],
    [24, 8.4, 0.1171],
    [10, 7.6, 0.0073],
    [28, 8.2, 0.0998],
  ]
  for (const [t, pH, expected] of table) {
    it(`${t} C, pH ${pH} -> ${expected}`, () => {
      expect(Math.abs(freeAmmoniaFraction({ pH, temperatureC: t, salinity: 0 }) - expected)).toBeLessThan(0.00006)
    })
  }

  it('pKa at 25 C is 9.246 (Emerson 1975 formula; computed regression anchor)', () => {
    // computed: 0.09018 + 2729.92 / 298.15; tolerance 1e-4 for the printed digits
    expect(pKaAmmoniumFreshwater(25)).toBeCloseTo(9.2464, 4)
  })

  it('does not use the 2727.92 misprint', () => {
    // The misprint shifts pKa by 2/T ~ 0.0068 at 20 C, i.e. ~1.5 % relative in the fraction.
    const misprint = 1 / (1 + 10 ** (0.09018 + 2727.92 / 293.15 - 8))
    const ours = freeAmmoniaFraction({ pH: 8, temperatureC: 20, salinity: 0 })
    expect(Math.abs(ours - misprint)).toBeGreaterThan(0.0004)
    expect(Math.abs(ours - 0.0381)).toBeLessThan(0.00006)
  })

  it('treats temperature as Celsius: a kelvin value is rejected, not silently used', () => {
    expect(() => freeAmmoniaFraction({ pH: 8, temperatureC: 293.15, salinity: 0 })).toThrow(RangeError)
    expect(() => freeAmmoniaFraction({ pH: 8, temperatureC: 293.15, salinity: 0 })).toThrow(/temperatureC/)
    // Celsius used where the formula wants kelvin would make pKa ~136; the result must sit near the table instead.
    expect(pKaAmmoniumFreshwater(20)).toBeGreaterThan(9.3)
    expect(pKaAmmoniumFreshwater(20)).toBeLessThan(9.5)
  })
})

describe('seawater NH3 fraction (Emerson 1975 + Khoo, Culberson & Bates 1977, NBS pH)', () => {
  it('formal ionic strength at S 34 is 0.701 (reference.md, from Khoo et al. 1977)', () => {
    // tolerance 0.001: printed to three decimals, and the exact value (0.70150) sits on the rounding edge
    expect(Math.abs(ionicStrengthFromSalinity(34) - 0.701)).toBeLessThan(0.001)
  })

  // Bower & Bidwell 1978, J. Fish. Res. Board Can. 35, % NH3 at S 34.
  // Tolerance 1.5 % relative: the stated agreement of Emerson + Khoo with that table
  // (the table rests on its own pK measurements, not on this formula).
  const table: Array<[t: number, pH: number, percent: number]> = [
    [25, 7.5, 1.39],
    [25, 8.0, 4.28],
    [25, 8.2, 6.61],
    [25, 8.5, 12.40],
    [20, 8.0, 2.98],
  ]
  for (const [t, pH, percent] of table) {
    it(`${t} C, pH ${pH}, S 34 -> ${percent} %`, () => {
      const ours = 100 * freeAmmoniaFraction({ pH, temperatureC: t, salinity: 34 })
      expect(Math.abs(ours - percent) / percent).toBeLessThan(0.015)
    })
  }

  it('salinity lowers the NH3 share against fresh water (ionic-strength term has the right sign)', () => {
    const fresh = freeAmmoniaFraction({ pH: 8, temperatureC: 25, salinity: 0 })
    const sea = freeAmmoniaFraction({ pH: 8, temperatureC: 25, salinity: 35 })
    expect(sea).toBeLessThan(fresh * 0.85)
  })

  it('EPA 1989 chronic 0.035 mg/L NH3 at 25 C, S 35, pH 8.2 is about 0.53 mg/L total ammonia as NH3 (computed in reference.md)', () => {
    // US EPA 440/5-88-004 criterion; the 0.53 is a computed anchor, tolerance 0.01 for its two decimals.
    const f = freeAmmoniaFraction({ pH: 8.2, temperatureC: 25, salinity: 35 })
    expect(Math.abs(0.035 / f - 0.53)).toBeLessThan(0.01)
  })

  it('freeAmmonia scales total ammonia-N by the fraction', () => {
    const conditions = { pH: 8.2, temperatureC: 25, salinity: 34 }
    expect(freeAmmonia(2, conditions)).toBeCloseTo(2 * freeAmmoniaFraction(conditions), 12)
    expect(freeAmmonia(0, conditions)).toBe(0)
  })
})

describe('properties', () => {
  const seaTemp = fc.double({ min: 5, max: 40, noNaN: true })
  const freshTemp = fc.double({ min: 0, max: 50, noNaN: true })
  const pH = fc.double({ min: 0, max: 14, noNaN: true })
  const salinity = fc.double({ min: 0, max: 45, noNaN: true })

  it('fraction stays in [0, 1] and finite across the valid range', () => {
    fc.assert(fc.property(pH, seaTemp, salinity, (p, t, s) => {
      const f = freeAmmoniaFraction({ pH: p, temperatureC: t, salinity: s })
      return Number.isFinite(f) && f >= 0 && f <= 1
    }), FC)
  })

  it('fraction rises with pH', () => {
    fc.assert(fc.property(fc.double({ min: 6, max: 9.5, noNaN: true }), fc.double({ min: 0.01, max: 1, noNaN: true }), seaTemp, salinity, (p, dp, t, s) => {
      return freeAmmoniaFraction({ pH: p + dp, temperatureC: t, salinity: s }) > freeAmmoniaFraction({ pH: p, temperatureC: t, salinity: s })
    }), FC)
  })

  it('fraction rises with temperature (fresh and sea water)', () => {
    fc.assert(fc.property(fc.double({ min: 6, max: 10, noNaN: true }), fc.double({ min: 5, max: 39, noNaN: true }), fc.double({ min: 0.1, max: 1, noNaN: true }), salinity, (p, t, dt, s) => {
      return freeAmmoniaFraction({ pH: p, temperatureC: t + dt, salinity: s }) > freeAmmoniaFraction({ pH: p, temperatureC: t, salinity: s })
    }), FC)
    fc.assert(fc.property(fc.double({ min: 0, max: 49, noNaN: true }), t => pKaAmmoniumFreshwater(t + 1) < pKaAmmoniumFreshwater(t)), FC)
    fc.assert(fc.property(freshTemp, t => Number.isFinite(freeAmmoniaFraction({ pH: 8, temperatureC: t, salinity: 0 }))), FC)
  })

  it('pKa rises with salinity', () => {
    fc.assert(fc.property(seaTemp, fc.double({ min: 0, max: 44, noNaN: true }), (t, s) => pKaAmmonium(t, s + 1) > pKaAmmonium(t, s)), FC)
  })

  it('throws a RangeError naming the parameter outside the valid range', () => {
    fc.assert(fc.property(fc.oneof(fc.double({ min: -1e6, max: -1e-6, noNaN: true }), fc.double({ min: 50.0001, max: 1e6, noNaN: true })), (t) => {
      expect(() => freeAmmoniaFraction({ pH: 8, temperatureC: t, salinity: 0 })).toThrow(/temperatureC/)
    }), FC)
    expect(() => freeAmmoniaFraction({ pH: 8, temperatureC: 3, salinity: 35 })).toThrow(/temperatureC must be .*>= 5/)
    expect(() => freeAmmoniaFraction({ pH: 15, temperatureC: 25, salinity: 35 })).toThrow(/pH/)
    expect(() => freeAmmoniaFraction({ pH: Number.NaN, temperatureC: 25, salinity: 35 })).toThrow(RangeError)
    expect(() => freeAmmoniaFraction({ pH: 8, temperatureC: 25, salinity: -1 })).toThrow(/salinity/)
    expect(() => freeAmmoniaFraction({ pH: 8, temperatureC: 25, salinity: 50 })).toThrow(/salinity/)
    expect(() => freeAmmonia(-0.1, { pH: 8, temperatureC: 25, salinity: 35 })).toThrow(/totalAmmoniaN/)
    expect(() => freeAmmonia(Number.POSITIVE_INFINITY, { pH: 8, temperatureC: 25, salinity: 35 })).toThrow(/totalAmmoniaN/)
  })
})
