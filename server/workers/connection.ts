/**
 * A worker thread's own connection to the server's SQLite file, opened once per path with
 * the server's pragmas (WAL, foreign keys, busy timeout, synchronous NORMAL): a commit
 * here is as durable as one on the request loop's connection.
 *
 * Its temp tables (the CSV import stages its rows in one) are kept in a file, not in memory,
 * with a small page cache of their own: a staged file of 100,000 rows costs the worker a few
 * MiB, not its size, and takes no lock of the main database.
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
