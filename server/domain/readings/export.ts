/**
 * A tank's current readings (as corrected) as CSV text in canonical units (mg/L as N, degrees C,
 * practical salinity), the header naming the units; re-importing the file with its own mapping
 * adds nothing twice. Framework-free: the export route runs it for an ordinary tank, the
 * heavy-work pool for a tank with a long history (100,000 tests took two seconds).
 */
import Papa from 'papaparse'
import { csvNumber, EXPORT_COLUMNS } from '#shared/readings/csv'
import type { Db } from '#server/db/connection'
import { tankReadings } from './current'

export function readingsCsv(db: Db, tankId: string): string {
  const data = tankReadings(db, tankId).map(r => EXPORT_COLUMNS.map(([, key]) => {
    const value = r[key]
    return typeof value === 'number' ? csvNumber(value) : value ?? ''
  }))
  return `${Papa.unparse({ fields: EXPORT_COLUMNS.map(([header]) => header), data }, { newline: '\n', escapeFormulae: true })}\n`
}
