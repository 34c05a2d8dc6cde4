/**
 * The CSV import's pure half: parse the file, map its columns, convert every row with the
 * entry rules of the form, key each row by its content, and hold each day of the tank to
 * its cap, handing each row that passes to a sink as soon as it is read (the worker stages
 * it, then writes what it staged in one short transaction). No database and no framework: it runs in the import worker
 * (server/workers/reading-import.ts), off the request loop, and in unit tests.
 */
import { hash } from 'node:crypto'
import type { ReadingImportOptions } from '../schemas/reading'
import type { ImportPreview, ImportRowError } from '../types/readings'
import { MEASURED_FIELDS } from '../vocabulary'
import { columnIndexes, csvNumberText, csvRowReader, duplicateHeaderColumns, guessMapping, importBasis } from './csv'
import { readCsvRows } from './csv-rows'
import { convertEntry, enteredJson, type CanonicalValues, type KitBasisChoice, type ReadingEntry } from './entry'
import { dayFullRowMessage, dayOf, MAX_IMPORT_ROWS, TESTS_PER_TANK_PER_DAY } from './limits'

/** At most this many row errors are reported (the first, in file order); the count is always complete. */
export const MAX_REPORTED_ERRORS = 200
const PREVIEW_ROWS = 20

/**
 * One row that passed every check, as the import writes it: only what is written, so a chunk
 * waiting to be handed on keeps no entry, flags or other garbage of its rows alive.
 */
export interface ImportRow {
  /** The file's row number (the header is row 1). */
  line: number
  takenAt: string
  values: CanonicalValues
  notes: string | null
  /** The import key (importKeyOf). */
  key: string
  /** What was typed, as stored in readings.entered (enteredText). */
  entered: string
}

/**
 * Where the rows that pass go, one at a time and in file order: the worker's staging table,
 * so no row is kept here once it has been handed on.
 */
export interface ImportSink {
  /** Current tests the tank holds on this day (YYYY-MM-DD, UTC) before the import; asked once per day. */
  heldOnDay: (day: string) => number
  /** Takes the row: false when the tank (or the file, earlier) already holds a test with its key. */
  add: (row: ImportRow) => boolean
  /** Whether the tank (or the file, earlier) already holds a test with the row's key, for a row whose day is full. */
  holds: (row: ImportRow) => boolean
}

/** What an import of the whole file came to, without the rows themselves. */
export interface ImportPlan {
  headers: string[]
  mapping: Record<string, string>
  /** The basis every row's nitrogen values were read in. */
  basis: KitBasisChoice
  rowCount: number
  /** Rows taken (written, or on a dry run, that would be). */
  added: number
  errors: ImportRowError[]
  errorCount: number
  duplicates: number
  /** The first rows taken, as they are stored. */
  preview: ImportPreview['preview']
}

/** What an import gives: a plan, a file-wide problem (400 with field messages), or a file too long (413). */
export type PlanOutcome
  = | { kind: 'plan', plan: ImportPlan }
    | { kind: 'field-issues', issues: { field: string, message: string }[] }
    | { kind: 'too-many-rows' }

export interface PlanContext {
  /** The tank's remembered kit basis. */
  kit: KitBasisChoice
  /** Rows at or before this instant fall in the signed-off period (-Infinity: none). */
  lockedMs: number
  now: Date
}

/** The import key: a hash of the row's canonical content, so the same test imported twice is one reading. */
export function importKeyOf(reading: { takenAt: string, values: CanonicalValues, notes: string | null }): string {
  let normalised = reading.takenAt
  for (const field of MEASURED_FIELDS) {
    const value = reading.values[field]
    normalised += value === null ? '|' : `|${csvNumberText(value)}`
  }
  normalised += `|${reading.notes ?? ''}`
  return hash('sha256', normalised, 'hex').slice(0, 32)
}

