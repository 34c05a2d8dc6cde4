/**
 * The insert of a new test (the entry form's save), prepared once per handle: building a
 * Drizzle insert and preparing it took as long as the rest of the save's transaction. Every
 * column the save sets is bound, the ones Drizzle would fill itself (id, entered and updated
 * times) included, since a prepared statement would otherwise keep the values of the first
 * call. The row comes back as the plain insert returned it. Framework-free: takes a `Db`.
 */
import { sql } from 'drizzle-orm'
import type { CanonicalReading } from '#shared/readings/entry'
import type { Db } from '#server/db/connection'
import { preparedPerDb } from '#server/db/prepared'
import { readings } from '#server/db/schema'
import { readingColumns } from './columns'

const bound = (name: string) => sql.placeholder(name)

const insertTestStatement = preparedPerDb(db => db.insert(readings).values({
  id: bound('id'),
  tankId: bound('tankId'),
  takenAt: bound('takenAt'),
  enteredBy: bound('enteredBy'),
  ammoniaN: bound('ammoniaN'),
  nitriteN: bound('nitriteN'),
  nitrateN: bound('nitrateN'),
  pH: bound('pH'),
  temperatureC: bound('temperatureC'),
  salinity: bound('salinity'),
  alkalinityDkh: bound('alkalinityDkh'),
  calciumMgL: bound('calciumMgL'),
  magnesiumMgL: bound('magnesiumMgL'),
  phosphateMgL: bound('phosphateMgL'),
  notes: bound('notes'),
  // Bound through the column: encoded as JSON text, as the plain insert does.
  entered: bound('entered'),
  createdAt: bound('now'),
  updatedAt: bound('now'),
}).returning().prepare())

/** Inserts a checked test for the tank, entered by `enteredBy` (null: nobody), and returns its row. */
export function insertTest(db: Db, tankId: string, enteredBy: string | null, reading: CanonicalReading, now = new Date()) {
  return insertTestStatement(db).get({ id: crypto.randomUUID(), tankId, enteredBy, ...readingColumns(reading), now: now.toISOString() })!
}
