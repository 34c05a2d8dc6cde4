/**
 * CSV rows to reading entries: guessing which column holds what, and turning one row
 * into the same entry the form sends, so imported rows pass the same bounds and flags.
 */
import type { ImportTarget, ReadingImportOptions } from '../schemas/reading'
import { IMPORT_TARGETS } from '../schemas/reading'
import type { EntryIssue, KitBasisChoice, ReadingEntry } from './entry'
import { calendarDateExists, parseDecimal, parseIsoTime, STORED_TIME } from './fields'
import { numberText } from './number-text'
import { INPUT_FIELDS, type NitrogenInputField } from '../vocabulary'

/** Header words each target is recognised by (lower case, punctuation removed). */
const HEADER_HINTS: Record<ImportTarget, string[]> = {
  takenAt: ['takenat', 'taken', 'date', 'datetime', 'time', 'when', 'timestamp'],
  ammonia: ['ammoniamgln', 'ammonian', 'ammonia', 'nh3', 'nh4', 'tan', 'totalammonia'],
  nitrite: ['nitritemgln', 'nitriten', 'nitrite', 'no2'],
  nitrate: ['nitratemgln', 'nitraten', 'nitrate', 'no3'],
  pH: ['ph'],
  temperature: ['temperaturec', 'temperaturef', 'temperature', 'temp', 'tempc', 'tempf'],
  salinity: ['salinitypractical', 'salinity', 'sal', 'sg', 'specificgravity', 'conductivity'],
  alkalinityDkh: ['alkalinitydkh', 'alkalinity', 'alk', 'dkh', 'kh'],
  calciumMgL: ['calciummgl', 'calcium', 'ca'],
  magnesiumMgL: ['magnesiummgl', 'magnesium', 'mg'],
  phosphateMgL: ['phosphatemgl', 'phosphate', 'po4'],
  notes: ['notes', 'note', 'comment', 'comments'],
}

const normalise = (header: string) => header.toLowerCase().replace(/[^a-z0-9]/g, '')

/**
 * Columns whose header repeats an earlier one (ignoring case and spaces), as 1-based column
 * numbers: such a file is ambiguous and is refused whole.
 */
export function duplicateHeaderColumns(headers: readonly string[]): number[] {
  const seen = new Set<string>()
  const repeats: number[] = []
  headers.forEach((header, index) => {
    const key = header.trim().toLowerCase()
    if (!key) return
    if (seen.has(key)) repeats.push(index + 1)
    seen.add(key)
  })
  return repeats
}

/** Which header holds each target, from the header names alone; explicit choices win. */
export function guessMapping(headers: readonly string[], chosen: Partial<Record<ImportTarget, string>> = {}): Partial<Record<ImportTarget, string>> {
  const mapping: Partial<Record<ImportTarget, string>> = {}
  const used = new Set<string>()
  for (const target of IMPORT_TARGETS) {
    const explicit = chosen[target]
    if (explicit !== undefined && headers.includes(explicit)) {
      mapping[target] = explicit
      used.add(explicit)
    }
  }
  for (const target of IMPORT_TARGETS) {
    if (chosen[target] !== undefined) continue
    const hints = HEADER_HINTS[target]
    const match = headers.find(h => !used.has(h) && hints.includes(normalise(h)))
    if (match !== undefined) {
      mapping[target] = match
      used.add(match)
    }
  }
  return mapping
}

/** What a row whose date cell is in another form is told. */
export const CSV_TIME_FORMATS_MESSAGE = 'Write the date as 2026-03-14 (read as noon UTC), 2026-03-14 08:30 (UTC) or ISO 8601 with an offset, such as 2026-03-14T08:30:00+01:00.'

/**
 * A date-time cell in one of the documented forms (see parseIsoTime): ISO 8601, or
 * "YYYY-MM-DD HH:MM[:SS]" read as UTC; a date alone is noon UTC, so the day is the same
 * for any time zone within 12 hours. The instant in epoch ms, or null for anything else.
 */
