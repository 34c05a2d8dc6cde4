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

describe('every other write and its audit row', () => {
  it('a client or site edit, an archive and a new site whose audit row cannot be written are not saved', async () => {
    const api = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
    const { lowe } = own.fixtures.demo.clients

    const edit = await withAuditRefused('client.update', () => api.patch(`/api/clients/${lowe}`, { notes: 'Unaudited client note' }))
    expect(edit.status).toBeGreaterThanOrEqual(500)
    expect(count(`select count(*) as n from clients where notes = 'Unaudited client note'`)).toBe(0)

    const archive = await withAuditRefused('client.archive', () => api.post(`/api/clients/${lowe}/archive`, { archived: true }))
    expect(archive.status).toBeGreaterThanOrEqual(500)
    expect(count(`select count(*) as n from clients where id = ? and archived_at is not null`, lowe)).toBe(0)

    const site = await withAuditRefused('site.create', () => api.post(`/api/clients/${lowe}/sites`, { label: 'Unaudited site' }))
    expect(site.status).toBeGreaterThanOrEqual(500)
    expect(count(`select count(*) as n from sites where label = 'Unaudited site'`)).toBe(0)

    const siteId = queryFile<{ id: string }>(own.dbPath, 'select id from sites where client_id = ? limit 1', lowe)[0]!.id
    const siteEdit = await withAuditRefused('site.update', () => api.patch(`/api/sites/${siteId}`, { accessNotes: 'Unaudited access note' }))
    expect(siteEdit.status).toBeGreaterThanOrEqual(500)
    expect(count(`select count(*) as n from sites where access_notes = 'Unaudited access note'`)).toBe(0)

    const siteArchive = await withAuditRefused('site.archive', () => api.post(`/api/sites/${siteId}/archive`, { archived: true }))
    expect(siteArchive.status).toBeGreaterThanOrEqual(500)
    expect(count(`select count(*) as n from sites where id = ? and archived_at is not null`, siteId)).toBe(0)
  })

  it('an e-mail choice and a reset request whose audit row cannot be written change nothing', async () => {
    const api = await new ApiClient(own.server.baseURL).signIn('client@tidewright.test')
    const choice = await withAuditRefused('preferences.update', () => api.request('PUT', '/api/me/notification-preferences', { emailKinds: { 'test-reminder': false } }))
    expect(choice.status).toBeGreaterThanOrEqual(500)
    const prefs = queryFile<{ email_kinds: string }>(own.dbPath, `select email_kinds from notification_preferences p join users u on u.id = p.user_id where u.email = 'client@tidewright.test'`)
    expect(prefs.every(p => JSON.parse(p.email_kinds)['test-reminder'] !== false)).toBe(true)

    const mailsBefore = count(`select count(*) as n from mail_outbox where to_address = 'client2@tidewright.test' and kind = 'reset'`)
    await withAuditRefused('user.reset-requested', () => new ApiClient(own.server.baseURL).post('/api/auth/forgot-password', { email: 'client2@tidewright.test' }))
    expect(count(`select count(*) as n from mail_outbox where to_address = 'client2@tidewright.test' and kind = 'reset'`)).toBe(mailsBefore)
  })

  it('an alert is acknowledged, resolved or opened only together with its audit row', async () => {
    const aquarist2 = await new ApiClient(own.server.baseURL).signIn('aquarist2@tidewright.test')
    const study = own.fixtures.demo.tanks.study
    const openAlert = () => queryFile<{ id: string }>(own.dbPath, `select id from alerts where tank_id = ? and status = 'open'`, study)[0]?.id
    const seeded = openAlert()
    expect(seeded).toBeTruthy()

    const ack = await withAuditRefused('alert.acknowledge', () => aquarist2.post(`/api/alerts/${seeded}/acknowledge`, { note: 'Unaudited' }))
    expect(ack.status).toBeGreaterThanOrEqual(500)
    expect(openAlert()).toBe(seeded)

    let minutes = 20
    const session = (ammonia: number) => ({
      takenAt: new Date(Date.now() - (minutes -= 1) * 60_000).toISOString(), ammonia, nitrite: 0.3, nitrate: 5,
      basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
    })
    const unaudited = (action: string) => count(`select count(*) as n from alerts a where a.tank_id = ? and not exists (select 1 from audit_log l where l.entity_id = a.id and l.action = ?)`, study, action)
    const unauditedResolved = () => count(`select count(*) as n from alerts a where a.tank_id = ? and a.status = 'resolved' and not exists (select 1 from audit_log l where l.entity_id = a.id and l.action = 'alert.resolve')`, study)

    // A clear test resolves the alert; while its audit row cannot be written, it stays open.
    await withAuditRefused('alert.resolve', () => aquarist2.post(`/api/tanks/${study}/readings`, session(0)))
    expect(unauditedResolved()).toBe(0)
    expect(openAlert()).toBe(seeded)
    expect((await aquarist2.post(`/api/tanks/${study}/readings`, session(0))).status).toBe(201)
    expect(openAlert()).toBeUndefined()
    expect(unauditedResolved()).toBe(0)

    // 1.5 ppm NH3 is over the action level: an alert opens only with its audit row.
    const alertsBefore = unaudited('alert.open')
    await withAuditRefused('alert.open', () => aquarist2.post(`/api/tanks/${study}/readings`, session(1.5)))
    expect(unaudited('alert.open')).toBe(alertsBefore)
    expect((await aquarist2.post(`/api/tanks/${study}/readings`, session(1.5))).status).toBe(201)
    const reopened = openAlert()
    expect(reopened).toBeTruthy()
    expect(count(`select count(*) as n from audit_log where entity_id = ? and action = 'alert.open'`, reopened)).toBe(1)
  })
})
