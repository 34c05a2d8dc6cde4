/**
 * parseTime remembers the times it has read (every evaluation of a tank reads the same ones
 * again). A remembered answer must be the answer: checked against the rule it implements (ISO
 * 8601 only, a date-time without an offset read as UTC) over random texts, read twice, and past
 * the point where the memory starts afresh.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { parseTime, storedInstantMs, timeReaderFor } from '../../../../shared/cycle/time'

/** The rule parseTime implements, written out here without any memory. */
function expected(text: string): number {
  const match = /^\d{4}-\d{2}-\d{2}(?:T\d{2}:\d{2}(?::\d{2}(?:\.\d{1,9})?)?(Z|[+-]\d{2}:?\d{2})?)?$/.exec(text)
  if (!match) return Number.NaN
  return Date.parse(text.includes('T') && match[1] === undefined ? `${text}Z` : text)
}

const pad = (n: number, width: number) => String(n).padStart(width, '0')
const isoLike = fc.record({
  y: fc.integer({ min: 1990, max: 2100 }), mo: fc.integer({ min: 0, max: 13 }), d: fc.integer({ min: 0, max: 32 }),
  h: fc.integer({ min: 0, max: 25 }), mi: fc.integer({ min: 0, max: 61 }), s: fc.integer({ min: 0, max: 61 }), ms: fc.integer({ min: 0, max: 999 }),
  zone: fc.constantFrom('Z', '', '+02:00', '-0530', '+1', ' UTC'), cut: fc.constantFrom(10, 16, 19, 23, 99),
}).map(({ y, mo, d, h, mi, s, ms, zone, cut }) => `${`${pad(y, 4)}-${pad(mo, 2)}-${pad(d, 2)}T${pad(h, 2)}:${pad(mi, 2)}:${pad(s, 2)}.${pad(ms, 3)}`.slice(0, cut)}${cut === 10 ? '' : zone}`)

describe('parseTime', () => {
  it('answers as the ISO rule does, the first time and every time after', () => {
    fc.assert(fc.property(fc.oneof(isoLike, fc.string()), (text) => {
      const first = parseTime(text)
      expect(first).toEqual(expected(text))
      expect(parseTime(text)).toEqual(first)
    }), { numRuns: 3000, seed: 20261203 })
  })

  it('reads a time in the stored form (as toISOString writes it) as the ISO rule does, at the edges of every field', () => {
    const field = (max: number, width: number) => fc.integer({ min: 0, max }).map(n => pad(n, width))
    const stored = fc.tuple(field(9999, 4), field(13, 2), field(32, 2), field(25, 2), field(61, 2), field(61, 2), field(999, 3), fc.constantFrom('Z', 'z', '+'))
      .map(([y, mo, d, h, mi, s, ms, z]) => `${y}-${mo}-${d}T${h}:${mi}:${s}.${ms}${z}`)
    fc.assert(fc.property(stored, (text) => {
      expect(parseTime(text)).toEqual(expected(text))
    }), { numRuns: 5000, seed: 20261204 })
    for (const text of ['0999-12-31T23:59:59.999Z', '1000-01-01T00:00:00.000Z', '2026-02-28T23:59:59.999Z', '2026-02-29T00:00:00.000Z', '2028-02-29T12:00:00.000Z', '2026-04-31T10:00:00.000Z', '2026-01-01T24:00:00.000Z', '2026-1-01T00:00:00.000Z0', '2026-01-01T00:00:00.0001']) {
      expect(parseTime(text)).toEqual(expected(text))
    }
  })

  it('is what a whole history is read with: parseTime for a short one, the same answers past that', () => {
    expect(timeReaderFor(100)).toBe(parseTime)
    // Ten years of twice-daily tests: their digits are read more quickly than a memory that large.
    expect(timeReaderFor(7_300)).not.toBe(parseTime)
    const long = timeReaderFor(100_000)
    expect(long).not.toBe(parseTime)
    fc.assert(fc.property(fc.oneof(isoLike, fc.string()), (text) => {
      expect(long(text)).toEqual(expected(text))
    }), { numRuns: 3000, seed: 20261205 })
    for (const text of ['0999-12-31T23:59:59.999Z', '2026-02-29T00:00:00.000Z', '2028-02-29T12:00:00.000Z', '2026-01-01T24:00:00.000Z', '2026-03-14T08:00']) {
      expect(long(text)).toEqual(expected(text))
    }
  })

  it('still answers rightly after more times than it remembers', () => {
    const start = Date.parse('2020-01-01T00:00:00.000Z')
    const texts = Array.from({ length: 70_000 }, (_, i) => new Date(start + i * 60_000).toISOString())
    for (const text of texts) expect(parseTime(text)).toBe(Date.parse(text))
    for (const text of texts.slice(0, 100)) expect(parseTime(text)).toBe(Date.parse(text))
    expect(parseTime('2026-03-14T08:00')).toBe(Date.parse('2026-03-14T08:00Z'))
    expect(parseTime('14/03/2026')).toBeNaN()
  })
})

describe('storedInstantMs', () => {
  // A long history's times are read from their digits (timeReaderFor): every time in the stored
  // form must be read there, days 29 to 31 too, and give exactly the instant Date.parse gives.
  it('reads every day that exists, in every month of leap, common and century years, as Date.parse does', () => {
    for (const year of [1000, 1600, 1900, 1970, 1999, 2000, 2024, 2026, 2100, 2400, 9999]) {
      for (let month = 1; month <= 12; month += 1) {
        for (let day = 1; day <= 31; day += 1) {
          const text = `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}T23:59:59.999Z`
          const exists = new Date(Date.UTC(year, month - 1, day)).getUTCDate() === day
          if (exists) expect(storedInstantMs(text)).toBe(Date.parse(text))
          else expect(storedInstantMs(text)).toBeUndefined()
        }
      }
    }
  })

  it('gives Date.parse\'s instant for any time toISOString writes from year 1000 to 9999, and nothing earlier', () => {
    const first = Date.UTC(1000, 0, 1)
    const last = Date.UTC(9999, 11, 31, 23, 59, 59, 999)
    fc.assert(fc.property(fc.integer({ min: first - 86_400_000, max: last }), (ms) => {
      const text = new Date(ms).toISOString()
      expect(storedInstantMs(text)).toBe(ms >= first ? Date.parse(text) : undefined)
    }), { numRuns: 20_000, seed: 20261205 })
  })
})
