import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { DESIGN_LIVE_LOADS, LOAD_CAUTION, filledWeight, type WeightInput } from '../../../../shared/calc/weight'
import { seawaterDensity } from '../../../../shared/chemistry/seawater'
import { STANDARD_GRAVITY, convertLength, kgToPounds, knPerM2ToPsf } from '../../../../shared/units'

const inMm = (inches: number) => convertLength(inches, 'in', 'mm')

const FC = { seed: 301, numRuns: 150 }
const base: WeightInput = {
  shape: { kind: 'rectangular', lengthMm: 1200, widthMm: 500, heightMm: 500 },
  salinity: 35,
  temperatureC: 25,
  shellMaterial: 'glass',
  shellThicknessMm: 10,
}

describe('filled weight', () => {
  it('one US gallon of S 35 sea water at 25 C weighs 8.540 lb (reference.md §7, computed from EOS-80)', () => {
    // tolerance 0.0005 lb: printed to three decimals
    const gallonBox = { kind: 'rectangular', lengthMm: inMm(11), widthMm: inMm(7), heightMm: inMm(3) } as const
    const w = filledWeight({ ...base, shape: gallonBox })
    expect(Math.abs(kgToPounds(w.waterKg) - 8.54)).toBeLessThan(0.0005)
  })

  it('adds water, glass shell, sand and rock', () => {
    const w = filledWeight({ ...base, sandDepthMm: 40, rockKg: 30, otherKg: 20 })
    // glass 2.5 g/cm3 (from memory), bottom 6000 cm2 + walls 340 x 50 cm2, 1 cm thick
    expect(w.shellKg).toBeCloseTo((23000 * 2.5) / 1000, 9)
    expect(w.sandKg).toBeCloseTo((6000 * 4 * 2.93 * 0.55) / 1000, 9)
    expect(w.totalKg).toBeCloseTo(w.waterKg + w.shellKg + w.sandKg + 30 + 20, 9)
    const netL = 300 - 13.2 - 30 / 2.93
    expect(w.waterKg).toBeCloseTo((netL * seawaterDensity(35, 25)) / 1000, 9)
  })

  it('acrylic is lighter than glass at the same thickness', () => {
    expect(filledWeight({ ...base, shellMaterial: 'acrylic' }).shellKg).toBeLessThan(filledWeight(base).shellKg / 2)
  })
})

describe('footprint load compared with IRC Table R301.5', () => {
  it('uses 40 psf for living areas and 30 psf for sleeping rooms (IRC Table R301.5)', () => {
    expect(DESIGN_LIVE_LOADS['living-area'].psf).toBe(40)
    expect(DESIGN_LIVE_LOADS['sleeping-room'].psf).toBe(30)
    expect(filledWeight({ ...base, roomUse: 'sleeping-room' }).designLiveLoadPsf).toBe(30)
  })

  it('offers offices at 50 psf and shops at 75 (upper floors) and 100 (first floor), IBC Table 1607.1, from memory', () => {
    expect(Object.fromEntries(Object.entries(DESIGN_LIVE_LOADS).map(([k, v]) => [k, v.psf]))).toEqual({
      'sleeping-room': 30, 'living-area': 40, 'office': 50, 'retail-upper': 75, 'retail-first': 100,
    })
    expect(DESIGN_LIVE_LOADS.office.code).toMatch(/^IBC Table 1607\.1 \(from memory/)
    const w = filledWeight({ ...base, roomUse: 'retail-first' })
    expect(w.designLiveLoadPsf).toBe(100)
    expect(w.ratioToDesignLiveLoad).toBeCloseTo(filledWeight(base).ratioToDesignLiveLoad * 40 / 100, 12)
  })

  it('load is weight over bearing area, in kN/m2 and psf', () => {
    const w = filledWeight({ ...base, bearingAreaM2: 0.8 })
    expect(w.loadKnPerM2).toBeCloseTo((w.totalKg * STANDARD_GRAVITY) / 0.8 / 1000, 9)
    expect(w.loadPsf).toBeCloseTo(knPerM2ToPsf(w.loadKnPerM2), 9)
    expect(w.ratioToDesignLiveLoad).toBeCloseTo(w.loadPsf / 40, 12)
  })

  it('a full 300 L tank on its own footprint exceeds the 40 psf figure', () => {
    const w = filledWeight(base)
    expect(w.exceedsDesignLiveLoad).toBe(true)
    expect(w.ratioToDesignLiveLoad).toBeGreaterThan(2)
  })

  it('a small tank on a wide stand does not exceed it, and still carries the caution', () => {
    const w = filledWeight({ ...base, shape: { kind: 'cube', sideMm: 300 }, bearingAreaM2: 2 })
    expect(w.exceedsDesignLiveLoad).toBe(false)
    expect(w.caution).toBe(LOAD_CAUTION)
  })

  it('never calls a floor safe, and refers to a licensed structural engineer', () => {
    expect(LOAD_CAUTION).not.toMatch(/\bsafe\b/i)
    expect(LOAD_CAUTION).toMatch(/licensed structural engineer/)
    expect(LOAD_CAUTION).toMatch(/not a structural assessment/)
  })

  it('property: finite and heavier with salinity', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 41, noNaN: true }), fc.double({ min: 15, max: 35, noNaN: true }), (s, t) => {
      const a = filledWeight({ ...base, salinity: s, temperatureC: t })
      const b = filledWeight({ ...base, salinity: s + 1, temperatureC: t })
      return Number.isFinite(a.loadPsf) && b.totalKg > a.totalKg
    }), FC)
  })

  it('rejects bad inputs, naming them', () => {
    expect(() => filledWeight({ ...base, shellThicknessMm: 0 })).toThrow(/shellThicknessMm/)
    expect(() => filledWeight({ ...base, bearingAreaM2: -1 })).toThrow(/bearingAreaM2/)
    expect(() => filledWeight({ ...base, salinity: 60 })).toThrow(/salinity/)
    expect(() => filledWeight({ ...base, otherKg: Number.NaN })).toThrow(/otherKg/)
  })
})
