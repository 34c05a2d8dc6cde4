/**
 * A query's rows as arrays of column values, run on the handle's better-sqlite3 connection with
 * the text and parameters Drizzle builds. Read one at a time: a long result (years of a tank's
 * tests) is mapped row by row instead of being held whole as arrays first, which for 100,000
 * tests was some tens of MB at once; Drizzle reads whole results only. Or prepared once with
 * placeholders: a page of a thousand rows is then mapped by the caller's own code, not by
 * Drizzle's per-column mapping, which took longer than SQLite's read.
 */
import type Database from 'better-sqlite3'
import { fillPlaceholders, type SQL } from 'drizzle-orm'
import { SQLiteSyncDialect } from 'drizzle-orm/sqlite-core'
import type { Db } from './connection'

const dialect = new SQLiteSyncDialect()

/** The connection under a handle or a transaction on it (drizzle keeps it on the handle's session). */
function connectionOf(db: Db): Database.Database {
  const client = (db as unknown as { session?: { client?: Database.Database } }).session?.client
  if (!client || typeof client.prepare !== 'function') throw new Error('No better-sqlite3 connection under this database handle')
  return client
}

/** The rows of `query` one at a time, each as its columns' values in order. Read them before the next statement on the handle. */
export function iterateValues<T extends unknown[]>(db: Db, query: SQL): IterableIterator<T> {
  const { sql, params } = dialect.sqlToQuery(query)
  return connectionOf(db).prepare(sql).raw().iterate(...params) as IterableIterator<T>
}

/**
 * `query`, written with `sql.placeholder`, prepared now; each call binds the placeholders' values
 * and returns every row as its columns' values in order. Keep it per handle (`preparedPerDb`).
 */
export function preparedValues<T extends unknown[]>(db: Db, query: SQL): (values: Record<string, unknown>) => T[] {
  const { sql, params } = dialect.sqlToQuery(query)
  const statement = connectionOf(db).prepare(sql).raw()
  return values => statement.all(...fillPlaceholders(params, values)) as T[]
}
