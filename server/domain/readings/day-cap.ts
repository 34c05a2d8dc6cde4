/**
 * How many current tests a tank holds per calendar day (UTC), for the cap in
 * shared/readings/limits.ts. A current test is a reading no correction has replaced, so a
 * correction never changes a day's count. Framework-free: takes a `Db` (the connection or
 * a transaction, so a write and its check see the same rows) and runs in the import worker
 * as well as in the server.
 */
import { and, eq, gte, lt, sql } from 'drizzle-orm'
import type { Db } from '#server/db/connection'
import { preparedPerDb } from '#server/db/prepared'
import { readings } from '#server/db/schema'

/** The day after a YYYY-MM-DD day, as YYYY-MM-DD. */
function nextDay(day: string): string {
  return new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10)
}

/** Current tests per day on the tank, for the days from `first` to `last` (inclusive). */
export function testsPerDay(db: Db, tankId: string, first: string, last: string): Map<string, number> {
  const rows = db.all<{ day: string, n: number }>(sql`
    select substr(r.taken_at, 1, 10) as day, count(*) as n from readings r
    where r.tank_id = ${tankId} and r.taken_at >= ${first} and r.taken_at < ${nextDay(last)}
      and not exists (select 1 from readings l where l.corrects_id = r.id)
    group by day`)
  return new Map(rows.map(r => [r.day, r.n]))
}

/** One day's count, the question every save asks: the same query for one day, prepared once. */
const testsOnDay = preparedPerDb(db => db.select({ n: sql<number>`count(*)` }).from(readings)
  .where(and(
    eq(readings.tankId, sql.placeholder('tankId')),
    gte(readings.takenAt, sql.placeholder('first')),
    lt(readings.takenAt, sql.placeholder('next')),
    sql`not exists (select 1 from readings l where l.corrects_id = ${readings.id})`,
  )).prepare())

/** Current tests the tank holds on the day of `takenAt`. */
export function testsOnDayOf(db: Db, tankId: string, takenAt: string): number {
  const day = takenAt.slice(0, 10)
  return testsOnDay(db).get({ tankId, first: day, next: nextDay(day) })?.n ?? 0
}