/** What was typed, as stored in readings.entered (JSON): the entered record, marked as coming from a CSV file. */
export function enteredText(entry: ReadingEntry): string {
  return enteredJson(entry, 'csv')
}

/**
 * Each day's room under TESTS_PER_TANK_PER_DAY: what the tank held (asked once per day, the
 * first time a row falls on it) plus the rows this import has taken on it. One entry per day
 * the file's accepted rows fall on: at most OLDEST_READING_YEARS of days (about 7,300), however
 * long the file.
 */
export class DayRoom {
  private readonly counts = new Map<string, number>()
  constructor(private readonly heldOnDay: (day: string) => number) {}

  /** Whether the day can take one more test. */
  hasRoom(day: string): boolean {
    let n = this.counts.get(day)
    if (n === undefined) {
      n = this.heldOnDay(day)
      this.counts.set(day, n)
    }
    return n < TESTS_PER_TANK_PER_DAY
  }

  /** Counts a test taken on the day (after hasRoom said yes). */
  took(day: string): void {
    this.counts.set(day, this.counts.get(day)! + 1)
  }
}

/**
 * Rows read and checked before they are handed on together. Enough that the sink stores them
 * in a tight loop (each insert between two rows' parsing made the inserts slower); few enough
 * that a chunk dies young. A row makes some 6 KB of short-lived objects; what is alive when V8
 * collects its young generation (every few hundred rows) is copied, and V8 enlarges the young
 * generation each time the copies add up to its size, so the longer the file, the larger it
 * grew (the pool's threads cap it: server/utils/heavy-work.ts). At 1,024 rows chunks were also
 * promoted to the old generation and left there as garbage (+85 MiB for 100,000 rows); at 256,
 * 250-600 KB was alive at each collection; at 64, with the file read 16 KiB at a time
 * (server/workers/file-text.ts), 90-150 KB is, and the CPU time is the same.
 */
export const IMPORT_CHUNK_ROWS = 64

/**
 * Reads the file's text (`text`: its pieces in order, the whole text as one piece or a file
 * read a chunk at a time; readCsvRows) as the parser reads it: each row is mapped, converted with the entry rules of
 * the form (convertEntry), held to the signed-off period and keyed; each chunk of
 * IMPORT_CHUNK_ROWS rows that passed is then held to its days' room and handed to `sink` in
 * file order, and dropped. Nothing else of a row is kept (but the first PREVIEW_ROWS taken and
 * the first MAX_REPORTED_ERRORS errors), so memory does not grow with the file. Errors are
 * reported in file order; within a day the file's first rows are the ones taken. Parsing stops
 * one row past MAX_IMPORT_ROWS: a longer file is refused whole (the caller drops what `sink`
 * took).
 */