export function readCsvTime(cell: string): number | null {
  const parsed = parseIsoTime(cell)
  if (!parsed) return null
  return parsed.dateOnly ? parsed.ms + 12 * 3_600_000 : parsed.ms
}

/** readCsvTime as the stored text ("2026-03-14T12:00:00.000Z"), or null. */
export function parseCsvTime(cell: string): string | null {
  const ms = readCsvTime(cell)
  return ms === null ? null : new Date(ms).toISOString()
}

/** How each row is read; the basis is settled before the rows are (see importBasis). */
type Options = Pick<ReadingImportOptions, 'temperatureUnit' | 'salinityMode' | 'sgBasis'> & { basis: KitBasisChoice }

const NUMERIC = INPUT_FIELDS satisfies readonly ImportTarget[]

/**
 * A row read as the entry the form sends, and the instant its time names (the entry's
 * takenAt, read once: convertEntry and the import take it as it is). takenMs is left
 * out for a time past year 9999 or before year 0, whose stored text is not ISO 8601's
 * four-digit form: the entry rules read that text again, and refuse it.
 */
export type CsvRowResult = { entry: ReadingEntry, takenMs?: number } | { issues: EntryIssue[] }

/** One CSV row (header -> cell) as a reading entry, or the messages for the cells that are not numbers or times. */
export function rowToEntry(row: Record<string, string | undefined>, mapping: Partial<Record<ImportTarget, string>>, options: Options): CsvRowResult {
  const headers = Object.keys(row)
  return arrayRowToEntry(headers.map(h => row[h] ?? ''), columnIndexes(headers, mapping), options)
}

/** Column positions of each mapped target, for rows parsed as arrays (the fast path for large files). */
export function columnIndexes(headers: readonly string[], mapping: Partial<Record<ImportTarget, string>>): Partial<Record<ImportTarget, number>> {
  const out: Partial<Record<ImportTarget, number>> = {}
  for (const [target, header] of Object.entries(mapping) as [ImportTarget, string][]) {
    const index = headers.indexOf(header)
    if (index >= 0) out[target] = index
  }
  return out
}

/** One CSV row parsed as an array of cells, with the column positions from columnIndexes. */
export function arrayRowToEntry(cells: readonly string[], indexes: Partial<Record<ImportTarget, number>>, options: Options): CsvRowResult {
  return csvRowReader(indexes, options)(cells)
}

/**
 * arrayRowToEntry for every row of one file: the column positions and options are settled
 * once, and a row costs its cells alone (an import reads 100,000).
 */
export function csvRowReader(indexes: Partial<Record<ImportTarget, number>>, options: Options): (cells: readonly string[]) => CsvRowResult {
  // -1: a target no column holds, read as an empty cell.
  const timeAt = indexes.takenAt ?? -1
  const notesAt = indexes.notes ?? -1
  const numberAt = NUMERIC.map(target => indexes[target] ?? -1)
  const { basis, temperatureUnit, salinityMode, sgBasis } = options
  return (cells) => {
    let issues: EntryIssue[] | null = null
    const time = timeAt < 0 ? '' : (cells[timeAt] ?? '')
    const takenMs = readCsvTime(time)
    if (takenMs === null) issues = [{ field: 'takenAt', message: calendarDateExists(time) ? CSV_TIME_FORMATS_MESSAGE : 'That date does not exist. Check the day and the month.' }]
    const numbers: (number | null)[] = []
    for (let i = 0; i < NUMERIC.length; i++) {
      const at = numberAt[i]!
      const text = at < 0 ? '' : (cells[at] ?? '').trim()
      const value = text ? parseDecimal(text) : null
      if (text && value === null) (issues ??= []).push({ field: NUMERIC[i]!, message: 'Not a number.' })
      numbers.push(value)
    }
    if (issues) return { issues }
    const notes = notesAt < 0 ? '' : (cells[notesAt] ?? '').trim()
    // The cell itself when it is the stored text already (Tidewright's export, most devices):
    // no Date to format per row. Not for years 0 to 99, which Date.UTC reads as 1900 to 1999.
    const takenAt = STORED_TIME.test(time) && !time.startsWith('00') ? time : new Date(takenMs!).toISOString()
    const entry: ReadingEntry = {
      takenAt,
      ammonia: numbers[0],
      nitrite: numbers[1],
      nitrate: numbers[2],
      basis,
      pH: numbers[3],
      temperature: numbers[4],
      temperatureUnit,
      salinity: numbers[5],
      salinityMode,
      sgBasis,
      alkalinityDkh: numbers[6],
      calciumMgL: numbers[7],
      magnesiumMgL: numbers[8],
      phosphateMgL: numbers[9],
      notes: notes || null,
    }
    // ISO 8601's four-digit years only (see CsvRowResult).
    return takenAt.length === 24 ? { entry, takenMs: takenMs! } : { entry }
  }
}

