/**
 * The CSV import's one parser, fed its text in pieces: the whole text as one piece (a file
 * sent as JSON) or a file read a chunk at a time (a file sent as it is, kept in a temporary
 * file), with the same rows either way. Papa Parse reads the rows; this drives its parser the
 * way its own stream readers do, synchronously: each piece is parsed together with the
 * unfinished row the last one ended in, and only that row is kept between pieces, so memory
 * stays flat however long the file. No framework, no Node: the worker and unit tests use it.
 */
import Papa from 'papaparse'

/**
 * Text read before the first rows are parsed: the parser guesses the line ending and the
 * separator from the text it is first given, so it is given as much as a whole small file.
 */
export const CSV_FIRST_PIECE_CHARS = 64 * 1024

/** Called with each row's cells in file order (rows of nothing but blanks are skipped); `stop()` ends the reading. */
export type CsvRowHandler = (cells: string[], stop: () => void) => void

/**
 * Reads CSV text from `pieces` in order and hands `onRow` each row; stops early when
 * `onRow` calls `stop()`. A row, a line ending (\r\n) or a quoted cell (a note spanning
 * lines) may be split anywhere between pieces.
 */
export function readCsvRows(pieces: Iterable<string>, onRow: CsvRowHandler): void {
  let stopped = false
  const handle = new (Papa as unknown as PapaWithHandle).ParserHandle({
    header: false,
    skipEmptyLines: 'greedy',
    step: (result, parser) => {
      onRow(result.data, () => {
        stopped = true
        parser.abort()
      })
    },
  })
  // `pending`: the start of the text not yet parsed (the unfinished last row); `offset`, where it begins in the file.
  let pending = ''
  let offset = 0
  let first = true
  const parse = (last: boolean) => {
    const results = handle.parse(pending, offset, !last)
    if (stopped || handle.aborted()) {
      stopped = true
      return
    }
    if (last) {
      pending = ''
      return
    }
    const cursor = results.meta.cursor
    pending = pending.slice(cursor - offset)
    offset = cursor
  }
  for (const piece of pieces) {
    pending += first && pending === '' ? withoutBom(piece) : piece
    if (first) {
      if (pending.length < CSV_FIRST_PIECE_CHARS) continue
      first = false
    }
    parse(false)
    if (stopped) return
  }
  if (pending !== '') parse(true)
}

/** A byte-order mark opens some spreadsheets' files; Papa Parse drops it from a whole string too. */
function withoutBom(text: string): string {
  return text.charCodeAt(0) === 0xFEFF ? text.slice(1) : text
}

/** The part of Papa Parse's ParserHandle (exported, not in its types) its own stream readers use. */
interface PapaHandle {
  parse: (input: string, baseIndex: number, ignoreLastRow: boolean) => { meta: { cursor: number } }
  aborted: () => boolean
}
interface PapaWithHandle {
  ParserHandle: new (config: Papa.ParseConfig<string[]> & { step: (result: Papa.ParseStepResult<string[]>, parser: Papa.Parser) => void }) => PapaHandle
}
