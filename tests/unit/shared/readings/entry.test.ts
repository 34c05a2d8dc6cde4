import { describe, expect, it } from 'vitest'
import { t90FromT68, conductivityFromSalinity, specificGravity, PSS78_SALINITY_RANGE, PSS78_TEMPERATURE_RANGE_C, SG_BASES } from '../../../../shared/chemistry/seawater'
import { checkCanonicalReading, enteredJson, enteredRecord, entryFromStored, SG_BASIS_KEYS, toCanonicalReading, type CanonicalValues, type ReadingEntry } from '../../../../shared/readings/entry'
import { PHYSICAL_BOUNDS } from '../../../../shared/vocabulary'

const NOW = new Date('2026-06-01T12:00:00Z')
const base = (over: Partial<ReadingEntry> = {}): ReadingEntry => ({
  takenAt: '2026-06-01T09:00:00Z',
  basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
  temperatureUnit: 'C',
  salinityMode: 'practical',
  ...over,
})
const ok = (entry: ReadingEntry) => {
  const result = toCanonicalReading(entry, NOW)
  if (!result.ok) throw new Error(JSON.stringify(result.issues))
  return result.reading
}
const issues = (entry: ReadingEntry) => {
  const result = toCanonicalReading(entry, NOW)
  if (result.ok) throw new Error('expected a refusal')
  return result.issues
}

