import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { REFERENCE_SALINITY_FACTOR, salinityCorrection, saltForVolume } from '../../../../shared/calc/salt-mix'
import { pureWaterDensity, seawaterDensity } from '../../../../shared/chemistry/seawater'

const FC = { seed: 35, numRuns: 150 }

describe('salt for a batch', () => {
  it('S 35 is 35.16504 g/kg absolute salinity (Millero et al. 2008, reference composition)', () => {
    expect(35 * REFERENCE_SALINITY_FACTOR).toBeCloseTo(35.16504, 10)
  })

  it('100 L of S 35 at 25 C takes 3.599 kg of ideal sea salt (computed regression anchor)', () => {
    // computed: 100 L x 1.0233412 kg/L (EOS-80) x 35.16504 g/kg; tolerance 0.5 g
    const r = saltForVolume({ volumeL: 100, salinity: 35, temperatureC: 25 })
    expect(Math.abs(r.saltKg - 3.5986)).toBeLessThan(0.0005)
  })

  it('salt plus fresh water make the solution mass (mass is conserved)', () => {
    fc.assert(fc.property(fc.double({ min: 1, max: 2000, noNaN: true }), fc.double({ min: 0, max: 42, noNaN: true }), fc.double({ min: 10, max: 30, noNaN: true }), (v, s, t) => {
      const r = saltForVolume({ volumeL: v, salinity: s, temperatureC: t })
      const freshKg = (r.freshWaterL * pureWaterDensity(t)) / 1000
      return Math.abs(freshKg + r.saltKg - r.solutionKg) < 1e-9 * r.solutionKg
    }), FC)
  })

  it('a mix that is 90 % salt by mass needs 1/0.9 as much', () => {
    const ideal = saltForVolume({ volumeL: 100, salinity: 35 }).saltKg
    expect(saltForVolume({ volumeL: 100, salinity: 35, saltPurity: 0.9 }).saltKg).toBeCloseTo(ideal / 0.9, 12)
  })

  it('rejects bad inputs', () => {
    expect(() => saltForVolume({ volumeL: 0, salinity: 35 })).toThrow(/volumeL/)
    expect(() => saltForVolume({ volumeL: 100, salinity: 50 })).toThrow(/salinity/)
    expect(() => saltForVolume({ volumeL: 100, salinity: 35, saltPurity: 1.2 })).toThrow(/saltPurity/)
  })
})

describe('measured -> target correction', () => {
  const t = 25
  const sA = (s: number) => s * REFERENCE_SALINITY_FACTOR

  it('no change when on target', () => {
    expect(salinityCorrection({ volumeL: 100, measured: 35, target: 35 }).direction).toBe('none')
  })

  it('property: lowering with fresh water reaches the target by salt mass balance', () => {
    fc.assert(fc.property(fc.double({ min: 20, max: 35, noNaN: true }), fc.double({ min: 0.1, max: 7, noNaN: true }), (target, excess) => {
      const measured = target + excess
      const r = salinityCorrection({ volumeL: 200, measured, target, temperatureC: t })
      const tankKg = (200 * seawaterDensity(measured, t)) / 1000
      const freshKg = (r.freshWaterToAddL * pureWaterDensity(t)) / 1000
      const after = (tankKg * measured) / (tankKg + freshKg)
      // exchange: salt per litre after swapping matches the target's salt per litre
      const cm = seawaterDensity(measured, t) * measured
      const ct = seawaterDensity(target, t) * target
      const exchanged = (cm * (200 - r.exchangeWithFreshL)) / 200
      return r.direction === 'lower' && Math.abs(after - target) < 1e-9 && Math.abs(exchanged - ct) < 1e-9 * ct && r.exchangeWithFreshL < r.freshWaterToAddL
    }), FC)
  })

  it('property: raising with dry salt or premix reaches the target', () => {
    fc.assert(fc.property(fc.double({ min: 20, max: 34, noNaN: true }), fc.double({ min: 0.1, max: 5, noNaN: true }), (measured, deficit) => {
      const target = measured + deficit
      const mixSalinity = Math.min(42, target + 3)
      const r = salinityCorrection({ volumeL: 200, measured, target, temperatureC: t, mixSalinity })
      const tankKg = (200 * seawaterDensity(measured, t)) / 1000
      const withSalt = (tankKg * sA(measured) / 1000 + r.saltToAddKg) / (tankKg + r.saltToAddKg)
      const mixKg = (r.mixToAddL * seawaterDensity(mixSalinity, t)) / 1000
      const withMix = (tankKg * measured + mixKg * mixSalinity) / (tankKg + mixKg)
      return r.direction === 'raise'
        && Math.abs(withSalt * 1000 - sA(target)) < 1e-9
        && Math.abs(withMix - target) < 1e-9
        && r.exchangeWithMixL > 0 && r.exchangeWithMixL < 200
    }), FC)
  })

  it('without a premix salinity only the dry-salt amount is given', () => {
    const r = salinityCorrection({ volumeL: 100, measured: 32, target: 35 })
    expect(r.saltToAddKg).toBeGreaterThan(0)
    expect(r.mixToAddL).toBe(0)
  })

  it('a premix no saltier than the target cannot raise salinity', () => {
    expect(() => salinityCorrection({ volumeL: 100, measured: 32, target: 35, mixSalinity: 35 })).toThrow(/mixSalinity/)
    expect(() => salinityCorrection({ volumeL: 100, measured: 45, target: 35 })).toThrow(/salinity/)
    expect(() => salinityCorrection({ volumeL: 100, measured: 35, target: -1 })).toThrow(/target/)
  })
})
