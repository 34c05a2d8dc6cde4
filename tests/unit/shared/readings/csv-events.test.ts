import { describe, expect, it } from 'vitest'
import { arrayRowToEntry, columnIndexes, CSV_TIME_FORMATS_MESSAGE, EXPORT_MAPPING, guessMapping, parseCsvTime, rowToEntry } from '../../../../shared/readings/csv'
import { toCanonicalEvent } from '../../../../shared/readings/events'

const options = { basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' } as const, temperatureUnit: 'F' as const, salinityMode: 'practical' as const }

describe('CSV mapping', () => {
  it('guesses columns from common header names and lets explicit choices win', () => {
    const headers = ['Date', 'NH3', 'Nitrite', 'NO3', 'pH', 'Temp', 'Salinity', 'Comment']
    expect(guessMapping(headers)).toEqual({ takenAt: 'Date', ammonia: 'NH3', nitrite: 'Nitrite', nitrate: 'NO3', pH: 'pH', temperature: 'Temp', salinity: 'Salinity', notes: 'Comment' })
    const chosen = guessMapping(headers, { ammonia: 'Nitrite' })
    expect(chosen.ammonia).toBe('Nitrite')
    expect(chosen.nitrite).toBeUndefined()
  })

  it('recognises Tidewright\'s own export header', () => {
    expect(guessMapping(Object.values(EXPORT_MAPPING) as string[])).toEqual(EXPORT_MAPPING)
  })

  it('reads a row by header or by position the same way', () => {
    const headers = ['Date', 'NH3', 'Temp']
    const mapping = guessMapping(headers)
    const byName = rowToEntry({ Date: '2026-05-01 08:30', NH3: '0.5', Temp: '77' }, mapping, options)
    const byIndex = arrayRowToEntry(['2026-05-01 08:30', '0.5', '77'], columnIndexes(headers, mapping), options)
    expect(byName).toEqual(byIndex)
    expect(byName).toMatchObject({ entry: { takenAt: '2026-05-01T08:30:00.000Z', ammonia: 0.5, temperature: 77, temperatureUnit: 'F' } })
  })

  it('reports cells that are not numbers or times', () => {
    const result = rowToEntry({ Date: 'last week', NH3: 'lots' }, { takenAt: 'Date', ammonia: 'NH3' }, options)
    expect(result).toEqual({ issues: [{ field: 'takenAt', message: CSV_TIME_FORMATS_MESSAGE }, { field: 'ammonia', message: 'Not a number.' }] })
  })

  it('parses ISO times with offsets and bare dates', () => {
    expect(parseCsvTime('2026-05-01T10:00:00+02:00')).toBe('2026-05-01T08:00:00.000Z')
    expect(parseCsvTime('2026-05-01')).toBe('2026-05-01T12:00:00.000Z')
    expect(parseCsvTime('2026-05-01T08:00:00.000Z')).toBe('2026-05-01T08:00:00.000Z')
    expect(parseCsvTime('')).toBeNull()
  })

  it('reads the documented forms only: a date, a date and time read as UTC, or ISO 8601 with an offset', () => {
    expect(parseCsvTime('2026-05-01 10:00')).toBe('2026-05-01T10:00:00.000Z')
    expect(parseCsvTime(' 2026-05-01T10:00:30 ')).toBe('2026-05-01T10:00:30.000Z')
    expect(parseCsvTime('2026-05-01T10:00:00.5-0330')).toBe('2026-05-01T13:30:00.500Z')
    // Date.parse reads all of these, each as some day: 05/01 is 1 May in the US and 5 January elsewhere.
    for (const text of ['05/01/2026', '01.05.2026 10:00', 'May 1, 2026', '1 May 2026 10:00', 'Fri May 01 2026 10:00:00 GMT+0200', '2026-5-1', '20260501', '2026/05/01', '1777777777', '2026-05-01T10:00:00 GMT', '2026-05-01T24:00', '2026-05-01T10:60', '2026-05-01T10:00+15:00']) {
      expect(parseCsvTime(text), text).toBeNull()
    }
  })

  it('stores a row\'s time as parseCsvTime writes it, whatever form the cell is in', () => {
    const cells = ['2026-03-10T08:30:00.000Z', ' 2026-03-10T08:30:00.000Z ', '2026-03-10T08:30:00.5Z', '2026-03-10T08:30:00.500+00:00', '2026-03-10', '0150-06-01T10:00:00.000Z',
      // Date.UTC reads years 0 to 99 as 1900 to 1999.
      '0050-01-01T00:00:00.000Z', '0000-01-01T00:00:00.000Z']
    for (const cell of cells) {
      const result = arrayRowToEntry([cell, '0.5'], { takenAt: 0, ammonia: 1 }, options)
      expect('entry' in result && result.entry.takenAt, cell).toBe(parseCsvTime(cell))
    }
    expect(parseCsvTime('0050-01-01T00:00:00.000Z')).toBe('1950-01-01T00:00:00.000Z')
  })

  it('says which forms it reads when a row\'s date is in another', () => {
    const result = rowToEntry({ Date: '05/01/2026', NH3: '0.25' }, { takenAt: 'Date', ammonia: 'NH3' }, options)
    expect(result).toEqual({ issues: [{ field: 'takenAt', message: CSV_TIME_FORMATS_MESSAGE }] })
    expect(CSV_TIME_FORMATS_MESSAGE).toContain('2026-03-14 08:30')
  })
})

describe('toCanonicalEvent', () => {
  const now = new Date('2026-06-01T12:00:00Z')
  const at = '2026-06-01T10:00:00Z'

  it('stores an ammonia dose as N from the kit basis (0.8224 for NH3, IUPAC 1996)', () => {
    const result = toCanonicalEvent({ at, kind: 'ammonia-dose', amount: 2, doseBasis: 'NH3', volumeUnit: 'L' }, now)
    expect(result.ok && result.event.amount).toBeCloseTo(2 * 0.8224, 3)
  })

  it('stores a water change in litres (US gallon = 3.785411784 L exactly)', () => {
    const result = toCanonicalEvent({ at, kind: 'water-change', amount: 5, doseBasis: 'N', volumeUnit: 'usgal' }, now)
    expect(result.ok && result.event.amount).toBeCloseTo(18.92705892, 8)
  })

  it('needs a group and a whole count for livestock, and text for a note', () => {
    const fish = toCanonicalEvent({ at, kind: 'livestock-added', amount: 2.5, doseBasis: 'N', volumeUnit: 'L' }, now)
    expect(fish.ok ? [] : fish.issues.map(i => i.field).sort()).toEqual(['amount', 'group'])
    const note = toCanonicalEvent({ at, kind: 'note', doseBasis: 'N', volumeUnit: 'L', notes: '  ' }, now)
    expect(note.ok).toBe(false)
  })

  it('refuses the future beyond clock skew', () => {
    const result = toCanonicalEvent({ at: '2026-06-01T13:00:00Z', kind: 'bacteria-dose', doseBasis: 'N', volumeUnit: 'L' }, now)
    expect(result.ok ? '' : result.issues[0]!.field).toBe('at')
  })
})
