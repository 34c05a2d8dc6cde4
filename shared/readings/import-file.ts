/**
 * What the CSV import form checks in a chosen file before sending it: that it is text in
 * CSV form and holds no more rows than one import takes (MAX_IMPORT_ROWS, the server's own
 * cap and words). The server reads the file again and stays the judge.
 */
import { extensionOf } from '../uploads/files'
import { importTooLargeMessage, MAX_IMPORT_ROWS } from './limits'

/** Names a CSV file may carry: spreadsheets save .csv; some devices' exports say .txt or .tsv. */
const CSV_EXTENSIONS = ['csv', 'txt', 'tsv']

export const NOT_CSV_MESSAGE = 'This is not a CSV file. Choose the .csv file your tests were saved in (a spreadsheet saves one with "Save as CSV").'

const QUOTE = 0x22
const LF = 0x0A
const CR = 0x0D
/** What the importer skips as a line with no content: spaces, tabs, separators and empty quotes. */
const BLANK = new Set([0x20, 0x09, 0x2C, 0x3B, QUOTE])

/**
 * Counts the data rows of CSV text as it arrives (the header row and blank lines not
 * counted), reading quoted cells the way the importer does so a note that spans lines is one
 * row. It takes text or its UTF-8 bytes alike: the characters it looks at are ASCII, and no
 * byte of a longer character looks like one. The form counts a chosen file with it, the
 * import route a file as its bytes arrive, so both refuse one past MAX_IMPORT_ROWS alike.
 */
export class CsvRowCounter {
  private quoted = false
  private blank = true
  private lines = 0

  /** Takes the next piece of the file. */
  add(piece: string | Uint8Array): void {
    if (typeof piece === 'string') {
      for (let i = 0; i < piece.length; i++) this.step(piece.charCodeAt(i))
    }
    else {
      for (let i = 0; i < piece.length; i++) this.step(piece[i]!)
    }
  }

  /** Data rows so far; the last line counts before its line ending arrives. */
  get dataRows(): number {
    return Math.max(0, this.lines + (this.blank ? 0 : 1) - 1)
  }

  private step(c: number): void {
    // A doubled quote inside a quoted cell toggles twice: still quoted, as CSV means it.
    if (c === QUOTE) this.quoted = !this.quoted
    if (!this.quoted && (c === LF || c === CR)) {
      if (!this.blank) this.lines++
      this.blank = true
    }
    else if (!BLANK.has(c)) this.blank = false
  }
}

/** Data rows of CSV text (CsvRowCounter). */
export function csvDataRows(text: string): number {
  const counter = new CsvRowCounter()
  counter.add(text)
  return counter.dataRows
}

/** Why a chosen file cannot be imported, or null: a picture or other non-text file, or one past the row cap. */
export function importFileProblem(file: { name: string, type?: string }, text: string): string | null {
  const ext = extensionOf(file.name)
  const textual = ext ? CSV_EXTENSIONS.includes(ext) : !file.type || file.type.startsWith('text/')
  // A NUL byte never appears in text: a binary file renamed .csv.
  if (!textual || text.includes('\u0000')) return NOT_CSV_MESSAGE
  if (csvDataRows(text) > MAX_IMPORT_ROWS) return importTooLargeMessage()
  return null
}
