/**
 * Migration 0013 records, for each decision already stored, which tests and events its engine
 * input holds (`sign_off_input_entries`), read once from the stored input: a database made before
 * it (migrations up to 0012, a decided sign-off and a waiting request) is migrated, and the lock's
 * question is then answered by those rows, while the stored input reads back byte for byte.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase } from '../../../../server/db/connection'
import { signedInputHolds } from '../../../../server/domain/sign-off/signed-record'
import { migrationsBefore } from '../../../support/migrations-before'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-sign-off-input-entries-migration-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

/** Engine inputs as decisions stored them: tests and events, and one decided on an empty history. */
const input = {
  now: '2026-11-30T09:00:00.000Z',
  tank: { volumeLitres: 120.5, cycleMethod: 'fishless', startedAt: '2026-10-01T00:00:00.000Z' },
  thresholds: { ammoniaMaxN: 0.05 },
  readings: [
    { id: 'r-1', takenAt: '2026-11-29T08:00:00.000Z', ammoniaN: 0, notes: 'Kalkwasser – “clear” 🐠' },
    { id: 'r-2', takenAt: '2026-12-02T08:00:00.000Z', ammoniaN: 0.25 },
  ],
  events: [{ id: 'e-1', at: '2026-11-28T10:00:00.000Z', kind: 'ammonia-dose', amount: 2 }],
}
const empty = { ...input, readings: [], events: [] }

describe('migration 0013 (sign_off_input_entries)', () => {
  it('records the tests and events each stored input holds, and leaves the input unchanged', () => {
    const db = openDatabase(join(dir, 'older.sqlite'))
    migrateDatabase(db, migrationsBefore(dir, 13))
    const sqlite = db.$client
    // The rows a decision rests on are beside the point here.
    sqlite.pragma('foreign_keys = OFF')
    const at = '2026-11-30T09:00:00.000Z'
    const signOff = sqlite.prepare('INSERT INTO sign_offs (id, organisation_id, tank_id, requested_at, status, decided_at, snapshot, created_at, updated_at) VALUES (?, \'org\', \'tank\', ?, ?, ?, ?, ?, ?)')
    signOff.run('decided', at, 'approved', at, '{}', at, at)
    signOff.run('empty', at, 'returned', at, '{}', at, at)
    signOff.run('waiting', at, 'requested', null, null, at, at)
    const stored = sqlite.prepare('INSERT INTO sign_off_inputs (sign_off_id, input) VALUES (?, ?)')
    stored.run('decided', JSON.stringify(input))
    stored.run('empty', JSON.stringify(empty))
    sqlite.pragma('foreign_keys = ON')

    migrateDatabase(db)

    const entries = sqlite.prepare('SELECT sign_off_id AS signOffId, entry_id AS entryId FROM sign_off_input_entries ORDER BY 1, 2').all()
    expect(entries).toEqual([
      { signOffId: 'decided', entryId: 'e-1' },
      { signOffId: 'decided', entryId: 'r-1' },
      { signOffId: 'decided', entryId: 'r-2' },
    ])
    expect(signedInputHolds(db, 'decided', 'r-2')).toBe(true)
    expect(signedInputHolds(db, 'decided', 'e-1')).toBe(true)
    expect(signedInputHolds(db, 'decided', 'r-3')).toBe(false)
    expect(signedInputHolds(db, 'empty', 'r-1')).toBe(false)
    expect(sqlite.prepare('SELECT input FROM sign_off_inputs WHERE sign_off_id = ?').pluck().get('decided')).toBe(JSON.stringify(input))
    sqlite.close()
  })
})
