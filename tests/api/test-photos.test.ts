import { beforeAll, describe, expect, it } from 'vitest'
import sharp from 'sharp'
import type { ApiClient } from '../support/http'
import { signedIn } from '../support/http'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import type { PlanView, UploadView } from '../../shared/types/plan'
import type { ReadingSaved } from '../../shared/types/readings'
import type { TankView } from '../../shared/types/tanks'

let co: ScratchCompany
let tankId: string
let stageId: string
let png: Buffer

beforeAll(async () => {
  co = await seedScratchCompany('test-photos')
  const aquarist = await signedIn(co.emails.aquarist)
  const { body } = await aquarist.post<TankView>('/api/tanks', { name: 'Test strip reef', clientId: co.clientId, shape: 'cube', dimensions: { sideMm: 450 } })
  tankId = body.id
  stageId = (await aquarist.get<PlanView>(`/api/tanks/${tankId}/stages`)).body.stages[1]!.id
  png = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#e7dcc6' } }).png().toBuffer()
})

async function send(api: ApiClient, path: string, bytes: Buffer, name: string) {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(bytes)]), name)
  const response = await fetch(`${api.baseURL}${path}`, { method: 'POST', body: form, headers: { cookie: api.cookieHeader() } })
  return { status: response.status, body: await response.json() as UploadView & { data?: { issues?: { field: string }[] } } }
}

const READING = (photoUploadId?: string) => ({
  takenAt: new Date(Date.now() - 600_000).toISOString(), ammonia: 0.25, nitrite: 0, nitrate: 5,
  basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
  photoUploadId,
})

describe('a photo of the test with the reading', () => {
  it('lets the client store a photo, name it in the reading, and see it served back', async () => {
    const client = await signedIn(co.emails.client)
    const photo = await send(client, `/api/tanks/${tankId}/test-photos`, png, 'strip.png')
    expect(photo.status).toBe(201)
    expect(photo.body).toMatchObject({ mimeType: 'image/png', sizeBytes: png.length, hasThumbnail: true })
    const saved = await client.post<ReadingSaved>(`/api/tanks/${tankId}/readings`, READING(photo.body.id))
    expect(saved.status).toBe(201)
    const served = await fetch(`${client.baseURL}/api/uploads/${photo.body.id}`, { headers: { cookie: client.cookieHeader() } })
    expect(served.status).toBe(200)
    expect(Buffer.from(await served.arrayBuffer()).equals(png)).toBe(true)
    // Used once: a second reading cannot claim the same photo.
    const again = await client.post(`/api/tanks/${tankId}/readings`, READING(photo.body.id))
    expect(again.status).toBe(400)
    expect(again.body.data.issues.map((i: { field: string }) => i.field)).toContain('photoUploadId')
  })

  it('refuses a stage photo, lying files, and people outside the tank', async () => {
    const aquarist = await signedIn(co.emails.aquarist)
    const stagePhoto = await send(aquarist, `/api/tanks/${tankId}/stages/${stageId}/uploads`, png, 'stage.png')
    expect(stagePhoto.status).toBe(201)
    expect((await aquarist.post(`/api/tanks/${tankId}/readings`, READING(stagePhoto.body.id))).status).toBe(400)
    expect((await send(aquarist, `/api/tanks/${tankId}/test-photos`, Buffer.from('#!/bin/sh\n'), 'strip.png')).status).toBe(415)
    expect((await send(await signedIn(co.emails.supervisor), `/api/tanks/${tankId}/test-photos`, png, 'a.png')).status).toBe(403)
    expect((await send(await signedIn(co.emails.otherClient), `/api/tanks/${tankId}/test-photos`, png, 'a.png')).status).toBe(404)
    expect((await send(await signedIn('aquarist@other-company.test'), `/api/tanks/${tankId}/test-photos`, png, 'a.png')).status).toBe(404)
  })
})
