/**
 * npm run db:backup [output-file] — a consistent copy of NUXT_DB_PATH taken online with
 * SQLite's backup API (better-sqlite3 `db.backup()`), safe while the server is serving
 * writes. Default output: data/backups/<timestamp>.sqlite. The copy is checked with
 * PRAGMA integrity_check and left as one self-contained file (rollback journal, no WAL).
 */
import { mkdirSync, renameSync, rmSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import Database from 'better-sqlite3'
import { dbPathFromEnv } from './db-path'

function timestamp(date = new Date()): string {
  return date.toISOString().replace(/[:.]/g, '-')
}

/** Copies the live database at `source` to `target` and verifies the copy; returns per-table row counts. */
export async function backupDatabase(source: string, target: string): Promise<Record<string, number>> {
  const out = resolve(target)
  mkdirSync(dirname(out), { recursive: true })
  const partial = `${out}.partial`
  rmSync(partial, { force: true })
  const live = new Database(resolve(source), { fileMustExist: true })
  try {
    live.pragma('busy_timeout = 5000')
    // All pages in one step: a step that a concurrent write interrupts starts over, so
    // many small steps under steady writes could keep restarting.
    await live.backup(partial, { progress: () => 1_000_000 })
  }
  finally {
    live.close()
  }
  const copy = new Database(partial)
  let counts: Record<string, number>
  try {
    copy.pragma('journal_mode = DELETE')
    const problems = (copy.pragma('integrity_check') as { integrity_check: string }[]).map(r => r.integrity_check)
    if (problems.join() !== 'ok') throw new Error(`The backup failed its integrity check: ${problems.join('; ')}`)
    const tables = copy.prepare(`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' order by name`).pluck().all() as string[]
    counts = Object.fromEntries(tables.map(t => [t, copy.prepare(`select count(*) from "${t.replaceAll('"', '""')}"`).pluck().get() as number]))
  }
  finally {
    copy.close()
  }
  renameSync(partial, out)
  return counts
}

if (import.meta.url === `file://${process.argv[1]}` || process.argv[1]?.endsWith('db-backup.ts')) {
  const source = dbPathFromEnv()
  const target = process.argv[2] || join('data/backups', `${timestamp()}.sqlite`)
  backupDatabase(source, target).then((counts) => {
    const rows = Object.values(counts).reduce((a, b) => a + b, 0)
    console.log(`Backed up ${source} to ${target}: ${Object.keys(counts).length} tables, ${rows} rows, integrity ok`)
  }).catch((error: Error) => {
    console.error(`Backup failed: ${error.message}`)
    process.exit(1)
  })
}
