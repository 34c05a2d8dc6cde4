/**
 * A query's rows as arrays of their values, handed over one at a time. A long read (the
 * 100,000 tests of an imported history, for the verdict) then never holds every row's array
 * at once: each one dies as soon as the caller has made its own shape of it, where a list of
 * them all lived until the last was mapped and the collector copied every one of them on the
 * way (up to a seventh of the verdict refresh after an import).
 *
 * A transaction's handle (the seed, a sign-off) has no connection of its own to stream from:
 * its rows come as one list, the same rows in the same order. Framework-free.
 */
import type Database from 'better-sqlite3'
import type { SQL } from 'drizzle-orm'
import { SQLiteSyncDialect } from 'drizzle-orm/sqlite-core'
import type { Db } from './connection'

/** The SQL text and parameters of a query, as Drizzle's own `values` writes them. */
const dialect = new SQLiteSyncDialect()

export function streamValues<Row extends unknown[]>(db: Db, query: SQL): Iterable<Row> {
  const client = (db as { $client?: Database.Database }).$client
  if (!client) return db.values<Row>(query)
  const { sql, params } = dialect.sqlToQuery(query)
  return client.prepare(sql).raw().iterate(...params) as Iterable<Row>
}
