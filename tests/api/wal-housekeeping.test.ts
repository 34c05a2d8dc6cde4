/**
 * SQLite housekeeping: after a big CSV import the write-ahead log does not stay large on
 * disk. The clocked jobs checkpoint it and cut it back (journal_size_limit + TRUNCATE).
 */
import { existsSync, statSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'

const MB = 1024 * 1024

let own: OwnServer
beforeAll(async () => {
  own = await startOwnServer({ NUXT_TEST_HOOKS: '1' })
})
afterAll(async () => {
  await own?.cleanup()
})

const walBytes = () => (existsSync(`${own.dbPath}-wal`) ? statSync(`${own.dbPath}-wal`).size : 0)

describe('the write-ahead log after a big import', () => {
  it('is checkpointed and cut back by the clocked jobs', async () => {
    const api = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
    const tank = own.fixtures.demo.tanks.lobby
    // Half an hour apart: 48 a day, the most one day may hold (TESTS_PER_TANK_PER_DAY).
    const start = Date.parse('2022-01-01T00:00:00Z')
    const rows = Array.from({ length: 60_000 }, (_, i) => `${new Date(start + i * 1_800_000).toISOString()},0.25,0.1,${i % 50},wal housekeeping row ${i}`).join('\n')
    const imported = await api.post(`/api/tanks/${tank}/readings/import`, { csv: `takenAt,ammonia,nitrite,nitrate,notes\n${rows}`, dryRun: false })
    expect(imported.status).toBe(200)
    const afterImport = walBytes()
    expect((await api.post('/api/dev/worker-tick', {})).status).toBe(200)
    const afterTick = walBytes()
    console.log(`[wal] after a 60,000-row import: WAL ${(afterImport / MB).toFixed(1)} MB; after the clocked jobs: ${(afterTick / MB).toFixed(1)} MB`)
    expect(afterImport).toBeGreaterThan(0)
    expect(afterTick).toBeLessThan(MB)
    // The data is all there after the checkpoint.
    const page = await api.get(`/api/tanks/${tank}/readings?pageSize=1`)
    expect(page.status).toBe(200)
  })
})
