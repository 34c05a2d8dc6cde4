/**
 * npm run db:backup takes a consistent copy while the server is serving writes, and
 * npm run db:restore puts it back: the restored file matches the backup table by table,
 * passes integrity_check, and the server runs on it. Restore refuses a damaged file and
 * a database the server still has open.
 */
import { spawn } from 'node:child_process'
import { existsSync, readdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { fingerprint, integrityCheck, queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
import { READING_BODY } from './access-matrix.data'

let own: OwnServer
beforeAll(async () => {
  own = await startOwnServer()
})
afterAll(async () => {
  await own?.cleanup()
})

function runScript(script: string, args: string[], env: Record<string, string>): Promise<{ code: number, output: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', script, ...args], { env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] })
    let output = ''
    child.stdout.on('data', (c) => {
      output += c
    })
    child.stderr.on('data', (c) => {
      output += c
    })
    child.on('exit', code => resolve({ code: code ?? 1, output }))
  })
}

/** Clients entering readings until stopped; each acknowledged (201) write is counted. */
function startWriters(count: number) {
  let running = true
  let acknowledged = 0
  // Half an hour apart across all writers, back from an hour ago: no day holds more tests
  // than TESTS_PER_TANK_PER_DAY, however long the load runs.
  let slot = 0
  const loops = Array.from({ length: count }, async (_, w) => {
    const api = await new ApiClient(own.server.baseURL).signIn(w % 2 ? 'client@tidewright.test' : 'aquarist@tidewright.test')
    const tank = w % 2 ? own.fixtures.demo.tanks.lounge : own.fixtures.demo.tanks.study
    for (let i = 0; running; i++) {
      const response = await api.post(`/api/tanks/${tank}/readings`, { ...READING_BODY(), takenAt: new Date(Date.now() - 3_600_000 - slot++ * 1_800_000).toISOString(), notes: `backup-load w${w} n${i}` })
      if (response.status === 201) acknowledged++
      else throw new Error(`write load got ${response.status}`)
    }
  })
  return {
    acknowledged: () => acknowledged,
    stop: async () => {
      running = false
      await Promise.all(loops)
    },
  }
}

/** Load readings in a file, and how many of them have the audit row written in the same transaction. */
const loadRows = (path: string) => queryFile<{ readings: number, audited: number }>(path,
  `select count(*) as readings, sum((select count(*) from audit_log a where a.action = 'reading.create' and a.entity_id = r.id)) as audited
   from readings r where r.notes like 'backup-load %'`)[0]!

describe('backup and restore', () => {
  it('backs up while writes are in flight, and the restored copy matches the backup exactly', async () => {
    const backup = join(own.dir, 'backups', 'during-writes.sqlite')
    const writers = startWriters(8)
    while (writers.acknowledged() < 20) await new Promise(r => setTimeout(r, 20))
    const result = await runScript('scripts/db-backup.ts', [backup], { NUXT_DB_PATH: own.dbPath })
    const duringBackup = writers.acknowledged()
    while (writers.acknowledged() < duringBackup + 20) await new Promise(r => setTimeout(r, 20))
    await writers.stop()
    expect(result.output).toMatch(/integrity ok/)
    expect(result.code).toBe(0)

    expect(integrityCheck(backup)).toBe('ok')
    const inBackup = loadRows(backup)
    // Each reading and its audit row are written in one transaction: a consistent
    // snapshot holds both of every write or neither.
    expect(inBackup.audited).toBe(inBackup.readings)
    expect(inBackup.readings).toBeGreaterThanOrEqual(20)
    // Writes went on after the copy was taken, so the live file has more.
    expect(loadRows(own.dbPath).readings).toBeGreaterThan(inBackup.readings)
    const backupPrint = fingerprint(backup)
    expect(backupPrint.tanks!.rows).toBeGreaterThan(0)

    const refused = await runScript('scripts/db-restore.ts', [backup], { NUXT_DB_PATH: own.dbPath })
    expect(refused.code).toBe(1)
    expect(refused.output).toMatch(/Stop the server first/)

    await own.server.stop()
    const restored = await runScript('scripts/db-restore.ts', [backup], { NUXT_DB_PATH: own.dbPath })
    expect(restored.output).toMatch(/server must be stopped/)
    expect(restored.code, restored.output).toBe(0)
    expect(integrityCheck(own.dbPath)).toBe('ok')
    expect(fingerprint(own.dbPath)).toEqual(backupPrint)
    const aside = readdirSync(own.dir).filter(name => name.startsWith('test.sqlite.replaced-') && !name.endsWith('-wal') && !name.endsWith('-shm'))
    expect(aside).toHaveLength(1)
    expect(loadRows(join(own.dir, aside[0]!)).readings).toBeGreaterThan(inBackup.readings)
    expect(integrityCheck(join(own.dir, aside[0]!))).toBe('ok')

    await own.restart()
    const api = await new ApiClient(own.server.baseURL).signIn('client@tidewright.test')
    expect((await api.get('/api/tanks')).body.total).toBe(2)
  })

  it('refuses to restore a damaged file or one that is not a Tidewright database, leaving the database alone', async () => {
    const damaged = join(own.dir, 'damaged.sqlite')
    writeFileSync(damaged, Buffer.alloc(8192, 7))
    await own.server.stop()
    const before = fingerprint(own.dbPath)
    const result = await runScript('scripts/db-restore.ts', [damaged], { NUXT_DB_PATH: own.dbPath })
    expect(result.code).toBe(1)
    expect(result.output).toMatch(/Restore refused: .*not a readable SQLite database/)
    const empty = join(own.dir, 'empty.sqlite')
    new Database(empty).exec('create table notes (body text)')
    const foreign = await runScript('scripts/db-restore.ts', [empty], { NUXT_DB_PATH: own.dbPath })
    expect(foreign.output).toMatch(/not a Tidewright database/)
    const missing = await runScript('scripts/db-restore.ts', [join(own.dir, 'nope.sqlite')], { NUXT_DB_PATH: own.dbPath })
    expect(missing.output).toMatch(/No such backup file/)
    expect(fingerprint(own.dbPath)).toEqual(before)
    expect(existsSync(`${own.dbPath}.restoring`)).toBe(false)
    await own.restart()
  })
})
