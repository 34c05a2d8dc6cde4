/**
 * A worker thread's own connection to the server's SQLite file, opened once per path with
 * the server's pragmas (WAL, foreign keys, busy timeout, synchronous NORMAL): a commit
 * here is as durable as one on the request loop's connection.
 */
import { openDatabase, type TidewrightDB } from '#server/db/connection'

const connections = new Map<string, TidewrightDB>()

export function workerConnection(path: string): TidewrightDB {
  let db = connections.get(path)
  if (!db) {
    db = openDatabase(path)
    connections.set(path, db)
  }
  return db
}
