/**
 * How many times a tank's readings and events have changed: triggers on `readings` and `events`
 * count every insert, update and delete of a tank's rows in `tank_data_revisions`, on every
 * connection (a CSV import in a worker thread, a correction, a restore by hand). Anything kept
 * in memory about a tank's rows is used only while this count is the one it was made at.
 * Framework-free: takes a `Db`.
 */
import { eq, sql } from 'drizzle-orm'
import type { Db } from '../../db/connection'
import { preparedPerDb } from '../../db/prepared'
import { tankDataRevisions } from '../../db/schema'

const revisionOf = preparedPerDb(db => db.select({ revision: tankDataRevisions.revision }).from(tankDataRevisions)
  .where(eq(tankDataRevisions.tankId, sql.placeholder('tankId'))).prepare())

/** How many times the tank's readings and events have changed (0 before the first). */
export function tankDataRevisionInDb(db: Db, tankId: string): number {
  return revisionOf(db).get({ tankId })?.revision ?? 0
}