export function planImport(text: Iterable<string>, input: ReadingImportOptions, context: PlanContext, sink: ImportSink): PlanOutcome {
  let refusal: PlanOutcome | null = null
  let plan: ImportPlan | null = null
  let readRow: ReturnType<typeof csvRowReader> | null = null
  const room = new DayRoom(sink.heldOnDay)
  let index = 0
  let chunk: ImportRow[] = []
  // This chunk's errors: a day found full at the hand-over may come before a row refused while
  // reading, so they are put in file order before the first MAX_REPORTED_ERRORS are kept.
  let chunkErrors: ImportRowError[] = []
  const report = (row: number, issues: { field: string, message: string }[]) => {
    plan!.errorCount++
    for (const issue of issues) chunkErrors.push({ row, field: issue.field, message: issue.message })
  }
  const handOver = (into: ImportPlan) => {
    for (const row of chunk) take(into, row)
    chunk = []
    if (chunkErrors.length) {
      chunkErrors.sort((a, b) => a.row - b.row)
      for (const error of chunkErrors) if (into.errors.length < MAX_REPORTED_ERRORS) into.errors.push(error)
      chunkErrors = []
    }
  }
  const take = (into: ImportPlan, row: ImportRow) => {
    const day = dayOf(row.takenAt)
    // A test already held takes no room, so a full day still counts it as a duplicate.
    if (!room.hasRoom(day)) {
      if (sink.holds(row)) into.duplicates++
      else report(row.line, [{ field: 'takenAt', message: dayFullRowMessage(day) }])
      return
    }
    if (!sink.add(row)) {
      into.duplicates++
      return
    }
    room.took(day)
    into.added++
    if (into.preview.length < PREVIEW_ROWS) {
      const { values } = row
      into.preview.push({ row: row.line, takenAt: row.takenAt, ammoniaN: values.ammoniaN, nitriteN: values.nitriteN, nitrateN: values.nitrateN, pH: values.pH, temperatureC: values.temperatureC, salinity: values.salinity })
    }
  }
  readCsvRows(text, (cells, stop) => {
    if (!plan) {
      const headers = cells.map(h => h.trim())
      const repeats = duplicateHeaderColumns(headers)
      const mapping = guessMapping(headers, input.mapping) as Record<string, string>
      if (repeats.length) {
        refusal = { kind: 'field-issues', issues: [{ field: 'csv', message: `The header row repeats a column name (column ${repeats.join(', ')}), so it is unclear which column holds what. Rename or remove the repeated column and import again.` }] }
      }
      else if (!mapping.takenAt) {
        refusal = { kind: 'field-issues', issues: [{ field: 'mapping.takenAt', message: 'Choose the column that holds the date and time of each test.' }] }
      }
      if (refusal) return stop()
      const basis = importBasis(input.basis, mapping, context.kit)
      readRow = csvRowReader(columnIndexes(headers, mapping), { basis, temperatureUnit: input.temperatureUnit, salinityMode: input.salinityMode, sgBasis: input.sgBasis })
      plan = { headers, mapping, basis, rowCount: 0, added: 0, errors: [], errorCount: 0, duplicates: 0, preview: [] }
      return
    }
    if (++index > MAX_IMPORT_ROWS) {
      refusal = { kind: 'too-many-rows' }
      return stop()
    }
    plan.rowCount = index
    const line = index + 1 // the header is row 1, as a spreadsheet numbers it
    const mapped = readRow!(cells)
    if ('issues' in mapped) return report(line, mapped.issues)
    const { entry, takenMs } = mapped
    // The entry rules of the form; the import keeps no flags, and writes what was typed as text.
    const reading = convertEntry(entry, context.now, takenMs)
    if (!reading.ok) return report(line, reading.issues)
    // Rows inside a signed-off period would change what the supervisor signed: refused per row.
    if ((takenMs ?? Date.parse(reading.takenAt)) <= context.lockedMs) return report(line, [{ field: 'takenAt', message: 'This test falls in the signed-off period and cannot be imported.' }])
    chunk.push({ line, takenAt: reading.takenAt, values: reading.values, notes: reading.notes, key: importKeyOf(reading), entered: enteredText(entry) })
    if (chunk.length === IMPORT_CHUNK_ROWS) handOver(plan)
  })
  if (refusal) return refusal
  if (!plan) return { kind: 'plan', plan: { headers: [], mapping: {}, basis: importBasis(input.basis, {}, context.kit), rowCount: 0, added: 0, errors: [], errorCount: 0, duplicates: 0, preview: [] } }
  handOver(plan)
  return { kind: 'plan', plan }
}

/** The import route's answer. */
export function toPreview(plan: ImportPlan, dryRun: boolean, inserted: number): ImportPreview {
  return {
    headers: plan.headers,
    mapping: plan.mapping,
    basis: plan.basis,
    rows: plan.rowCount,
    valid: plan.added,
    duplicates: plan.duplicates,
    errorRows: plan.errorCount,
    errors: plan.errors,
    preview: plan.preview,
    dryRun,
    inserted,
  }
}
