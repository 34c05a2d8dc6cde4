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

/** What each ASCII character is to the count: content (0), blank (1: spaces, tabs, separators, as the importer skips a line of only these and empty quotes), a quote (2) or a line ending (3). */
const CHARACTER_KIND = new Uint8Array(128)
for (const c of ' \t,;') CHARACTER_KIND[c.charCodeAt(0)] = 1
CHARACTER_KIND[0x22] = 2
CHARACTER_KIND[0x0A] = 3
CHARACTER_KIND[0x0D] = 3

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
    let { quoted, blank, lines } = this
    const text = typeof piece === 'string'
    for (let i = 0; i < piece.length; i++) {
      const c = text ? piece.charCodeAt(i) : piece[i]!
      const kind = c < 128 ? CHARACTER_KIND[c] : 0
      if (kind === 0) blank = false
      // A doubled quote inside a quoted cell toggles twice: still quoted, as CSV means it.
      else if (kind === 2) quoted = !quoted
      else if (kind === 3 && !quoted) {
        if (!blank) lines++
        blank = true
      }
    }
    this.quoted = quoted
    this.blank = blank
    this.lines = lines
  }

  /** Data rows so far; the last line counts before its line ending arrives. */
  get dataRows(): number {
    return Math.max(0, this.lines + (this.blank ? 0 : 1) - 1)
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
