import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  CONDUCTIVITY_S35_T15_MS_CM,
  PSS78_SALINITY_RANGE,
  SG_BASES,
  conductivityFromSalinity,
  conductivityRangeMsCm,
  conductivityRatioFromSalinity,
  pureWaterDensity,
  salinityFromConductivity,
  salinityFromConductivityRatio,
  salinityFromSpecificGravity,
  seawaterDensity,
  specificGravity,
  t68FromT90,
  t90FromT68,
} from '../../../../shared/chemistry/seawater'

const FC = { seed: 1983, numRuns: 200 }

describe('PSS-78 (Fofonoff & Millard 1983, UNESCO TP44)', () => {
  // TP44 check values are on IPTS-68, so they are fed through t90FromT68.
  // Tolerance 1e-6: TP44 prints six decimals.
  it('R 1, t68 15, p 0 -> S 35.000000', () => {
    expect(Math.abs(salinityFromConductivityRatio(1, t90FromT68(15), 0) - 35)).toBeLessThan(1e-6)
  })

  it('R 1.2, t68 20, p 2000 dbar -> S 37.245628 (pressure term exercised)', () => {
    expect(Math.abs(salinityFromConductivityRatio(1.2, t90FromT68(20), 2000) - 37.245628)).toBeLessThan(1e-6)
  })

  it('R 0.65, t68 5, p 1500 dbar -> S 27.995347 (TP44 p. 9 check value)', () => {
    expect(Math.abs(salinityFromConductivityRatio(0.65, t90FromT68(5), 1500) - 27.995347)).toBeLessThan(1e-6)
  })

  it('IPTS-68 vs ITS-90: feeding the IPTS-68 check temperature as ITS-90 misses by more than the tolerance', () => {
    // 20 C ITS-90 is 20.0048 C IPTS-68; the 0.0048 K offset moves S by ~0.004, far above 1e-6.
    expect(Math.abs(salinityFromConductivityRatio(1.2, 20, 2000) - 37.245628)).toBeGreaterThan(1e-3)
  })

  it('ignoring the pressure term misses the 2000 dbar check', () => {
    expect(Math.abs(salinityFromConductivityRatio(1.2, t90FromT68(20), 0) - 37.245628)).toBeGreaterThan(0.01)
  })

  it('C(35, 15 C IPTS-68, 0) = 42.914 mS/cm round-trips to S 35 (TP44 standard)', () => {
    expect(Math.abs(salinityFromConductivity(42.914, t90FromT68(15)) - 35)).toBeLessThan(1e-6)
    expect(Math.abs(conductivityFromSalinity(35, t90FromT68(15)) - CONDUCTIVITY_S35_T15_MS_CM)).toBeLessThan(1e-5)
  })

  it('S 35 at 25 C conducts about 53.0 mS/cm (from memory)', () => {
    // tolerance 0.1 mS/cm: recalled value, not confirmed to more digits
    expect(Math.abs(conductivityFromSalinity(35, 25) - 53.0)).toBeLessThan(0.1)
  })

  it('property: conductivity <-> salinity round trip (one atmosphere)', () => {
    fc.assert(fc.property(fc.double({ min: 2, max: 42, noNaN: true }), fc.double({ min: -2, max: 35, noNaN: true }), (s, t) => {
      const back = salinityFromConductivity(conductivityFromSalinity(s, t), t)
      return Math.abs(back - s) < 1e-9
    }), FC)
  })

  it('property: ratio <-> salinity round trip with pressure', () => {
    fc.assert(fc.property(fc.double({ min: 2, max: 42, noNaN: true }), fc.double({ min: -2, max: 35, noNaN: true }), fc.double({ min: 0, max: 10000, noNaN: true }), (s, t, p) => {
      const back = salinityFromConductivityRatio(conductivityRatioFromSalinity(s, t, p), t, p)
      return Math.abs(back - s) < 1e-9
    }), FC)
  })

  it('property: salinity rises with conductivity', () => {
    fc.assert(fc.property(fc.double({ min: 3, max: 40, noNaN: true }), fc.double({ min: -2, max: 35, noNaN: true }), (s, t) => {
      const c = conductivityFromSalinity(s, t)
      return salinityFromConductivity(c * 1.01, t) > s
    }), FC)
  })

  it('conductivityRangeMsCm: the conductivities of S 2 and S 42, what salinityFromConductivity converts and no more', () => {
    fc.assert(fc.property(fc.double({ min: -2, max: 35, noNaN: true }), (t) => {
      const [low, high] = conductivityRangeMsCm(t)
      expect(salinityFromConductivity(low, t)).toBeCloseTo(PSS78_SALINITY_RANGE[0], 9)
      expect(salinityFromConductivity(high, t)).toBeCloseTo(PSS78_SALINITY_RANGE[1], 9)
      expect(() => salinityFromConductivity(low * (1 - 1e-6), t)).toThrow(/outside the PSS-78 range/)
      expect(() => salinityFromConductivity(high * (1 + 1e-6), t)).toThrow(/outside the PSS-78 range/)
    }), FC)
    // The standard sea water of TP44 (42.914 mS/cm at 15 C IPTS-68) lies inside.
    const [low, high] = conductivityRangeMsCm(t90FromT68(15))
    expect(low).toBeLessThan(CONDUCTIVITY_S35_T15_MS_CM)
    expect(high).toBeGreaterThan(CONDUCTIVITY_S35_T15_MS_CM)
    expect(() => conductivityRangeMsCm(36)).toThrow(/temperatureC/)
  })

  it('throws outside the valid range instead of extrapolating', () => {
    expect(() => salinityFromConductivityRatio(1, 36, 0)).toThrow(/temperatureC/)
    expect(() => salinityFromConductivityRatio(1, 15 + 273.15, 0)).toThrow(/temperatureC/) // kelvin fed as Celsius
    expect(() => salinityFromConductivityRatio(1, 15, -1)).toThrow(/pressureDbar/)
    expect(() => salinityFromConductivityRatio(0.01, 15, 0)).toThrow(/outside the PSS-78 range/)
    expect(() => salinityFromConductivityRatio(Number.NaN, 15, 0)).toThrow(/R /)
    expect(() => salinityFromConductivity(-1, 25)).toThrow(/mScm/)
    expect(() => conductivityFromSalinity(1, 25)).toThrow(/salinity/)
    expect(() => conductivityFromSalinity(43, 25)).toThrow(/salinity/)
  })
})

