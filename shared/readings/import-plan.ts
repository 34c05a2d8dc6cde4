/**
 * The CSV import's pure half: parse the file, map its columns, convert every row with the
 * entry rules of the form, key each row by its content, and hold each day of the tank to
 * its cap. No database and no framework: it runs in the import worker
 * (server/workers/reading-import.ts), off the request loop, and in unit tests.
 */
import { hash } from 'node:crypto'
import Papa from 'papaparse'
import type { ReadingImportInput } from '../schemas/reading'
import type { ImportPreview, ImportRowError } from '../types/readings'
import { MEASURED_FIELDS, type MeasuredField } from '../vocabulary'
import { arrayRowToEntry, columnIndexes, csvNumberText, duplicateHeaderColumns, guessMapping, importBasis } from './csv'
import { toCanonicalReading, type CanonicalReading, type CanonicalValues, type KitBasisChoice } from './entry'
import { dayFullRowMessage, MAX_IMPORT_ROWS, TESTS_PER_TANK_PER_DAY } from './limits'

/** At most this many row errors are reported; the count is always complete. */
const MAX_REPORTED_ERRORS = 200
const PREVIEW_ROWS = 20

const FIELD_COUNT = MEASURED_FIELDS.length
/** Each measured field's column in a row of ImportRows' values (read once per value written, so not searched each time). */
const FIELD_INDEX = Object.fromEntries(MEASURED_FIELDS.map((field, f) => [field, f])) as Record<MeasuredField, number>

/**
 * The rows to write, held in columns (strings in arrays, numbers in one Float64Array) rather
 * than as an object per row: 100,000 rows then take tens of MB instead of hundreds, and the
 * garbage collector has little to walk.
 */
export class ImportRows {
  /** The file's row number (the header is row 1). */
  readonly line: number[] = []
  readonly takenAt: string[] = []
  readonly key: string[] = []
  readonly notes: (string | null)[] = []
  /** What was typed, as stored in readings.entered (JSON). */
  readonly entered: string[] = []
  private values = new Float64Array(1024 * FIELD_COUNT)

  get length(): number {
    return this.line.length
  }

  push(line: number, reading: Pick<CanonicalReading, 'takenAt' | 'values' | 'notes' | 'entered'>, key: string): void {
    const i = this.line.length
    if ((i + 1) * FIELD_COUNT > this.values.length) {
      const grown = new Float64Array(this.values.length * 2)
      grown.set(this.values)
      this.values = grown
    }
    for (let f = 0; f < FIELD_COUNT; f++) this.values[i * FIELD_COUNT + f] = reading.values[MEASURED_FIELDS[f]!] ?? Number.NaN
    this.line.push(line)
    this.takenAt.push(reading.takenAt)
    this.key.push(key)
    this.notes.push(reading.notes)
    this.entered.push(JSON.stringify({ ...reading.entered, source: 'csv' }))
  }

  /** Row i's value of a measured field; null when the row left it empty. */
  value(i: number, field: MeasuredField): number | null {
    const v = this.values[i * FIELD_COUNT + FIELD_INDEX[field]]!
    return Number.isNaN(v) ? null : v
  }

  /** The canonical values of row i. */
  valuesOf(i: number): CanonicalValues {
    const values = {} as Record<MeasuredField, number | null>
    for (const field of MEASURED_FIELDS) values[field] = this.value(i, field)
    return values
  }

  /** The rows `keep` says yes to, in order. */
  filter(keep: (i: number) => boolean): ImportRows {
    const kept = new ImportRows()
    for (let i = 0; i < this.length; i++) {
      if (!keep(i)) continue
      const j = kept.length
      kept.line.push(this.line[i]!)
      kept.takenAt.push(this.takenAt[i]!)
      kept.key.push(this.key[i]!)
      kept.notes.push(this.notes[i]!)
      kept.entered.push(this.entered[i]!)
      if ((j + 1) * FIELD_COUNT > kept.values.length) {
        const grown = new Float64Array(kept.values.length * 2)
        grown.set(kept.values)
        kept.values = grown
      }
      kept.values.set(this.values.subarray(i * FIELD_COUNT, (i + 1) * FIELD_COUNT), j * FIELD_COUNT)
    }
    return kept
  }
}

