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
import { MEASURED_FIELDS } from '../vocabulary'
import { arrayRowToEntry, columnIndexes, csvNumber, duplicateHeaderColumns, guessMapping, importBasis } from './csv'
import { toCanonicalReading, type CanonicalReading, type KitBasisChoice } from './entry'
import { dayFullRowMessage, MAX_IMPORT_ROWS, TESTS_PER_TANK_PER_DAY } from './limits'

/** At most this many row errors are reported; the count is always complete. */
const MAX_REPORTED_ERRORS = 200
const PREVIEW_ROWS = 20

export interface ImportRow { row: number, reading: CanonicalReading, key: string }

export interface ImportPlan {
  headers: string[]
  mapping: Record<string, string>
  /** The basis every row's nitrogen values were read in. */
  basis: KitBasisChoice
  rowCount: number
  rows: ImportRow[]
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
    normalised += value === null ? '|' : `|${csvNumber(value)}`
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

/** Parses and converts the whole file; writes nothing. */
export function planImport(input: ReadingImportInput, context: PlanContext): PlanOutcome {
  // Rows as arrays, not objects: several times faster on large files. Parsing stops one
  // row past the cap: a longer file is refused whole, however long it is.
  const parsed = Papa.parse<string[]>(input.csv, { header: false, skipEmptyLines: 'greedy', preview: MAX_IMPORT_ROWS + 2 })
  const headers = (parsed.data.shift() ?? []).map(h => h.trim())
  if (parsed.data.length > MAX_IMPORT_ROWS) return { kind: 'too-many-rows' }
  const repeats = duplicateHeaderColumns(headers)
  if (repeats.length) {
    return { kind: 'field-issues', issues: [{ field: 'csv', message: `The header row repeats a column name (column ${repeats.join(', ')}), so it is unclear which column holds what. Rename or remove the repeated column and import again.` }] }
  }
  const mapping = guessMapping(headers, input.mapping) as Record<string, string>
  const indexes = columnIndexes(headers, mapping)
  if (!mapping.takenAt) return { kind: 'field-issues', issues: [{ field: 'mapping.takenAt', message: 'Choose the column that holds the date and time of each test.' }] }
  const basis = importBasis(input.basis, mapping, context.kit)
  const options = { basis, temperatureUnit: input.temperatureUnit, salinityMode: input.salinityMode, sgBasis: input.sgBasis }
  const plan: ImportPlan = { headers, mapping, basis, rowCount: parsed.data.length, rows: [], errors: [], errorCount: 0, duplicates: 0 }
  const report = errorCollector(plan)
  const seen = new Set<string>()
  parsed.data.forEach((cells, index) => {
    const row = index + 2 // the header is row 1, as a spreadsheet numbers it
    const mapped = arrayRowToEntry(cells, indexes, options)
    if ('issues' in mapped) return report(row, mapped.issues)
    const result = toCanonicalReading(mapped.entry, context.now)
    if (!result.ok) return report(row, result.issues)
    // Rows inside a signed-off period would change what the supervisor signed: refused per row.
    if (Date.parse(result.reading.takenAt) <= context.lockedMs) return report(row, [{ field: 'takenAt', message: 'This test falls in the signed-off period and cannot be imported.' }])
    const key = importKeyOf(result.reading)
    if (context.alreadyImported(key) || seen.has(key)) {
      plan.duplicates++
      return
    }
    seen.add(key)
    plan.rows.push({ row, reading: result.reading, key })
  })
  return { kind: 'plan', plan }
}

/** The calendar day (UTC) a canonical time falls on: its first ten characters. */
export const dayOf = (takenAt: string): string => takenAt.slice(0, 10)

/** The first and last day the plan's rows fall on, or null when it has none. */
export function planDays(plan: ImportPlan): { first: string, last: string } | null {
  if (!plan.rows.length) return null
  let first = dayOf(plan.rows[0]!.reading.takenAt)
  let last = first
  for (const { reading } of plan.rows) {
    const day = dayOf(reading.takenAt)
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
  const kept: ImportRow[] = []
  const capped = { errors: [...plan.errors], errorCount: plan.errorCount }
  const report = errorCollector(capped)
  for (const entry of plan.rows) {
    const day = dayOf(entry.reading.takenAt)
    const n = counts.get(day) ?? 0
    if (n >= TESTS_PER_TANK_PER_DAY) {
      report(entry.row, [{ field: 'takenAt', message: dayFullRowMessage(day) }])
      continue
    }
    counts.set(day, n + 1)
    kept.push(entry)
  }
  capped.errors.sort((a, b) => a.row - b.row)
  return { ...plan, rows: kept, ...capped }
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
    preview: plan.rows.slice(0, PREVIEW_ROWS).map(({ row, reading }) => ({
      row,
      takenAt: reading.takenAt,
      ammoniaN: reading.values.ammoniaN,
      nitriteN: reading.values.nitriteN,
      nitrateN: reading.values.nitrateN,
      pH: reading.values.pH,
      temperatureC: reading.values.temperatureC,
      salinity: reading.values.salinity,
    })),
    dryRun,
    inserted,
  }
}
