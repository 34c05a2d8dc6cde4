/**
 * parseTime remembers the times it has read (every evaluation of a tank reads the same ones
 * again). A remembered answer must be the answer: checked against the rule it implements (ISO
 * 8601 only, a date-time without an offset read as UTC) over random texts, read twice, and past
 * the point where the memory starts afresh.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { parseTime } from '../../../../shared/cycle/time'

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

  it('still answers rightly after more times than it remembers', () => {
    const start = Date.parse('2020-01-01T00:00:00.000Z')
    const texts = Array.from({ length: 70_000 }, (_, i) => new Date(start + i * 60_000).toISOString())
    for (const text of texts) expect(parseTime(text)).toBe(Date.parse(text))
    for (const text of texts.slice(0, 100)) expect(parseTime(text)).toBe(Date.parse(text))
    expect(parseTime('2026-03-14T08:00')).toBe(Date.parse('2026-03-14T08:00Z'))
    expect(parseTime('14/03/2026')).toBeNaN()
  })
})
