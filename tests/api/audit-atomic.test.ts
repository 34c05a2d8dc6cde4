/**
 * A change and the audit row that describes it commit together or not at all. The
 * database is made to refuse one kind of audit row (a trigger, as a crash or a full disk
 * between the two writes would): the write is then refused whole, and nothing it would
 * have changed is left behind without its audit row.
 */
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { queryFile } from '../support/db-checksum'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'

let own: OwnServer
beforeAll(async () => {
  own = await startOwnServer()
})
afterAll(async () => {
  await own?.cleanup()
})

/** Runs `write` while the database refuses audit rows with this action; the trigger is removed afterwards. */
async function withAuditRefused<T>(action: string, write: () => Promise<T>): Promise<T> {
  const db = new Database(own.dbPath)
  db.exec(`CREATE TRIGGER refuse_audit_for_test BEFORE INSERT ON audit_log WHEN NEW.action = '${action}' BEGIN SELECT RAISE(ABORT, 'audit refused'); END`)
  db.close()
  try {
    return await write()
  }
  finally {
    const again = new Database(own.dbPath)
    again.exec('DROP TRIGGER IF EXISTS refuse_audit_for_test')
    again.close()
  }
}

const count = (sql: string, ...params: unknown[]) => queryFile<{ n: number }>(own.dbPath, sql, ...params)[0]!.n

describe('audit rows in the write\'s transaction', () => {
  it('a CSV import whose audit row cannot be written leaves no readings behind', async () => {
    const api = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
    const tank = own.fixtures.demo.tanks.lobby
    const rows = Array.from({ length: 500 }, (_, i) => `2026-03-${String(1 + (i % 28)).padStart(2, '0')}T${String(i % 24).padStart(2, '0')}:${String(i % 60).padStart(2, '0')}:00Z,0.25,0.1,${i % 50},audit-atomic ${i}`).join('\n')
    const csv = `takenAt,ammonia,nitrite,nitrate,notes\n${rows}`
    const response = await withAuditRefused('reading.import', () => api.post(`/api/tanks/${tank}/readings/import`, { csv, dryRun: false }))
    expect(response.status).toBeGreaterThanOrEqual(500)
    const orphans = count(`select count(*) as n from readings where notes like 'audit-atomic %'`)
    console.log(`[audit] import refused at its audit row: ${orphans} readings left without an audit row`)
    expect(orphans).toBe(0)
    // The same import goes through once the audit row can be written, with its one audit row.
    const ok = await api.post(`/api/tanks/${tank}/readings/import`, { csv, dryRun: false })
    expect(ok.status).toBe(200)
    expect(count(`select count(*) as n from readings where notes like 'audit-atomic %'`)).toBe(500)
    expect(count(`select count(*) as n from audit_log where action = 'reading.import' and entity_id = ?`, tank)).toBe(1)
  })

  it('a tank, a client and a stage edit whose audit row cannot be written are not saved', async () => {
    const api = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
    const { demo } = own.fixtures
    const tank = await withAuditRefused('tank.create', () => api.post('/api/tanks', { name: 'Unaudited reef', clientId: demo.clients.lowe, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 } }))
    expect(tank.status).toBeGreaterThanOrEqual(500)
    expect(count(`select count(*) as n from tanks where name = 'Unaudited reef'`)).toBe(0)

    const client = await withAuditRefused('client.create', () => api.post('/api/clients', { name: 'Unaudited Client' }))
    expect(client.status).toBeGreaterThanOrEqual(500)
    expect(count(`select count(*) as n from clients where name = 'Unaudited Client'`)).toBe(0)

    const stageId = queryFile<{ id: string }>(own.dbPath, 'select id from plan_stages where tank_id = ? order by position limit 1', demo.tanks.lounge)[0]!.id
    const stage = await withAuditRefused('plan-stage.update', () => api.patch(`/api/tanks/${demo.tanks.lounge}/stages/${stageId}`, { notes: 'Unaudited stage note' }))
    expect(stage.status).toBeGreaterThanOrEqual(500)
    expect(count(`select count(*) as n from plan_stages where notes = 'Unaudited stage note'`)).toBe(0)
  })
})
