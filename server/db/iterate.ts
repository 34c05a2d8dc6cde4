/**
 * A query's rows read one at a time, as arrays of column values: a long result (years of a
 * tank's tests) is mapped row by row instead of being held whole as arrays first, which for
 * 100,000 tests was some tens of MB at once. Drizzle reads whole results only, so the text and
 * parameters it builds are run on the handle's better-sqlite3 connection.
 */
import type Database from 'better-sqlite3'
import type { SQL } from 'drizzle-orm'
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