/** Export column order; the header names say the canonical unit. */
/**
 * Significant digits a measured value keeps in an export and in the import key: beyond any
 * instrument, yet free of float noise from unit conversions, so an exported file reads as
 * numbers and imports back as the same tests.
 */
export const CSV_SIGNIFICANT_DIGITS = 9

/** A measured value as the export writes it and the import key compares it. */
export function csvNumber(value: number): number {
  return Number(value.toPrecision(CSV_SIGNIFICANT_DIGITS))
}

/**
 * csvNumber(value) as text, as the import key writes it. A number whose shortest text has at
 * most nine characters (and no exponent) has at most nine significant digits, so csvNumber
 * leaves it as it is and its text is the answer: the usual case, without the three
 * conversions (a CSV import keys 100,000 rows).
 */
export function csvNumberText(value: number): string {
  const text = numberText(value)
  return text.length <= CSV_SIGNIFICANT_DIGITS && !text.includes('e') ? text : String(csvNumber(value))
}

export const EXPORT_COLUMNS = [
  ['taken_at', 'takenAt'],
  ['ammonia_mg_l_n', 'ammoniaN'],
  ['nitrite_mg_l_n', 'nitriteN'],
  ['nitrate_mg_l_n', 'nitrateN'],
  ['ph', 'pH'],
  ['temperature_c', 'temperatureC'],
  ['salinity_practical', 'salinity'],
  ['alkalinity_dkh', 'alkalinityDkh'],
  ['calcium_mg_l', 'calciumMgL'],
  ['magnesium_mg_l', 'magnesiumMgL'],
  ['phosphate_mg_l', 'phosphateMgL'],
  ['notes', 'notes'],
] as const

/** The mapping for a file Tidewright exported itself: canonical units, basis N, C, practical salinity. */
export const EXPORT_MAPPING: Partial<Record<ImportTarget, string>> = {
  takenAt: 'taken_at',
  ammonia: 'ammonia_mg_l_n',
  nitrite: 'nitrite_mg_l_n',
  nitrate: 'nitrate_mg_l_n',
  pH: 'ph',
  temperature: 'temperature_c',
  salinity: 'salinity_practical',
  alkalinityDkh: 'alkalinity_dkh',
  calciumMgL: 'calcium_mg_l',
  magnesiumMgL: 'magnesium_mg_l',
  phosphateMgL: 'phosphate_mg_l',
  notes: 'notes',
}

/**
 * The basis an import reads nitrogen values in: the one chosen, if any; otherwise, per test,
 * as N when its column is Tidewright's own export (the header says mg/L as N), else the
 * tank's remembered kit basis, as the entry form would default it.
 */
export function importBasis(chosen: KitBasisChoice | undefined, mapping: Partial<Record<ImportTarget, string>>, kit: KitBasisChoice): KitBasisChoice {
  if (chosen) return { ...chosen }
  const fromFile = (target: NitrogenInputField) => mapping[target] !== undefined && mapping[target] === EXPORT_MAPPING[target]
  return {
    ammonia: fromFile('ammonia') ? 'N' : kit.ammonia,
    nitrite: fromFile('nitrite') ? 'N' : kit.nitrite,
    nitrate: fromFile('nitrate') ? 'N' : kit.nitrate,
  }
}
