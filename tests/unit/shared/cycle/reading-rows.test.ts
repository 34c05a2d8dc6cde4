/**
 * A prepared history holds its tests as rows of numbers (shared/cycle/reading-rows.ts): each test
 * must read back exactly as the plain test `sanitize` makes of the same input, every measured
 * value in its own place, a value refused left out and reported, and rows read without knowing
 * how many there are (from the database) spread over several arrays.
 */
import { describe, expect, it } from 'vitest'
import { prepareHistory, sanitize } from '../../../../shared/cycle/history'
import type { CycleReading } from '../../../../shared/cycle/types'
import { MEASURED_FIELDS } from '../../../../shared/vocabulary'
import { plainReading } from './plain-history'

const HOUR_MS = 3_600_000
const START_MS = Date.UTC(2026, 0, 5)

/** A test carrying every measured value, each a different number (and one from a form's conversion). */
function everyValue(i: number): CycleReading {
  const reading: CycleReading = { id: `r${String(i).padStart(4, '0')}`, takenAt: new Date(START_MS + i * HOUR_MS).toISOString(), enteredAt: new Date(START_MS + i * HOUR_MS + 60_000).toISOString() }
  MEASURED_FIELDS.forEach((key, k) => {
    reading[key] = k + 1 + i / 1000 + 0.1 * 3
  })
  return reading
}

describe('a prepared history\'s tests held as rows of numbers', () => {
  it('read back every measured value in its own place, as the plain test does', () => {
    const readings = Array.from({ length: 5 }, (_, i) => everyValue(i))
    const held = prepareHistory(readings, [])
    expect(held.readings.map(plainReading)).toEqual(readings.map(r => plainReading(sanitize(r, Date.parse(r.takenAt)).reading)))
    for (const key of MEASURED_FIELDS) expect(held.readings[2]![key]).toBe(sanitize(readings[2]!, Date.parse(readings[2]!.takenAt)).reading[key])
  })

  it('leave out a value not given or refused, and say which tests lost one', () => {
    const readings: CycleReading[] = [
      { id: 'a', takenAt: new Date(START_MS).toISOString(), ammoniaN: -1, pH: 8.1, temperatureC: -0.5 },
      { id: 'b', takenAt: new Date(START_MS + HOUR_MS).toISOString(), nitriteN: Number.NaN, salinity: 34 },
      { id: 'c', takenAt: new Date(START_MS + 2 * HOUR_MS).toISOString(), calciumMgL: 420 },
    ]
    const held = prepareHistory(readings, [])
    expect(held.readings.map(plainReading)).toEqual([
      { id: 'a', t: START_MS, entered: Number.NEGATIVE_INFINITY, pH: 8.1, temperatureC: -0.5 },
      { id: 'b', t: START_MS + HOUR_MS, entered: Number.NEGATIVE_INFINITY, salinity: 34 },
      { id: 'c', t: START_MS + 2 * HOUR_MS, entered: Number.NEGATIVE_INFINITY, calciumMgL: 420 },
    ])
    expect(held.readings[0]!.ammoniaN).toBeUndefined()
    expect(held.readings[1]!.nitriteN).toBeUndefined()
    expect(held.repaired.map(r => r.id)).toEqual(['a', 'b'])
  })

  it('are the same when read without knowing how many, over several arrays', () => {
    // More tests than the first array holds (64 rows) and than the next two together.
    const readings = Array.from({ length: 500 }, (_, i) => everyValue(499 - i))
    function* oneAtATime(): Generator<CycleReading> {
      yield* readings
    }
    const streamed = prepareHistory(oneAtATime(), [])
    expect(streamed.readings.map(plainReading)).toEqual(prepareHistory(readings, []).readings.map(plainReading))
    expect(streamed.readings.map(plainReading)).toEqual(readings.map(r => plainReading(sanitize(r, Date.parse(r.takenAt)).reading)).reverse())
  })
})