describe('toCanonicalReading: nitrogen bases', () => {
  it('converts each kit basis to mg/L as N (IUPAC 1996 atomic weights, reference.md section 3)', () => {
    const r = ok(base({ ammonia: 1, nitrite: 1, nitrate: 10 }))
    expect(r.values.ammoniaN).toBeCloseTo(0.8224, 4)
    expect(r.values.nitriteN).toBeCloseTo(0.3045, 4)
    expect(r.values.nitrateN).toBeCloseTo(2.259, 3)
    const asIon = ok(base({ ammonia: 1, basis: { ammonia: 'NH4', nitrite: 'N', nitrate: 'N' }, nitrite: 0.3, nitrate: 2 }))
    expect(asIon.values.ammoniaN).toBeCloseTo(0.7765, 4)
    expect(asIon.values.nitriteN).toBe(0.3)
    expect(asIon.values.nitrateN).toBe(2)
  })

  it('keeps what was typed with its basis, and round-trips through entryFromStored', () => {
    const entry = base({ ammonia: 0.5, nitrite: 0.25, nitrate: 5, basis: { ammonia: 'NH4', nitrite: 'NO2', nitrate: 'N' } })
    const r = ok(entry)
    expect(r.entered.ammonia).toEqual({ value: 0.5, basis: 'NH4' })
    const back = entryFromStored({ ...r.values, takenAt: r.takenAt, notes: r.notes, entered: r.entered }, { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, 'C')
    expect(back.ammonia).toBe(0.5)
    expect(back.basis).toEqual(entry.basis)
    expect(ok(back).values).toEqual(r.values)
  })

  it('falls back to the tank basis when a stored reading kept nothing typed', () => {
    const back = entryFromStored({ takenAt: '2026-06-01T09:00:00Z', ammoniaN: 0.8224, nitriteN: null, nitrateN: null, pH: null, temperatureC: 25, salinity: 35, alkalinityDkh: null, calciumMgL: null, magnesiumMgL: null, phosphateMgL: null, notes: null, entered: {} }, { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, 'F')
    expect(back.ammonia).toBeCloseTo(1, 3)
    expect(back.temperature).toBeCloseTo(77, 6)
    expect(back.temperatureUnit).toBe('F')
  })
})

describe('toCanonicalReading: temperature and salinity', () => {
  it('stores Fahrenheit as Celsius (F = C x 9/5 + 32)', () => {
    expect(ok(base({ temperature: 77, temperatureUnit: 'F' })).values.temperatureC).toBeCloseTo(25, 10)
    expect(ok(base({ temperature: 25 })).values.temperatureC).toBe(25)
  })

  it('turns specific gravity on each basis back into the salinity it came from', () => {
    for (const key of Object.keys(SG_BASES) as (keyof typeof SG_BASES)[]) {
      const b = SG_BASES[key]
      const sg = specificGravity(35, b.sampleC, b.referenceC)
      const r = ok(base({ salinity: sg, salinityMode: 'sg', sgBasis: key }))
      expect(r.values.salinity, key).toBeCloseTo(35, 6)
      expect(r.entered.salinity).toEqual({ value: sg, as: 'sg', basis: key })
    }
  })

  it('reads SG 1.02637 on 25/25 C as practical salinity 35 (computed, reference.md section 5)', () => {
    expect(ok(base({ salinity: 1.02637, salinityMode: 'sg', sgBasis: '25/25C' })).values.salinity).toBeCloseTo(35, 2)
  })

  it('converts conductivity at the stated sample temperature, 25 C by default', () => {
    const at25 = conductivityFromSalinity(34, 25)
    expect(ok(base({ salinity: at25, salinityMode: 'conductivity' })).values.salinity).toBeCloseTo(34, 6)
    const at20 = conductivityFromSalinity(33, 20)
    expect(ok(base({ salinity: at20, salinityMode: 'conductivity', conductivityTemperatureC: 20 })).values.salinity).toBeCloseTo(33, 6)
  })

  it('reads 42.914 mS/cm at 15 C (IPTS-68) as salinity 35 (Fofonoff & Millard 1983, UNESCO TP44)', () => {
    expect(ok(base({ salinity: 42.914, salinityMode: 'conductivity', conductivityTemperatureC: t90FromT68(15) })).values.salinity).toBeCloseTo(35, 4)
  })
})

describe('toCanonicalReading: conductivity outside the PSS-78 range (Fofonoff & Millard 1983, UNESCO TP44: S 2 to 42, t -2 to 35 C)', () => {
  const conductivity = (salinity: number, over: Partial<ReadingEntry> = {}) => base({ salinity, salinityMode: 'conductivity', ...over })
  const salinityIssue = (entry: ReadingEntry) => {
    const found = issues(entry)
    expect(found.map(i => i.field)).toEqual(['salinity'])
    return found[0]!.message
  }

  it('refuses 1 mS/cm (practical salinity below 2) on the salinity field instead of throwing', () => {
    // S 2 and S 42 at 25 C are 3.797 and 62.358 mS/cm (PSS-78 inverse); the message rounds inward.
    expect(salinityIssue(conductivity(1))).toBe('Conductivity at 25 °C must be between 3.8 and 62.3 mS/cm (practical salinity 2 to 42).')
  })

  it('refuses conductivity above S 42 and far above it, zero, below zero and not a number', () => {
    for (const value of [70, 200, 0, -1, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(salinityIssue(conductivity(value)), String(value)).toMatch(/^Conductivity at 25 °C must be between/)
    }
  })

  it('states the range at the sample temperature given', () => {
    // S 2 and S 42 at 15 C are 3.047 and 50.475 mS/cm (PSS-78 inverse).
    expect(salinityIssue(conductivity(1, { conductivityTemperatureC: 15 }))).toBe('Conductivity at 15 °C must be between 3.1 and 50.4 mS/cm (practical salinity 2 to 42).')
  })

  it('accepts the conductivity of S 2 and S 42 themselves', () => {
    const [low, high] = PSS78_SALINITY_RANGE
    for (const t of [PSS78_TEMPERATURE_RANGE_C[0], 15, 25, PSS78_TEMPERATURE_RANGE_C[1]]) {
      expect(ok(conductivity(conductivityFromSalinity(low, t), { conductivityTemperatureC: t })).values.salinity, `S ${low} at ${t} C`).toBeCloseTo(low, 9)
      expect(ok(conductivity(conductivityFromSalinity(high, t), { conductivityTemperatureC: t })).values.salinity, `S ${high} at ${t} C`).toBeCloseTo(high, 9)
    }
  })

  it('refuses a sample temperature outside -2 to 35 C, or none that is a number, without throwing', () => {
    for (const t of [-3, 36, Number.NaN]) {
      expect(salinityIssue(conductivity(53, { conductivityTemperatureC: t })), String(t)).toBe('Conductivity converts for sample temperatures from -2 to 35 °C.')
    }
  })

  it('never throws: conductivity from -10 to 300 mS/cm at sample temperatures from -2 to 35 C is stored in range or refused', () => {
    for (let t = PSS78_TEMPERATURE_RANGE_C[0]; t <= PSS78_TEMPERATURE_RANGE_C[1]; t += 1) {
      for (let value = -10; value <= 300; value += 0.5) {
        const result = toCanonicalReading(conductivity(value, { conductivityTemperatureC: t }), NOW)
        if (result.ok) {
          expect(result.reading.values.salinity).toBeGreaterThanOrEqual(PSS78_SALINITY_RANGE[0] - 1e-9)
          expect(result.reading.values.salinity).toBeLessThanOrEqual(PSS78_SALINITY_RANGE[1] + 1e-9)
        }
        else {
          expect(result.issues.map(i => i.field)).toEqual(['salinity'])
        }
      }
    }
  })
})

describe('toCanonicalReading: bounds and flags', () => {
  it('refuses values that cannot be real, one message per field', () => {
    const found = issues(base({ ammonia: -1, pH: 15, temperature: 150, temperatureUnit: 'F', salinity: 1.2, salinityMode: 'sg', nitrate: 5000 }))
    expect(found.map(i => i.field).sort()).toEqual(['ammonia', 'nitrate', 'pH', 'salinity', 'temperature'])
    expect(found.find(i => i.field === 'temperature')!.message).toContain('°F')
  })

  it('accepts a possible but alarming value and flags it', () => {
    const r = ok(base({ ammonia: 6, pH: 7.2, temperature: 25 }))
    expect(r.flags.map(f => f.field).sort()).toEqual(['ammonia', 'pH'])
    expect(r.flags.every(f => f.severity === 'danger')).toBe(true)
    expect(ok(base({ ammonia: 0.25, pH: 8.1, temperature: 25.5, salinity: 35 })).flags).toEqual([])
  })

  it('refuses a reading in the future beyond clock skew but accepts a back-dated one', () => {
    expect(issues(base({ ammonia: 0, takenAt: '2026-06-01T12:10:00Z' }))[0]!.field).toBe('takenAt')
    expect(ok(base({ ammonia: 0, takenAt: '2026-06-01T12:03:00Z' })).takenAt).toBe('2026-06-01T12:03:00.000Z')
    expect(ok(base({ ammonia: 0, takenAt: '2026-05-20T08:00:00+02:00' })).takenAt).toBe('2026-05-20T06:00:00.000Z')
  })

  it('refuses an empty test', () => {
    expect(issues(base())[0]!.message).toMatch(/at least one/)
  })
})

describe('enteredJson: the entered record as text', () => {
  it('writes what JSON.stringify writes of the record a reading keeps, for every basis, unit, mode and value', () => {
    const numbers = [null, undefined, 0, -0, 0.25, 1e-7, 8.123456789012, 1300, 2 / 3, 1.5e21, Number.POSITIVE_INFINITY]
    const pick = <T>(list: readonly T[], i: number): T => list[i % list.length]!
    for (let i = 0; i < 3000; i++) {
      const n = (k: number) => pick(numbers, i * 7 + k * 3 + Math.floor(i / 11) * k)
      const entry: ReadingEntry = {
        takenAt: '2026-06-01T09:00:00.000Z',
        ammonia: n(1), nitrite: n(2), nitrate: n(3), pH: n(4),
        basis: { ammonia: pick(['NH3', 'NH4', 'N'] as const, i), nitrite: pick(['NO2', 'N'] as const, i >> 1), nitrate: pick(['NO3', 'N'] as const, i >> 2) },
        temperature: n(5), temperatureUnit: pick(['C', 'F'] as const, i >> 3),
        salinity: n(6), salinityMode: pick(['practical', 'sg', 'conductivity'] as const, i >> 4),
        sgBasis: pick([undefined, ...SG_BASIS_KEYS], i >> 5), conductivityTemperatureC: pick([undefined, null, 18.5], i >> 6),
        alkalinityDkh: n(7), calciumMgL: n(8), magnesiumMgL: n(9), phosphateMgL: n(10),
        notes: pick([null, 'a "quoted" note'], i),
      }
      expect(enteredJson(entry, 'csv')).toBe(JSON.stringify({ ...enteredRecord(entry), source: 'csv' }))
    }
  })
})

describe('checkCanonicalReading: a correction meets the form\'s rules', () => {
  const none: CanonicalValues = { ammoniaN: null, nitriteN: null, nitrateN: null, pH: null, temperatureC: null, salinity: null, alkalinityDkh: null, calciumMgL: null, magnesiumMgL: null, phosphateMgL: null }
  const at = '2026-03-01T09:00:00.000Z'
  const now = new Date('2026-03-02T00:00:00Z')

  it('accepts canonical values at the physical bounds and names the canonical field past them', () => {
    expect(checkCanonicalReading(at, { ...none, ammoniaN: PHYSICAL_BOUNDS.ammoniaN[1], temperatureC: PHYSICAL_BOUNDS.temperatureC[0] }, null, now)).toEqual([])
    expect(checkCanonicalReading(at, { ...none, nitriteN: PHYSICAL_BOUNDS.nitriteN[1] + 1 }, null, now).map(i => i.field)).toEqual(['nitriteN'])
    expect(checkCanonicalReading(at, { ...none, salinity: 43 }, null, now).map(i => i.field)).toEqual(['salinity'])
  })

  it('refuses a reading with no result and no note, and a note longer than the form takes', () => {
    expect(checkCanonicalReading(at, none, null, now)).toHaveLength(1)
    expect(checkCanonicalReading(at, none, 'Kit expired; test repeated tomorrow', now)).toEqual([])
    expect(checkCanonicalReading(at, { ...none, pH: 8.1 }, 'x'.repeat(2001), now).map(i => i.field)).toEqual(['notes'])
  })
})
