/**
 * A worker thread's own connection to the server's SQLite file, opened once per path with
 * the server's pragmas (WAL, foreign keys, busy timeout, synchronous NORMAL): a commit
 * here is as durable as one on the request loop's connection.
 *
 * Its temp tables (the CSV import stages its rows in one) are kept in a file, not in memory,
 * with a small page cache of their own: a staged file of 100,000 rows costs the worker a few
 * MiB, not its size, and takes no lock of the main database.
 *
 * The main database keeps better-sqlite3's page cache of 16 MiB: a bound, which an import of
 * 100,000 rows fills (the table and its indexes of random keys grow by some 75 MB) and 10,000
 * rows do not. A smaller one made the worker's memory as flat for 10,000 rows as for 100,000
 * but the import slower, as its index pages were read and written again: 8 MiB saved 8 MiB
 * for about 15 % more CPU time, 4 MiB 12 MiB for 55 %; reading a long history for its verdict
 * took the same time with each.
 */
import { openDatabase, type TidewrightDB } from '#server/db/connection'

const connections = new Map<string, TidewrightDB>()

export function workerConnection(path: string): TidewrightDB {
  let db = connections.get(path)
  if (!db) {
    db = openDatabase(path)
    db.$client.pragma('temp_store = FILE')
    db.$client.pragma('temp.cache_size = -2048') // KiB
    connections.set(path, db)
  }
  return db
}
