import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import sharp from 'sharp'
import { startFakeObjectStore, type FakeObjectStore } from '../../scripts/fake-object-store'
import { ApiClient } from '../support/http'
import { startOwnServer, type OwnServer } from '../support/own-server'
import type { PlanView, UploadView } from '../../shared/types/plan'

// Uploads through S3-compatible object storage: the real unstorage s3 driver against the
// project's local fake of the service, selected by configuration alone.
let store: FakeObjectStore
let own: OwnServer

beforeAll(async () => {
  store = await startFakeObjectStore()
  own = await startOwnServer({
    NUXT_UPLOADS_DRIVER: 's3',
    NUXT_UPLOADS_S3_ENDPOINT: store.url,
    NUXT_UPLOADS_S3_BUCKET: 'tidewright-uploads',
    NUXT_UPLOADS_S3_REGION: 'local-1',
    NUXT_UPLOADS_S3_ACCESS_KEY_ID: 'test-key',
    NUXT_UPLOADS_S3_SECRET_ACCESS_KEY: 'test-secret',
  })
})

afterAll(async () => {
  await own?.cleanup()
  await store?.stop()
})

describe('uploads on S3-compatible storage', () => {
  it('stores the photo and its thumbnail as objects and serves them back through the checked route', async () => {
    const api = await new ApiClient(own.server.baseURL).signIn('aquarist@tidewright.test')
    const tankId = own.fixtures.demo.tanks.lobby
    const stageId = (await api.get<PlanView>(`/api/tanks/${tankId}/stages`)).body.stages[1]!.id
    const png = await sharp({ create: { width: 800, height: 600, channels: 3, background: '#0f6a73' } }).png().toBuffer()
    const form = new FormData()
    form.append('file', new Blob([png]), 'leak-test.png')
    const response = await fetch(`${own.server.baseURL}/api/tanks/${tankId}/stages/${stageId}/uploads`, { method: 'POST', body: form, headers: { cookie: api.cookieHeader() } })
    expect(response.status).toBe(201)
    const view = await response.json() as UploadView

    const keys = [...store.objects.keys()]
    expect(keys.every(k => k.startsWith('tidewright-uploads/'))).toBe(true)
    const original = keys.find(k => k.endsWith(view.id))
    expect(original, keys.join(', ')).toBeDefined()
    expect(store.objects.get(original!)!.equals(png)).toBe(true)
    expect(keys.some(k => k.endsWith(`${view.id}.thumb`))).toBe(true)

    const served = await fetch(`${own.server.baseURL}/api/uploads/${view.id}`, { headers: { cookie: api.cookieHeader() } })
    expect(served.status).toBe(200)
    expect(Buffer.from(await served.arrayBuffer()).equals(png)).toBe(true)
    const outsider = await new ApiClient(own.server.baseURL).signIn('client2@tidewright.test')
    expect((await outsider.get(`/api/uploads/${view.id}`)).status).toBe(404)
  })

  it('refuses to start when the object store is chosen but not configured', async () => {
    await expect(startOwnServer({ NUXT_UPLOADS_DRIVER: 's3', NUXT_UPLOADS_S3_ENDPOINT: store.url })).rejects.toThrow(/NUXT_UPLOADS_S3_BUCKET/)
  })
})
