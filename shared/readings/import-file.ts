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

/**
 * Data rows of CSV text (the header row and blank lines not counted), reading quoted cells
 * the way the importer does so a note that spans lines is one row; counting stops past `stopAfter`.
 */
export function csvDataRows(text: string, stopAfter = MAX_IMPORT_ROWS + 1): number {
  let rows = 0
  let quoted = false
  let blank = true
  for (let i = 0; i < text.length && rows <= stopAfter; i++) {
    const c = text[i]
    // A doubled quote inside a quoted cell toggles twice: still quoted, as CSV means it.
    if (c === '"') quoted = !quoted
    if (!quoted && (c === '\n' || c === '\r')) {
      if (!blank) rows++
      blank = true
    }
    // As the importer skips a line with no content: only spaces, separators and empty quotes.
    else if (!' \t,;"'.includes(c!)) blank = false
  }
  if (!blank) rows++
  return Math.max(0, rows - 1)
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