describe('EOS-80 one-atmosphere density (Millero & Poisson 1981, in UNESCO TP44)', () => {
  // TP44 check values, IPTS-68; tolerance 5e-6 kg/m3 because TP44 prints five decimals.
  it('S 35, t68 25 -> 1023.34306 kg/m3', () => {
    expect(Math.abs(seawaterDensity(35, t90FromT68(25)) - 1023.34306)).toBeLessThan(5e-6)
  })

  it('S 0, t68 5 -> 999.96675 kg/m3', () => {
    expect(Math.abs(seawaterDensity(0, t90FromT68(5)) - 999.96675)).toBeLessThan(5e-6)
    expect(Math.abs(pureWaterDensity(t90FromT68(5)) - 999.96675)).toBeLessThan(5e-6)
  })

  // Further one-atmosphere check values of the same table (Millero & Poisson 1981 check values,
  // reprinted in Gill 1982, Atmosphere-Ocean Dynamics, Table A3.1); same five-decimal tolerance.
  it('S 35, t68 5 -> 1027.67547 kg/m3 (Millero & Poisson 1981; Gill 1982 Table A3.1)', () => {
    expect(Math.abs(seawaterDensity(35, t90FromT68(5)) - 1027.67547)).toBeLessThan(5e-6)
  })

  it('S 0, t68 25 -> 997.04796 kg/m3 (Gill 1982 Table A3.1)', () => {
    expect(Math.abs(pureWaterDensity(t90FromT68(25)) - 997.04796)).toBeLessThan(5e-6)
  })

  it('IPTS-68 vs ITS-90: 25 C ITS-90 is 0.0018 kg/m3 lighter than the IPTS-68 check', () => {
    expect(Math.abs(seawaterDensity(35, 25) - 1023.34306)).toBeGreaterThan(1e-3)
  })

  it('pure water is densest near 4 C (physical sanity, SMOW)', () => {
    expect(pureWaterDensity(4)).toBeGreaterThan(pureWaterDensity(3))
    expect(pureWaterDensity(4)).toBeGreaterThan(pureWaterDensity(5))
  })

  it('S 35 at 25 C weighs 8.540 lb per US gallon (reference.md §7, computed from EOS-80)', () => {
    // tolerance 0.0005 lb/gal: printed to three decimals
    const lbPerGal = seawaterDensity(35, 25) * 3.785411784 / 1000 / 0.45359237
    expect(Math.abs(lbPerGal - 8.54)).toBeLessThan(0.0005)
  })

  it('property: density rises with salinity and is finite in range', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 41, noNaN: true }), fc.double({ min: 0.01, max: 1, noNaN: true }), fc.double({ min: -2, max: 40, noNaN: true }), (s, ds, t) => {
      const a = seawaterDensity(s, t)
      const b = seawaterDensity(s + ds, t)
      return Number.isFinite(a) && b > a && a > 990 && b < 1040
    }), FC)
  })

  it('throws outside 0-42 and -2-40 C', () => {
    expect(() => seawaterDensity(-0.1, 25)).toThrow(/salinity/)
    expect(() => seawaterDensity(43, 25)).toThrow(/salinity/)
    expect(() => seawaterDensity(35, 298.15)).toThrow(/temperatureC/)
    expect(() => seawaterDensity(35, Number.POSITIVE_INFINITY)).toThrow(/temperatureC/)
  })
})

