/**
 * Migration 0012 moves each earlier decision's engine input out of `sign_offs.snapshot` into
 * `sign_off_inputs`, unchanged: a database made before it (migrations up to 0011, a decided
 * sign-off written as the server wrote it then) is migrated, and the input reads back byte for
 * byte as it was stored while the snapshot keeps everything else.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase } from '../../../../server/db/connection'
import { migrationsBefore } from '../../../support/migrations-before'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-sign-off-inputs-migration-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

/** An engine input as a decision stored it: numbers of every shape, words beyond ASCII, quotes. */
const input = {
  now: '2026-11-30T09:00:00.000Z',
  tank: { volumeLitres: 120.5, cycleMethod: 'fishless', cycleStartedAt: '2026-10-01T00:00:00.000Z' },
  thresholds: { ammoniaMaxN: 0.05, nitriteMaxN: 1e-7, temperatureMaxC: 29 },
  readings: [
    { id: 'r-1', takenAt: '2026-11-29T08:00:00.000Z', ammoniaN: 0, nitriteN: 0.012345678901234567, nitrateN: 12.5, pH: 8.1, notes: 'Kalkwasser – “clear” \\ ok 🐠' },
    { id: 'r-2', takenAt: '2026-11-30T08:00:00.000Z', ammoniaN: 0.25, nitriteN: null, salinity: 35 },
  ],
  events: [{ id: 'e-1', at: '2026-11-28T10:00:00.000Z', kind: 'ammonia-dose', amount: 2 }],
}
const snapshot = { facts: { tankName: 'Lounge' }, input, verdict: { phase: 'complete', ruleSetVersion: 'v1' }, overrideGrounds: [], unresolvedAlerts: 0 }

describe('migration 0012 (sign_off_inputs)', () => {
  it('moves a decided sign-off\'s input out of its snapshot unchanged, and leaves the rest', () => {
    const dbPath = join(dir, 'older.sqlite')
    const db = openDatabase(dbPath)
    migrateDatabase(db, migrationsBefore(dir, 12))
    const sqlite = db.$client
    // The rows a decision and a waiting request rest on are beside the point here.
    sqlite.pragma('foreign_keys = OFF')
    const insert = sqlite.prepare('INSERT INTO sign_offs (id, organisation_id, tank_id, requested_at, status, decided_at, snapshot, created_at, updated_at) VALUES (?, \'org\', \'tank\', ?, ?, ?, ?, ?, ?)')
    const at = '2026-11-30T09:00:00.000Z'
    insert.run('decided', at, 'approved', at, JSON.stringify(snapshot), at, at)
    insert.run('waiting', at, 'requested', null, null, at, at)
    sqlite.pragma('foreign_keys = ON')

    migrateDatabase(db)

    const moved = sqlite.prepare('SELECT sign_off_id AS id, input FROM sign_off_inputs').all() as { id: string, input: string }[]
    expect(moved).toEqual([{ id: 'decided', input: JSON.stringify(input) }])
    const rows = sqlite.prepare('SELECT id, snapshot FROM sign_offs ORDER BY id').all() as { id: string, snapshot: string | null }[]
    const { input: _input, ...rest } = snapshot
    expect(rows.map(r => ({ id: r.id, snapshot: r.snapshot === null ? null : JSON.parse(r.snapshot) }))).toEqual([
      { id: 'decided', snapshot: rest },
      { id: 'waiting', snapshot: null },
    ])
    expect(rows[0]!.snapshot).not.toContain('"input"')
    sqlite.close()
  })
})
