/**
 * Statements prepared once per database handle. Drizzle builds the SQL text of a query on
 * every call (a tenth of a read's time in the profile); a hot query written with
 * `sql.placeholder` and prepared here is built and prepared once, then only bound and run.
 * Keyed by handle, so a test's own database or a transaction gets its own statement.
 */
import type { Db } from './connection'

export function preparedPerDb<T>(prepare: (db: Db) => T): (db: Db) => T {
  const byDb = new WeakMap<Db, T>()
  return (db) => {
    let statement = byDb.get(db)
    if (statement === undefined) {
      statement = prepare(db)
      byDb.set(db, statement)
    }
    return statement
  }
}
