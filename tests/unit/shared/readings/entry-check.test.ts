/** A reading entry's messages come in one round: type errors and range errors together. */
import { describe, expect, it } from 'vitest'
import { readingEntryIssues } from '../../../../shared/readings/entry-check'

const now = new Date('2026-12-02T12:00:00Z')
const body = (values: Record<string, unknown>) => ({
  takenAt: '2026-12-02T11:00:00.000Z',
  basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' },
  temperatureUnit: 'C',
  salinityMode: 'practical',
  ...values,
})

describe('messages of a reading entry', () => {
  it('a value that is not a number and one out of range are both named at once', () => {
    const issues = readingEntryIssues(body({ pH: 19, temperature: Number.NaN, nitrate: 20 }), now)
    expect(issues).toEqual([
      { field: 'temperature', message: 'Temperature must be a number.' },
      { field: 'pH', message: 'pH must be between 0 and 14.' },
    ])
  })

  it('a date that is not a date and a value out of range are both named', () => {
    const issues = readingEntryIssues(body({ takenAt: 'yesterday', ammonia: -1 }), now)
    expect(issues.map(i => i.field).sort()).toEqual(['ammonia', 'takenAt'])
  })

  it('does not ask for "at least one result" when the only value was refused for its type', () => {
    expect(readingEntryIssues(body({ pH: Number.NaN }), now)).toEqual([{ field: 'pH', message: 'pH must be a number.' }])
  })

  it('an entry the schema accepts gets exactly the canonical checks, and a good one none', () => {
    expect(readingEntryIssues(body({}), now)).toEqual([{ field: 'ammonia', message: 'Enter at least one test result.' }])
    expect(readingEntryIssues(body({ takenAt: '2026-12-09T11:00:00.000Z', pH: 8.1 }), now).map(i => i.field)).toEqual(['takenAt'])
    expect(readingEntryIssues(body({ pH: 8.1, temperature: 25 }), now)).toEqual([])
  })

  it('the form names a conductivity PSS-78 cannot convert beside salinity, with the rest of the entry checked', () => {
    // S 2 and S 42 at 25 C are 3.797 and 62.358 mS/cm (Fofonoff & Millard 1983, UNESCO TP44).
    expect(readingEntryIssues(body({ salinity: 1, salinityMode: 'conductivity', pH: 19 }), now)).toEqual([
      { field: 'salinity', message: 'Conductivity at 25 °C must be between 3.8 and 62.3 mS/cm (practical salinity 2 to 42).' },
      { field: 'pH', message: 'pH must be between 0 and 14.' },
    ])
  })
})
