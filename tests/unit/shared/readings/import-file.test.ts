import { describe, expect, it } from 'vitest'
import { csvDataRows, importFileProblem, NOT_CSV_MESSAGE } from '../../../../shared/readings/import-file'
import { importTooLargeMessage, MAX_IMPORT_ROWS } from '../../../../shared/readings/limits'

describe('the CSV import file check', () => {
  it('counts data rows as the importer reads them: header, blank lines and quoted line breaks aside', () => {
    expect(csvDataRows('Date,NH3\n2026-03-14,0.5\n2026-03-15,0.25\n')).toBe(2)
    expect(csvDataRows('Date,NH3\r\n2026-03-14,0.5\r\n\r\n  \r\n,,\r\n2026-03-15,0.25')).toBe(2)
    expect(csvDataRows('Date,Notes\n2026-03-14,"skimmer ""wet""\nthen dry"\n')).toBe(1)
    expect(csvDataRows('')).toBe(0)
    expect(csvDataRows('Date,NH3\n')).toBe(0)
  })

  it('refuses a picture, a binary file named .csv and a file past the row cap, with the server\'s words for the cap', () => {
    expect(importFileProblem({ name: 'tests.csv', type: 'text/csv' }, 'Date,NH3\n2026-03-14,0.5\n')).toBeNull()
    expect(importFileProblem({ name: 'export', type: '' }, 'Date,NH3\n')).toBeNull()
    expect(importFileProblem({ name: 'strip.png', type: 'image/png' }, '\u0089PNG')).toBe(NOT_CSV_MESSAGE)
    expect(importFileProblem({ name: 'tests.csv', type: 'text/csv' }, 'PK\u0003\u0004\u0000\u0000')).toBe(NOT_CSV_MESSAGE)
    const rows = (n: number) => `Date,NH3\n${'2026-03-14,0.5\n'.repeat(n)}`
    expect(importFileProblem({ name: 'tests.csv' }, rows(MAX_IMPORT_ROWS))).toBeNull()
    expect(importFileProblem({ name: 'tests.csv' }, rows(MAX_IMPORT_ROWS + 1))).toBe(importTooLargeMessage())
  })
})
