/**
 * numberText remembers the texts it has written (a CSV import writes the same few hundred values
 * again and again). A remembered text must be the text: checked against String over random
 * numbers, written twice, past the point where the memory starts afresh, and for 0 and -0 (one
 * key of its memory).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { numberText } from '../../../../shared/readings/number-text'

describe('numberText', () => {
  it('is String(value), the first time and every time after', () => {
    fc.assert(fc.property(fc.oneof(fc.double(), fc.integer(), fc.constantFrom(0.1, 0.25, 8.2, 34.5, 1e21, 1e-7, 5e-324)), (value) => {
      expect(numberText(value)).toBe(String(value))
      expect(numberText(value)).toBe(String(value))
    }), { numRuns: 5000, seed: 20261207 })
  })

  it('writes 0 and -0 alike, and still answers rightly after more numbers than it remembers', () => {
    expect(numberText(-0)).toBe('0')
    expect(numberText(0)).toBe('0')
    const values = Array.from({ length: 10_000 }, (_, i) => i / 100)
    for (const value of values) expect(numberText(value)).toBe(String(value))
    for (const value of values.slice(0, 100)) expect(numberText(value)).toBe(String(value))
  })
})
