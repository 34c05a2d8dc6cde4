import { describe, expect, it } from 'vitest'
import { DEFAULT_THRESHOLDS, resolveThresholds } from '../../../../shared/cycle/thresholds'

describe('DEFAULT_THRESHOLDS', () => {
  it('expresses the 0.5 ppm-as-NH3 action level as N', () => {
    // 0.5 ppm is trade practice (common practice, no published source); NH3 -> NH3-N factor 0.8224
    // from IUPAC atomic weights (Pure Appl. Chem. 68: 2339, 1996; reference.md section 3).
    expect(DEFAULT_THRESHOLDS.ammoniaActionN).toBeCloseTo(0.5 * 0.8224, 4)
  })

  it('expresses the EPA saltwater criteria as NH3-N', () => {
    // US EPA (1989) EPA 440/5-88-004: 0.035 and 0.233 mg/L NH3 -> 0.02879 and 0.1916 mg/L NH3-N (computed, reference.md section 2).
    expect(DEFAULT_THRESHOLDS.freeAmmoniaChronicN).toBeCloseTo(0.02879, 5)
    expect(DEFAULT_THRESHOLDS.freeAmmoniaAcuteN).toBeCloseTo(0.1916, 4)
  })

  it('asks a clearance test for about 2 ppm as NH3 and accepts a logged dose from about 1 ppm', () => {
    // Fishless dose of about 1-2 ppm ammonia (reference.md section 9; common practice, no published source).
    expect(DEFAULT_THRESHOLDS.clearanceDoseN).toBeCloseTo(2 * 0.8224, 3)
    expect(DEFAULT_THRESHOLDS.clearanceMinDoseN).toBeCloseTo(0.8224, 3)
  })

  it('is frozen so no caller can change the defaults for everyone', () => {
    expect(Object.isFrozen(DEFAULT_THRESHOLDS)).toBe(true)
  })
})

describe('resolveThresholds', () => {
  it('applies overrides over the defaults and ignores keys it does not know', () => {
    const merged = resolveThresholds({ stableSpanHours: 72, ...({ retired: 5 } as object) })
    expect(merged.stableSpanHours).toBe(72)
    expect(merged.ammoniaZeroN).toBe(DEFAULT_THRESHOLDS.ammoniaZeroN)
    expect('retired' in merged).toBe(false)
  })

  it('rejects a negative or non-finite limit, naming it', () => {
    expect(() => resolveThresholds({ nitriteZeroN: -1 })).toThrow(/nitriteZeroN/)
    expect(() => resolveThresholds({ stallDays: Number.NaN })).toThrow(RangeError)
  })
})
