/**
 * CSV import of readings: parse, map, convert every row with the same entry rules as the
 * form, then write all valid rows in one transaction with one prepared statement. Each row
 * carries a hash of its normalised content (readings.import_key, unique per tank), so
 * importing the same file again adds nothing.
 */
import { hash, randomUUID } from 'node:crypto'
import Papa from 'papaparse'
import type { ReadingImportInput } from '#shared/schemas/reading'
import { arrayRowToEntry, columnIndexes, csvNumber, duplicateHeaderColumns, guessMapping, importBasis } from '#shared/readings/csv'
import { toCanonicalReading, type CanonicalReading, type KitBasisChoice } from '#shared/readings/entry'
import { MEASURED_FIELDS } from '#shared/vocabulary'
import type { ImportPreview, ImportRowError } from '#shared/types/readings'
import type { Actor } from './access'

/** At most this many row errors are reported; the count is always complete. */
const MAX_REPORTED_ERRORS = 200
const PREVIEW_ROWS = 20

export interface ImportPlan {
  headers: string[]
  mapping: Record<string, string>
  /** The basis every row's nitrogen values were read in. */
  basis: KitBasisChoice
  rowCount: number
  rows: { row: number, reading: CanonicalReading, key: string }[]
  errors: ImportRowError[]
  errorCount: number
  duplicates: number
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

/** Parses and converts the whole file without writing anything; `kit` is the tank's remembered kit basis. */
export function planImport(tankId: string, input: ReadingImportInput, kit: KitBasisChoice): ImportPlan {
  // Rows as arrays, not objects: several times faster on large files.
  const parsed = Papa.parse<string[]>(input.csv, { header: false, skipEmptyLines: 'greedy' })
  const headers = (parsed.data.shift() ?? []).map(h => h.trim())
  const repeats = duplicateHeaderColumns(headers)
  if (repeats.length) {
    fieldError([{ field: 'csv', message: `The header row repeats a column name (column ${repeats.join(', ')}), so it is unclear which column holds what. Rename or remove the repeated column and import again.` }])
  }
  const mapping = guessMapping(headers, input.mapping) as Record<string, string>
  const indexes = columnIndexes(headers, mapping)
  if (!mapping.takenAt) {
    fieldError([{ field: 'mapping.takenAt', message: 'Choose the column that holds the date and time of each test.' }])
  }
  const existing = new Set<string>(
    (useDB().$client.prepare('SELECT import_key FROM readings WHERE tank_id = ? AND import_key IS NOT NULL').pluck().all(tankId) as string[]),
  )
  const now = new Date()
  // Rows inside a signed-off period would change what the supervisor signed: refused per row.
  const locked = tankLockedUntil(tankId)
  const lockedMs = locked ? Date.parse(locked) : Number.NEGATIVE_INFINITY
  const basis = importBasis(input.basis, mapping, kit)
  const options = { basis, temperatureUnit: input.temperatureUnit, salinityMode: input.salinityMode, sgBasis: input.sgBasis }
  const rows: ImportPlan['rows'] = []
  const errors: ImportRowError[] = []
  let errorCount = 0
  let duplicates = 0
  const seen = new Set<string>()
  const report = (row: number, issues: { field: string, message: string }[]) => {
    errorCount++
    for (const issue of issues) if (errors.length < MAX_REPORTED_ERRORS) errors.push({ row, field: issue.field, message: issue.message })
  }
  parsed.data.forEach((cells, index) => {
    const row = index + 2 // the header is row 1, as a spreadsheet numbers it
    const mapped = arrayRowToEntry(cells, indexes, options)
    if ('issues' in mapped) return report(row, mapped.issues)
    const result = toCanonicalReading(mapped.entry, now)
    if (!result.ok) return report(row, result.issues)
    if (Date.parse(result.reading.takenAt) <= lockedMs) return report(row, [{ field: 'takenAt', message: 'This test falls in the signed-off period and cannot be imported.' }])
    const key = importKeyOf(result.reading)
    if (existing.has(key) || seen.has(key)) { duplicates++; return }
    seen.add(key)
    rows.push({ row, reading: result.reading, key })
  })
  return { headers, mapping, basis, rowCount: parsed.data.length, rows, errors, errorCount, duplicates }
}

const INSERT_SQL = `INSERT INTO readings (id, tank_id, taken_at, entered_by, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity,
  alkalinity_dkh, calcium_mg_l, magnesium_mg_l, phosphate_mg_l, notes, entered, import_key, created_at, updated_at)
  VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)
  ON CONFLICT (tank_id, import_key) DO NOTHING`

/** Writes the planned rows in one transaction; returns how many were new. */
export function writeImport(tankId: string, actor: Actor, plan: ImportPlan): number {
  const sqlite = useDB().$client
  const insert = sqlite.prepare(INSERT_SQL)
  const stamp = new Date().toISOString()
  return sqlite.transaction(() => {
    let inserted = 0
    for (const { reading, key } of plan.rows) {
      const v = reading.values
      inserted += insert.run(randomUUID(), tankId, reading.takenAt, actor.id, v.ammoniaN, v.nitriteN, v.nitrateN, v.pH, v.temperatureC, v.salinity,
        v.alkalinityDkh, v.calciumMgL, v.magnesiumMgL, v.phosphateMgL, reading.notes, JSON.stringify({ ...reading.entered, source: 'csv' }), key, stamp, stamp).changes
    }
    // Same connection, same transaction: the rows and their audit line commit together or not at all.
    writeAudit(actor, { action: 'reading.import', entity: 'tank', entityId: tankId, after: { rows: plan.rowCount, inserted, skipped: plan.rowCount - inserted, errors: plan.errors.length } })
    return inserted
  })()
}

/** The answer of the import route. */
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