export interface ImportPlan {
  headers: string[]
  mapping: Record<string, string>
  /** The basis every row's nitrogen values were read in. */
  basis: KitBasisChoice
  rowCount: number
  rows: ImportRows
  errors: ImportRowError[]
  errorCount: number
  duplicates: number
}

/** What planning gives: a plan, a file-wide problem (400 with field messages), or a file too long (413). */
export type PlanOutcome
  = | { kind: 'plan', plan: ImportPlan }
    | { kind: 'field-issues', issues: { field: string, message: string }[] }
    | { kind: 'too-many-rows' }

export interface PlanContext {
  /** The tank's remembered kit basis. */
  kit: KitBasisChoice
  /** Rows at or before this instant fall in the signed-off period (-Infinity: none). */
  lockedMs: number
  /** Whether the tank already holds a row with this import key. */
  alreadyImported: (key: string) => boolean
  now: Date
}

/** The import key: a hash of the row's canonical content, so the same test imported twice is one reading. */
export function importKeyOf(reading: CanonicalReading): string {
  let normalised = reading.takenAt
  for (const field of MEASURED_FIELDS) {
    const value = reading.values[field]
    normalised += value === null ? '|' : `|${csvNumberText(value)}`
  }
  normalised += `|${reading.notes ?? ''}`
  return hash('sha256', normalised, 'hex').slice(0, 32)
}

function errorCollector(plan: Pick<ImportPlan, 'errors' | 'errorCount'>) {
  return (row: number, issues: { field: string, message: string }[]) => {
    plan.errorCount++
    for (const issue of issues) if (plan.errors.length < MAX_REPORTED_ERRORS) plan.errors.push({ row, field: issue.field, message: issue.message })
  }
}

/**
 * Parses and converts the whole file; writes nothing. Rows are taken one at a time as the
 * parser reads them (none of the parsed rows are kept), and parsing stops one row past
 * MAX_IMPORT_ROWS: a longer file is refused whole, however long it is.
 */
export function planImport(input: ReadingImportInput, context: PlanContext): PlanOutcome {
  let headers: string[] | null = null
  let refusal: PlanOutcome | null = null
  let plan: ImportPlan | null = null
  let indexes: ReturnType<typeof columnIndexes> | null = null
  let options: Parameters<typeof arrayRowToEntry>[2] | null = null
  let report: ReturnType<typeof errorCollector> = () => {}
  const seen = new Set<string>()
  let index = 0
  Papa.parse<string[]>(input.csv, {
    header: false,
    skipEmptyLines: 'greedy',
    step: (result, parser) => {
      const cells = result.data
      if (!headers) {
        headers = cells.map(h => h.trim())
        const repeats = duplicateHeaderColumns(headers)
        const mapping = guessMapping(headers, input.mapping) as Record<string, string>
        if (repeats.length) {
          refusal = { kind: 'field-issues', issues: [{ field: 'csv', message: `The header row repeats a column name (column ${repeats.join(', ')}), so it is unclear which column holds what. Rename or remove the repeated column and import again.` }] }
        }
        else if (!mapping.takenAt) {
          refusal = { kind: 'field-issues', issues: [{ field: 'mapping.takenAt', message: 'Choose the column that holds the date and time of each test.' }] }
        }
        if (refusal) return parser.abort()
        indexes = columnIndexes(headers, mapping)
        const basis = importBasis(input.basis, mapping, context.kit)
        options = { basis, temperatureUnit: input.temperatureUnit, salinityMode: input.salinityMode, sgBasis: input.sgBasis }
        plan = { headers, mapping, basis, rowCount: 0, rows: new ImportRows(), errors: [], errorCount: 0, duplicates: 0 }
        report = errorCollector(plan)
        return
      }
      const current = plan!
      if (++index > MAX_IMPORT_ROWS) {
        refusal = { kind: 'too-many-rows' }
        return parser.abort()
      }
      current.rowCount = index
      const row = index + 1 // the header is row 1, as a spreadsheet numbers it
      const mapped = arrayRowToEntry(cells, indexes!, options!)
      if ('issues' in mapped) return report(row, mapped.issues)
      const converted = toCanonicalReading(mapped.entry, context.now)
      if (!converted.ok) return report(row, converted.issues)
      // Rows inside a signed-off period would change what the supervisor signed: refused per row.
      if (Date.parse(converted.reading.takenAt) <= context.lockedMs) return report(row, [{ field: 'takenAt', message: 'This test falls in the signed-off period and cannot be imported.' }])
      const key = importKeyOf(converted.reading)
      if (context.alreadyImported(key) || seen.has(key)) {
        current.duplicates++
        return
      }
      seen.add(key)
      current.rows.push(row, converted.reading, key)
    },
  })
  if (refusal) return refusal
  if (!plan) return { kind: 'plan', plan: { headers: [], mapping: {}, basis: importBasis(input.basis, {}, context.kit), rowCount: 0, rows: new ImportRows(), errors: [], errorCount: 0, duplicates: 0 } }
  return { kind: 'plan', plan }
}