describe('specific gravity and its basis', () => {
  it('S 35 at 25/25 C -> SG 1.02637 (reference.md §5, computed)', () => {
    // regression anchor; tolerance 5e-6 for five decimals
    expect(Math.abs(specificGravity(35, 25, 25) - 1.02637)).toBeLessThan(5e-6)
    expect(Math.abs(salinityFromSpecificGravity(1.02637, 25, 25) - 35)).toBeLessThan(0.01)
  })

  it('reef target SG 1.025-1.026 at 25/25 C is about 33-35 (common practice, no published source)', () => {
    const low = salinityFromSpecificGravity(1.025, 25, 25)
    const high = salinityFromSpecificGravity(1.026, 25, 25)
    expect(low).toBeGreaterThan(32.5)
    expect(high).toBeLessThan(35)
  })

  it('ignoring the reference temperature shifts salinity by ~2.7 (reference.md §5)', () => {
    // The same SG 1.025 read on a 77/60 F basis instead of 25/25 C: computed shift 2.67.
    const onBasis = salinityFromSpecificGravity(1.025, SG_BASES['25/25C'].sampleC, SG_BASES['25/25C'].referenceC)
    const other = salinityFromSpecificGravity(1.025, SG_BASES['77/60F'].sampleC, SG_BASES['77/60F'].referenceC)
    expect(other - onBasis).toBeGreaterThan(2.5)
    expect(other - onBasis).toBeLessThan(2.8)
    const sixty = salinityFromSpecificGravity(1.025, SG_BASES['60/60F'].sampleC, SG_BASES['60/60F'].referenceC)
    expect(Math.abs(sixty - onBasis)).toBeGreaterThan(0.3)
  })

  it('property: SG <-> salinity round trip on any basis', () => {
    fc.assert(fc.property(
      fc.double({ min: 0, max: 42, noNaN: true }),
      fc.double({ min: 0, max: 35, noNaN: true }),
      fc.double({ min: 0, max: 35, noNaN: true }),
      (s, sample, ref) => {
        const sg = specificGravity(s, sample, ref)
        if (sg < 1 || sg > 1.04) return true
        return Math.abs(salinityFromSpecificGravity(sg, sample, ref) - s) < 1e-8
      },
    ), FC)
  })

  it('property: converges and is monotone for SG 1.000-1.030 on the 25/25 C and 60/60 F bases', () => {
    fc.assert(fc.property(fc.double({ min: 1.0, max: 1.03, noNaN: true }), fc.double({ min: 0.0001, max: 0.002, noNaN: true }), fc.constantFrom(SG_BASES['25/25C'], SG_BASES['60/60F']), (sg, d, basis) => {
      const a = salinityFromSpecificGravity(sg, basis.sampleC, basis.referenceC)
      const b = salinityFromSpecificGravity(Math.min(1.03, sg + d), basis.sampleC, basis.referenceC)
      return Number.isFinite(a) && b >= a
    }), FC)
  })

  it('throws for readings that imply salinity outside EOS-80, naming sg', () => {
    expect(() => salinityFromSpecificGravity(0.99, 25, 25)).toThrow(/sg/)
    expect(() => salinityFromSpecificGravity(1.04, 25, 25)).toThrow(/outside 0 to 42/)
    expect(() => salinityFromSpecificGravity(1.0, 15, 25)).toThrow(/outside 0 to 42/) // sample colder than reference
    expect(() => salinityFromSpecificGravity(1.025, 25, 77)).toThrow(/referenceC/) // Fahrenheit fed as Celsius
  })

  it('t68 <-> t90 conversion is the 1.00024 factor', () => {
    expect(t68FromT90(25)).toBeCloseTo(25.006, 12)
    fc.assert(fc.property(fc.double({ min: -2, max: 40, noNaN: true }), t => Math.abs(t90FromT68(t68FromT90(t)) - t) < 1e-12), FC)
  })
})
