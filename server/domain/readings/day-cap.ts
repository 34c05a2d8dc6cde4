/**
 * How many current tests a tank holds per calendar day (UTC), for the cap in
 * shared/readings/limits.ts. A current test is a reading no correction has replaced, so a
 * correction never changes a day's count. Framework-free: takes a `Db` (the connection or
 * a transaction, so a write and its check see the same rows) and runs in the import worker
 * as well as in the server.
 */
import { and, count, eq, gte, lt, notExists, sql } from 'drizzle-orm'
import { alias } from 'drizzle-orm/sqlite-core'
import { dayOf } from '#shared/readings/limits'
import type { Db } from '#server/db/connection'
import { preparedPerDb } from '#server/db/prepared'
import { readings } from '#server/db/schema'

/** The day after a YYYY-MM-DD day, as YYYY-MM-DD. */
function nextDay(day: string): string {
  return new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10)
}

const correction = alias(readings, 'correction')

/** Prepared once per handle: every save asks it for its own day, the CSV import for every day its file touches (thousands). */
const currentTestsBetween = preparedPerDb(db => db.select({ n: count() }).from(readings).where(and(
  eq(readings.tankId, sql.placeholder('tankId')),
  gte(readings.takenAt, sql.placeholder('from')),
  lt(readings.takenAt, sql.placeholder('to')),
  notExists(db.select({ one: sql`1` }).from(correction).where(eq(correction.correctsId, readings.id))),
)).prepare())

/** Current tests the tank holds on a day (YYYY-MM-DD, UTC). */
export function testsOnDay(db: Db, tankId: string, day: string): number {
  return currentTestsBetween(db).get({ tankId, from: day, to: nextDay(day) })?.n ?? 0
}

/** Current tests the tank holds on the day of `takenAt`. */
export function testsOnDayOf(db: Db, tankId: string, takenAt: string): number {
  return testsOnDay(db, tankId, dayOf(takenAt))
}
