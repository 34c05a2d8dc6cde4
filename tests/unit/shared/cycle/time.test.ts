/**
 * parseTime remembers the times it has read (every evaluation of a tank reads the same ones
 * again). A remembered answer must be the answer: checked against the rule it implements (ISO
 * 8601 only, a date-time without an offset read as UTC) over random texts, read twice, and past
 * the point where the memory starts afresh.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { parseTime, timeReaderFor } from '../../../../shared/cycle/time'

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