/** The calendar day (UTC) a canonical time falls on: its first ten characters. */
export const dayOf = (takenAt: string): string => takenAt.slice(0, 10)

/** The first and last day the plan's rows fall on, or null when it has none. */
export function planDays(plan: ImportPlan): { first: string, last: string } | null {
  if (!plan.rows.length) return null
  let first = dayOf(plan.rows.takenAt[0]!)
  let last = first
  for (const takenAt of plan.rows.takenAt) {
    const day = dayOf(takenAt)
    if (day < first) first = day
    if (day > last) last = day
  }
  return { first, last }
}

/**
 * Holds every day to TESTS_PER_TANK_PER_DAY: `held` is how many current tests the tank
 * holds per day already. Rows past a day's room are moved from `rows` to the errors, in
 * file order, so the file's first rows of a day are the ones kept.
 */
export function capPerDay(plan: ImportPlan, held: ReadonlyMap<string, number>): ImportPlan {
  const counts = new Map(held)
  const capped = { errors: [...plan.errors], errorCount: plan.errorCount }
  const report = errorCollector(capped)
  const keep = new Uint8Array(plan.rows.length)
  let refused = 0
  for (let i = 0; i < plan.rows.length; i++) {
    const day = dayOf(plan.rows.takenAt[i]!)
    const n = counts.get(day) ?? 0
    if (n >= TESTS_PER_TANK_PER_DAY) {
      report(plan.rows.line[i]!, [{ field: 'takenAt', message: dayFullRowMessage(day) }])
      refused++
      continue
    }
    counts.set(day, n + 1)
    keep[i] = 1
  }
  if (refused === 0) return plan
  capped.errors.sort((a, b) => a.row - b.row)
  // A copy only when rows were refused: a file that fits is not held twice.
  return { ...plan, rows: plan.rows.filter(i => keep[i] === 1), ...capped }
}

/** The import route's answer. */
export function toPreview(plan: ImportPlan, dryRun: boolean, inserted: number): ImportPreview {
  return {
    headers: plan.headers,
    mapping: plan.mapping,
    basis: plan.basis,
    rows: plan.rowCount,
    valid: plan.rows.length,
    duplicates: plan.duplicates,
    errorRows: plan.errorCount,
    errors: plan.errors,
    preview: Array.from({ length: Math.min(PREVIEW_ROWS, plan.rows.length) }, (_, i) => ({
      row: plan.rows.line[i]!,
      takenAt: plan.rows.takenAt[i]!,
      ammoniaN: plan.rows.value(i, 'ammoniaN'),
      nitriteN: plan.rows.value(i, 'nitriteN'),
      nitrateN: plan.rows.value(i, 'nitrateN'),
      pH: plan.rows.value(i, 'pH'),
      temperatureC: plan.rows.value(i, 'temperatureC'),
      salinity: plan.rows.value(i, 'salinity'),
    })),
    dryRun,
    inserted,
  }
}
