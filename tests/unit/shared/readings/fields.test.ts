import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { calendarDateExists, parseDecimal, parseIsoTime } from '../../../../shared/readings/fields'
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

describe('parseIsoTime', () => {
  /** The rule written out from its groups, as parseIsoTime reads every text that is not in the stored form. */
  function byTheRule(text: string): { ms: number, dateOnly: boolean } | null {
    const match = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?(Z|[+-]\d{2}:?\d{2})?)?$/.exec(text.trim())
    if (!match) return null
    const [, year, month, day, hour = '0', minute = '0', second = '0', fraction = '0', offset] = match
    const date = new Date(Date.UTC(Number(year), Number(month) - 1, Number(day)))
    if (Number(month) < 1 || Number(month) > 12 || date.getUTCMonth() !== Number(month) - 1 || date.getUTCDate() !== Number(day)) return null
    if (Number(hour) > 23 || Number(minute) > 59 || Number(second) > 59) return null
    let offsetMinutes = 0
    if (offset && offset !== 'Z') {
      const [hours, minutes] = [Number(offset.slice(1, 3)), Number(offset.slice(-2))]
      if (hours > 14 || minutes > 59) return null
      offsetMinutes = (offset.startsWith('-') ? -1 : 1) * (hours * 60 + minutes)
    }
    const utc = Date.UTC(Number(year), Number(month) - 1, Number(day), Number(hour), Number(minute), Number(second), Math.round(Number(`0.${fraction}`) * 1000))
    return { ms: utc - offsetMinutes * 60_000, dateOnly: match[4] === undefined }
  }

  it('reads a time in the stored form (read from its digits) as the rule does, at the edges of every field', () => {
    const pad = (n: number, width: number) => String(n).padStart(width, '0')
    const field = (max: number, width: number) => fc.integer({ min: 0, max }).map(n => pad(n, width))
    const stored = fc.tuple(field(9999, 4), field(13, 2), field(32, 2), field(25, 2), field(61, 2), field(61, 2), field(999, 3), fc.constantFrom('Z', 'z', '+', ' '))
      .map(([y, mo, d, h, mi, s, ms, z]) => `${y}-${mo}-${d}T${h}:${mi}:${s}.${ms}${z}`)
    fc.assert(fc.property(stored, (text) => {
      expect(parseIsoTime(text)).toEqual(byTheRule(text))
    }), { numRuns: 5000, seed: 20261206 })
    for (const text of ['0999-12-31T23:59:59.999Z', '1000-01-01T00:00:00.000Z', '2026-02-28T23:59:59.999Z', '2026-02-29T00:00:00.000Z', '2028-02-29T12:00:00.000Z', '2026-04-31T10:00:00.000Z', '2026-01-01T24:00:00.000Z', ' 2026-03-14T08:30:00.000Z ']) {
      expect(parseIsoTime(text), text).toEqual(byTheRule(text))
    }
    for (let ms = 0; ms < 1000; ms++) {
      const text = `2026-03-14T08:30:00.${pad(ms, 3)}Z`
      expect(parseIsoTime(text)).toEqual(byTheRule(text))
    }
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
