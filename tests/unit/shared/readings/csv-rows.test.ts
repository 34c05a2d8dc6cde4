/**
 * The import's parser fed in pieces gives the rows it gives for the whole text, wherever the
 * pieces split it: inside a row, between \r and \n, inside a quoted note that spans lines,
 * and (bytes decoded as a file is read) inside a character of several UTF-8 bytes.
 */
import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { CSV_FIRST_PIECE_CHARS, readCsvRows } from '../../../../shared/readings/csv-rows'

/** The rows Papa Parse gives for the whole text, as the import read them before it was fed in pieces. */
function wholeRows(text: string): string[][] {
  const rows: string[][] = []
  Papa.parse<string[]>(text, { header: false, skipEmptyLines: 'greedy', step: r => void rows.push(r.data) })
  return rows
}

function rowsOf(pieces: Iterable<string>): string[][] {
  const rows: string[][] = []
  readCsvRows(pieces, cells => void rows.push(cells))
  return rows
}

/** `text` in pieces of `size` characters. */
function* inPieces(text: string, size: number): Generator<string> {
  for (let i = 0; i < text.length; i += size) yield text.slice(i, i + size)
}

/** `text` as UTF-8 bytes in pieces of `size` bytes, decoded the way the worker reads a file. */
function* decodedInBytes(text: string, size: number): Generator<string> {
  const bytes = new TextEncoder().encode(text)
  const decoder = new TextDecoder()
  for (let i = 0; i < bytes.length; i += size) yield decoder.decode(bytes.subarray(i, i + size), { stream: true })
  yield decoder.decode()
}

/** A file longer than the first piece, so the pieces after it are parsed one at a time. */
function longFile(newline: string): string {
  const lines = ['takenAt,ammonia,notes']
  for (let i = 0; lines.join(newline).length < 3 * CSV_FIRST_PIECE_CHARS; i++) {
    const at = new Date(Date.UTC(2026, 0, 1) + i * 3_600_000).toISOString()
    // Every seventh note spans lines and holds a quote, a comma and characters of 2 to 4 UTF-8 bytes.
    const note = i % 7 === 0 ? `"Wasserwechsel ""groß"",${newline}Kalk 20 µS — 🐠 ${i}"` : `row ${i} °C`
    lines.push(`${at},${(i % 8) / 4},${note}`)
    if (i % 50 === 0) lines.push('', ' , ,')
  }
  return `${lines.join(newline)}${newline}`
}

describe('the import\'s parser fed in pieces', () => {
  for (const newline of ['\n', '\r\n']) {
    const text = longFile(newline)
    const expected = wholeRows(text)
    const label = newline === '\n' ? 'LF' : 'CRLF'

    it(`gives the whole text's rows for a ${label} file in pieces of any size`, () => {
      expect(expected.length).toBeGreaterThan(1000)
      expect(expected.some(row => row[2]!.includes(newline))).toBe(true)
      expect(rowsOf([text])).toEqual(expected)
      for (const size of [1, 2, 3, 7, 64, 1000, 4096, CSV_FIRST_PIECE_CHARS + 1]) expect(rowsOf(inPieces(text, size)), `pieces of ${size}`).toEqual(expected)
    })

    it(`gives the same rows for a ${label} file read as bytes split inside characters`, () => {
      for (const size of [1, 3, 5, 4093, 65_536]) expect(rowsOf(decodedInBytes(text, size)), `bytes in pieces of ${size}`).toEqual(expected)
    })
  }

  it('splits a piece between \\r and \\n without making an empty cell or row', () => {
    const head = `a,b\r\n${'x,1\r\n'.repeat(CSV_FIRST_PIECE_CHARS / 5)}`
    const text = `${head}last,2\r\nend,3\r\n`
    const cut = text.indexOf('last,2\r') + 'last,2\r'.length
    expect(rowsOf([text.slice(0, cut), text.slice(cut)])).toEqual(wholeRows(text))
    expect(rowsOf([text.slice(0, cut), text.slice(cut)]).at(-2)).toEqual(['last', '2'])
  })

  it('reads a file without a final line ending, and drops a byte-order mark', () => {
    const text = '\uFEFFtakenAt,ammonia\n2026-01-01,0.5\n2026-01-02,0.25'
    expect(rowsOf(inPieces(text, 2))).toEqual([['takenAt', 'ammonia'], ['2026-01-01', '0.5'], ['2026-01-02', '0.25']])
  })

  it('guesses the separator from the first piece: a semicolon file in small pieces', () => {
    const text = `Datum;NH3\n${'2026-01-01;0,5\n'.repeat(10_000)}`
    expect(rowsOf(inPieces(text, 10))).toEqual(wholeRows(text))
    expect(rowsOf(inPieces(text, 10))[1]).toEqual(['2026-01-01', '0,5'])
  })

  it('stops when told, reading no further piece', () => {
    let read = 0
    function* counted() {
      for (const piece of inPieces(longFile('\n'), 1024)) {
        read++
        yield piece
      }
    }
    const rows: string[][] = []
    readCsvRows(counted(), (cells, stop) => {
      rows.push(cells)
      if (rows.length === 3) stop()
    })
    expect(rows).toHaveLength(3)
    expect(read).toBe(CSV_FIRST_PIECE_CHARS / 1024)
  })
})
