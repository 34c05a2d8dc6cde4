/**
 * npm run db:restore <backup-file> [--force] — replaces NUXT_DB_PATH with a backup.
 * The server must be stopped first: the script refuses while another process has the
 * database open (checked through /proc on Linux; --force overrides). The backup must
 * pass PRAGMA integrity_check and be a migrated Tidewright database. The replaced file
 * (with its -wal and -shm) is kept aside as <db>.replaced-<timestamp>.
 */
import { copyFileSync, existsSync, readdirSync, readlinkSync, renameSync } from 'node:fs'
import { resolve } from 'node:path'
import Database from 'better-sqlite3'
import { dbPathFromEnv } from './db-path'

/** Ids of other processes holding the file (or its WAL) open; empty where /proc is unavailable. */
export function processesUsing(file: string): number[] {
  const targets = new Set([file, `${file}-wal`, `${file}-shm`])
  const found: number[] = []
  let pids: string[]
  try {
    pids = readdirSync('/proc').filter(name => /^\d+$/.test(name) && Number(name) !== process.pid)
  }
  catch {
    return found
  }
  for (const pid of pids) {
    try {
      if (readdirSync(`/proc/${pid}/fd`).some(fd => targets.has(readlinkSync(`/proc/${pid}/fd/${fd}`)))) found.push(Number(pid))
    }
    catch { /* not ours to read, or gone */ }
  }
  return found
}

/** integrity_check result and whether the file carries Tidewright's migrations. */
function inspect(file: string): { integrity: string, migrated: boolean } {
  const db = new Database(file, { readonly: true, fileMustExist: true })
  try {
    const integrity = (db.pragma('integrity_check') as { integrity_check: string }[]).map(r => r.integrity_check).join('; ')
    const migrated = db.prepare(`select count(*) from sqlite_master where type = 'table' and name in ('__drizzle_migrations', 'tanks', 'readings')`).pluck().get() === 3
    return { integrity, migrated }
  }
  finally {
    db.close()
  }
}

export function restoreDatabase(backup: string, target: string, options: { force?: boolean } = {}): { keptAside: string | null } {
  const from = resolve(backup)
  const to = resolve(target)
  if (!existsSync(from)) throw new Error(`No such backup file: ${from}`)
  const users = processesUsing(to)
  if (users.length && !options.force) {
    throw new Error(`The database ${to} is open in process ${users.join(', ')}. Stop the server first (or pass --force if you are sure).`)
  }
  let checked: ReturnType<typeof inspect>
  try {
    checked = inspect(from)
  }
  catch (error) {
    throw new Error(`${from} is not a readable SQLite database: ${(error as Error).message}`)
  }
  if (checked.integrity !== 'ok') throw new Error(`The backup failed its integrity check: ${checked.integrity}`)
  if (!checked.migrated) throw new Error(`${from} is not a Tidewright database (no migrations table).`)

  const staging = `${to}.restoring`
  copyFileSync(from, staging)
  let keptAside: string | null = null
  if (existsSync(to)) {
    keptAside = `${to}.replaced-${new Date().toISOString().replace(/[:.]/g, '-')}`
    renameSync(to, keptAside)
    for (const suffix of ['-wal', '-shm']) if (existsSync(to + suffix)) renameSync(to + suffix, keptAside + suffix)
  }
  renameSync(staging, to)
  const restored = inspect(to)
  if (restored.integrity !== 'ok') throw new Error(`The restored file failed its integrity check: ${restored.integrity}`)
  return { keptAside }
}

if (process.argv[1]?.endsWith('db-restore.ts')) {
  const args = process.argv.slice(2)
  const file = args.find(a => !a.startsWith('--'))
  if (!file) {
    console.error('Usage: npm run db:restore <backup-file> [--force]   (stop the server first)')
    process.exit(2)
  }
  const target = dbPathFromEnv()
  console.warn(`Restoring ${file} over ${target}. The server must be stopped while this runs.`)
  try {
    const { keptAside } = restoreDatabase(file, target, { force: args.includes('--force') })
    console.log(`Restored ${target} from ${file}; integrity ok.${keptAside ? ` The replaced file is kept as ${keptAside}.` : ''}`)
  }
  catch (error) {
    console.error(`Restore refused: ${(error as Error).message}`)
    process.exit(1)
  }
}
