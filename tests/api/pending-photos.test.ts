/**
 * Test photos uploaded but never attached to a saved reading: a tank holds at most 20 of
 * them at once, and each is removed (row, bytes and an audit row) once a day has passed.
 */
import { beforeAll, describe, expect, inject, it } from 'vitest'
import sharp from 'sharp'
import { queryFile } from '../support/db-checksum'
import type { ApiClient } from '../support/http'
import { signedIn } from '../support/http'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import type { TankView } from '../../shared/types/tanks'

let co: ScratchCompany
let tankId: string
let raceTankId: string
let png: Buffer

beforeAll(async () => {
  co = await seedScratchCompany('pending-photos')
  const aquarist = await signedIn(co.emails.aquarist)
  const { body } = await aquarist.post<TankView>('/api/tanks', { name: 'Pending photo reef', clientId: co.clientId, shape: 'cube', dimensions: { sideMm: 450 } })
  tankId = body.id
  raceTankId = (await aquarist.post<TankView>('/api/tanks', { name: 'Photo race reef', clientId: co.clientId, shape: 'cube', dimensions: { sideMm: 450 } })).body.id
  png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#c6dce7' } }).png().toBuffer()
})

async function upload(api: ApiClient, tank = tankId): Promise<number> {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(png)]), 'strip.png')
  const response = await fetch(`${api.baseURL}/api/tanks/${tank}/test-photos`, { method: 'POST', body: form, headers: { cookie: api.cookieHeader() } })
  await response.arrayBuffer()
  return response.status
}

const pendingRows = (tank = tankId) => queryFile<{ n: number }>(inject('dbPath'), 'select count(*) as n from uploads where tank_id = ? and stage_id is null and reading_id is null', tank)[0]!.n

describe('unattached test photos', () => {
  it('stops at 20 waiting on one tank, and goes a day later with an audit row', async () => {
    const client = await signedIn(co.emails.client)
    const statuses: number[] = []
    for (let i = 0; i < 25; i++) statuses.push(await upload(client))
    const stored = statuses.filter(s => s === 201).length
    console.log(`[photos] 25 unattached uploads on one tank: ${stored} stored, ${statuses.filter(s => s === 429).length} refused`)
    expect(stored).toBe(20)
    expect(statuses.slice(20).every(s => s === 429)).toBe(true)
    expect(pendingRows()).toBe(20)

    const admin = await signedIn(co.emails.admin)
    // Not yet a day old: they stay.
    expect((await admin.post('/api/dev/worker-tick', { now: new Date(Date.now() + 3_600_000).toISOString() })).status).toBe(200)
    expect(pendingRows()).toBe(20)
    const tick = await admin.post('/api/dev/worker-tick', { now: new Date(Date.now() + 25 * 3_600_000).toISOString() })
    expect(tick.status).toBe(200)
    expect(tick.body.photosRemoved).toBeGreaterThanOrEqual(20)
    expect(pendingRows()).toBe(0)
    const audited = queryFile<{ n: number }>(inject('dbPath'), `select count(*) as n from audit_log where action = 'upload.expire' and organisation_id = ?`, co.organisationId)[0]!.n
    expect(audited).toBe(20)
    // Room again for new photos.
    expect(await upload(client)).toBe(201)
  })

  it('holds at 20 when 30 uploads arrive at once', async () => {
    const client = await signedIn(co.emails.client)
    const statuses = await Promise.all(Array.from({ length: 30 }, () => upload(client, raceTankId)))
    const stored = statuses.filter(s => s === 201).length
    console.log(`[photos] 30 unattached uploads at once on one tank: ${stored} stored, ${statuses.filter(s => s === 429).length} refused, ${pendingRows(raceTankId)} rows`)
    expect(statuses.every(s => s === 201 || s === 429)).toBe(true)
    expect(stored).toBe(20)
    expect(pendingRows(raceTankId)).toBe(20)
  })
})
