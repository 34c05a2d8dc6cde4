import { describe, expect, it } from 'vitest'
import { calendarDateExists, parseDecimal } from '../../../../shared/readings/fields'
import { parseCsvTime } from '../../../../shared/readings/csv'
import { toCanonicalReading } from '../../../../shared/readings/entry'

describe('calendarDateExists', () => {
  it('refuses days a month does not have, leap years included', () => {
    expect(calendarDateExists('2026-02-30T09:00:00Z')).toBe(false)
    expect(calendarDateExists('2026-02-29')).toBe(false)
    expect(calendarDateExists('2028-02-29')).toBe(true)
    expect(calendarDateExists('2026-04-31 10:00')).toBe(false)
    expect(calendarDateExists('2026-13-01')).toBe(false)
    expect(calendarDateExists('2026-00-10')).toBe(false)
    expect(calendarDateExists('2026-12-31T23:59:59Z')).toBe(true)
  })
})

describe('parseDecimal', () => {
  it('reads plain decimals and scientific notation', () => {
    expect(parseDecimal('7')).toBe(7)
    expect(parseDecimal(' -0.25 ')).toBe(-0.25)
    expect(parseDecimal('.5')).toBe(0.5)
    expect(parseDecimal('1e-3')).toBe(0.001)
  })

  it('refuses hex, binary, octal, infinity and blanks, which Number() would accept', () => {
    for (const text of ['0x1', '0b1', '0o7', 'Infinity', '', ' ', '1,5', '1.2.3']) expect(parseDecimal(text), text).toBeNull()
  })
})

describe('one rule for the form and the import', () => {
  it('refuses 2026-02-30 instead of rolling it into March', () => {
    expect(parseCsvTime('2026-02-30 09:00')).toBeNull()
    expect(parseCsvTime('2026-03-02 09:00')).toBe('2026-03-02T09:00:00.000Z')
    const result = toCanonicalReading({ takenAt: '2026-02-30T09:00:00Z', ammonia: 0.5, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperatureUnit: 'C', salinityMode: 'practical' }, new Date('2026-06-01T00:00:00Z'))
    expect(result.ok).toBe(false)
  })

  it('refuses a note longer than the form allows', () => {
    const result = toCanonicalReading({ takenAt: '2026-02-10T09:00:00Z', ammonia: 0.5, notes: 'x'.repeat(2001), basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperatureUnit: 'C', salinityMode: 'practical' }, new Date('2026-06-01T00:00:00Z'))
    expect(result.ok).toBe(false)
    if (!result.ok) expect(result.issues.map(i => i.field)).toContain('notes')
  })
})
