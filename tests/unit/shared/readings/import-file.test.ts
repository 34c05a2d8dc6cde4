import { describe, expect, it } from 'vitest'
import { CsvRowCounter, csvDataRows, importFileProblem, NOT_CSV_MESSAGE } from '../../../../shared/readings/import-file'
import { importTooLargeMessage, MAX_IMPORT_ROWS } from '../../../../shared/readings/limits'

describe('the CSV import file check', () => {
  it('counts data rows as the importer reads them: header, blank lines and quoted line breaks aside', () => {
    expect(csvDataRows('Date,NH3\n2026-03-14,0.5\n2026-03-15,0.25\n')).toBe(2)
    expect(csvDataRows('Date,NH3\r\n2026-03-14,0.5\r\n\r\n  \r\n,,\r\n2026-03-15,0.25')).toBe(2)
    expect(csvDataRows('Date,Notes\n2026-03-14,"skimmer ""wet""\nthen dry"\n')).toBe(1)
    expect(csvDataRows('')).toBe(0)
    expect(csvDataRows('Date,NH3\n')).toBe(0)
  })

  it('counts the same from the file\'s bytes in pieces split anywhere as from its text', () => {
    const text = `Datum;Notiz\r\n${'2026-03-14;"Kalk ""hoch"",\r\nµS 🐠"\r\n\r\n;;\r\n2026-03-15;ok\r\n'.repeat(50)}2026-03-16;last`
    expect(csvDataRows(text)).toBe(101)
    const bytes = new TextEncoder().encode(text)
    for (const size of [1, 2, 3, 5, 64]) {
      const counter = new CsvRowCounter()
      for (let i = 0; i < bytes.length; i += size) counter.add(bytes.subarray(i, i + size))
      expect(counter.dataRows, `pieces of ${size} bytes`).toBe(101)
    }
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
