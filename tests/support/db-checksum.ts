/**
 * Fingerprints of a SQLite file, read the way an outsider would: a separate read-only
 * better-sqlite3 connection, every table hashed row by row in rowid (or primary key) order. Two files
 * (or one file at two moments) with equal fingerprints hold the same data.
 */
import { createHash } from 'node:crypto'
import Database from 'better-sqlite3'

export interface TableFingerprint {
  rows: number
  sha256: string
}

export type DatabaseFingerprint = Record<string, TableFingerprint>

/**
 * Who is signed in, not what the company holds: every sign-in adds a row and any request
 * may move a session's last-seen time, so these tables are left out of fingerprints.
 * tests/api/sessions.test.ts checks sessions through the API.
 */
const SIGN_IN_BOOKKEEPING = ['sessions']

/**
 * The order a table's rows are hashed in: the rowid, or for a WITHOUT ROWID table (which has
 * none, sign_off_input_entries) its primary key, which orders its rows just as well.
 */
function rowOrder(db: Database.Database, table: string): string {
  const sql = db.prepare(`select sql from sqlite_master where type = 'table' and name = ?`).pluck().get(table) as string | undefined
  if (!sql || !/without\s+rowid/i.test(sql)) return 'rowid'
  const key = db.prepare(`select name from pragma_table_info(?) where pk > 0 order by pk`).all(table) as { name: string }[]
  return key.map(c => `"${c.name.replaceAll('"', '""')}"`).join(', ')
}

/** Hashes one open connection's tables (excluding SQLite's own bookkeeping and who is signed in). */
export function fingerprintConnection(db: Database.Database): DatabaseFingerprint {
  const tables = (db.prepare(`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' order by name`).pluck().all() as string[])
    .filter(name => !SIGN_IN_BOOKKEEPING.includes(name))
  const result: DatabaseFingerprint = {}
  for (const table of tables) {
    const hash = createHash('sha256')
    let rows = 0
    const quoted = `"${table.replaceAll('"', '""')}"`
    for (const row of db.prepare(`select * from ${quoted} order by ${rowOrder(db, table)}`).raw().iterate() as Iterable<unknown[]>) {
      hash.update(JSON.stringify(row, (_key, value) => (typeof value === 'bigint' ? value.toString() : Buffer.isBuffer(value) ? value.toString('base64') : value)))
      hash.update('\n')
      rows++
    }
    result[table] = { rows, sha256: hash.digest('hex') }
  }
  return result
}

/** Opens the file read-only, fingerprints it, closes it. */
export function fingerprint(path: string): DatabaseFingerprint {
  const db = new Database(path, { readonly: true, fileMustExist: true })
  try {
    return fingerprintConnection(db)
  }
  finally {
    db.close()
  }
}

/** `PRAGMA integrity_check` on a read-only connection: 'ok' or the problems found. */
export function integrityCheck(path: string): string {
  const db = new Database(path, { readonly: true, fileMustExist: true })
  try {
    return (db.pragma('integrity_check') as { integrity_check: string }[]).map(row => row.integrity_check).join('; ')
  }
  finally {
    db.close()
  }
}

/** Runs a read-only query against the file (for checks such as "this row is present once"). */
export function queryFile<T = unknown>(path: string, sql: string, ...params: unknown[]): T[] {
  const db = new Database(path, { readonly: true, fileMustExist: true })
  try {
    return db.prepare(sql).all(...params) as T[]
  }
  finally {
    db.close()
  }
}
