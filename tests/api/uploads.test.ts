import { existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import sharp from 'sharp'
import { ApiClient, signedIn } from '../support/http'
import { auditRows, seedScratchCompany, type ScratchCompany } from '../support/company'
import type { TankView } from '../../shared/types/tanks'
import type { PlanView, UploadView } from '../../shared/types/plan'

let co: ScratchCompany
let tankId: string
let stageId: string
let png: Buffer
let pdf: Buffer

beforeAll(async () => {
  co = await seedScratchCompany('uploads')
  const api = await signedIn(co.emails.aquarist)
  const { body } = await api.post<TankView>('/api/tanks', { name: 'Photo reef', clientId: co.clientId, shape: 'cube', dimensions: { sideMm: 500 } })
  tankId = body.id
  stageId = (await api.get<PlanView>(`/api/tanks/${tankId}/stages`)).body.stages[1]!.id
  png = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: '#16808a' } }).png().toBuffer()
  pdf = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n')
})

async function upload(api: ApiClient, bytes: Buffer, name: string, path = `/api/tanks/${tankId}/stages/${stageId}/uploads`) {
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(bytes)]), name)
  const response = await fetch(`${api.baseURL}${path}`, { method: 'POST', body: form, headers: { cookie: api.cookieHeader() } })
  const text = await response.text()
  return { status: response.status, body: text ? JSON.parse(text) : null }
}

describe('stage uploads', () => {
  it('stores a photo with a thumbnail, lists it on the stage and serves it only to people who may see the tank', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { status, body } = await upload(api, png, 'leak test.png')
    expect(status).toBe(201)
    const view = body as UploadView
    expect(view).toMatchObject({ mimeType: 'image/png', sizeBytes: png.length, originalName: 'leak test.png', hasThumbnail: true })
    const plan = await api.get<PlanView>(`/api/tanks/${tankId}/stages`)
    expect(plan.body.stages[1]!.uploads.map(u => u.id)).toEqual([view.id])
    // Stored by the fs driver under NUXT_UPLOADS_DIR (the test run's temporary directory), not under public/.
    const stored = join(dirname(inject('dbPath')), 'uploads', co.organisationId, tankId, view.id)
    expect(existsSync(stored)).toBe(true)
    expect(existsSync(`${stored}.thumb`)).toBe(true)
    const client = await signedIn(co.emails.client)
    const original = await client.request('GET', `/api/uploads/${view.id}`)
    expect(original.status).toBe(200)
    expect(original.headers.get('content-type')).toBe('image/png')
    expect(original.headers.get('x-content-type-options')).toBe('nosniff')
    const thumb = await fetch(`${api.baseURL}/api/uploads/${view.id}/thumbnail`, { headers: { cookie: client.cookieHeader() } })
    expect(thumb.status).toBe(200)
    expect(thumb.headers.get('content-type')).toBe('image/webp')
    const meta = await sharp(Buffer.from(await thumb.arrayBuffer())).metadata()
    expect(Math.max(meta.width!, meta.height!)).toBe(480)
    for (const email of [co.emails.otherClient, 'aquarist@other-company.test', 'client@tidewright.test']) {
      const outsider = await signedIn(email)
      expect((await outsider.get(`/api/uploads/${view.id}`)).status, email).toBe(404)
      expect((await outsider.get(`/api/uploads/${view.id}/thumbnail`)).status, email).toBe(404)
    }
    expect((await new ApiClient().get(`/api/uploads/${view.id}`)).status).toBe(401)
    expect((await client.get('/api/uploads/..%2F..%2Fetc%2Fpasswd')).status).toBe(400)
    expect(auditRows(view.id).map(r => r.action)).toEqual(['upload.create'])
  })

  it('accepts a PDF, without a thumbnail', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { status, body } = await upload(api, pdf, 'floor-report.pdf')
    expect(status).toBe(201)
    expect(body).toMatchObject({ mimeType: 'application/pdf', hasThumbnail: false })
    expect((await api.get(`/api/uploads/${body.id}/thumbnail`)).status).toBe(404)
  })

  it('refuses a file whose extension lies about its content, and content of no accepted type', async () => {
    const api = await signedIn(co.emails.aquarist)
    const lying = await upload(api, pdf, 'holiday.jpg')
    expect(lying.status).toBe(415)
    expect(lying.body.data.issues[0]).toEqual({ field: 'file', message: expect.stringContaining('named .jpg but its content is a PDF document') })
    const script = await upload(api, Buffer.from('#!/bin/sh\necho hello\n'), 'photo.png')
    expect(script.status).toBe(415)
    expect(script.body.data.issues[0].message).toContain('Only JPEG, PNG or WebP')
    // Right magic bytes, broken image: refused rather than stored.
    const broken = await upload(api, Buffer.concat([png.subarray(0, 40), Buffer.alloc(200)]), 'broken.png')
    expect(broken.status).toBe(415)
    const plan = await api.get<PlanView>(`/api/tanks/${tankId}/stages`)
    expect(plan.body.stages[1]!.uploads.map(u => u.originalName)).not.toContain('holiday.jpg')
  })

  it('refuses a file over 10 MB with 413', async () => {
    const api = await signedIn(co.emails.aquarist)
    const big = Buffer.concat([png, Buffer.alloc(10 * 1024 * 1024 + 1 - png.length)])
    const response = await upload(api, big, 'huge.png')
    expect(response.status, JSON.stringify(response.body)).toBe(413)
    expect(response.body.data.issues[0].message).toContain('10 MB')
  })

  it('names the file and its 10 MB limit when the whole body is past the upload route\'s limit', async () => {
    const api = await signedIn(co.emails.aquarist)
    // 11 MB: refused while the body is read, before the upload route sees it; the form still puts the answer beside the file.
    const huge = Buffer.concat([png, Buffer.alloc(11 * 1024 * 1024 - png.length)])
    const response = await upload(api, huge, 'huge.png')
    expect(response.status, JSON.stringify(response.body)).toBe(413)
    expect(response.body.data.issues).toEqual([{ field: 'file', message: 'Files are at most 10 MB.' }])
  })

  it('is 400 without a file, 403 for a client or supervisor, 404 for another company\'s tank', async () => {
    const api = await signedIn(co.emails.aquarist)
    const empty = await fetch(`${api.baseURL}/api/tanks/${tankId}/stages/${stageId}/uploads`, { method: 'POST', body: new FormData(), headers: { cookie: api.cookieHeader() } })
    expect(empty.status).toBe(400)
    expect((await upload(await signedIn(co.emails.client), png, 'a.png')).status).toBe(403)
    expect((await upload(await signedIn(co.emails.supervisor), png, 'a.png')).status).toBe(403)
    expect((await upload(await signedIn('aquarist@other-company.test'), png, 'a.png')).status).toBe(404)
  })
})

describe('removing an upload', () => {
  it('only whoever added a file removes it: the row, the bytes and the listing go, with an audit line', async () => {
    const aquarist = await signedIn(co.emails.aquarist)
    const { status, body } = await upload(aquarist, png, 'wrong stage.png')
    expect(status).toBe(201)
    const view = body as UploadView
    expect(view.uploadedById).toBe(co.ids.aquarist)
    const stored = join(dirname(inject('dbPath')), 'uploads', co.organisationId, tankId, view.id)
    expect(existsSync(stored)).toBe(true)

    // The admin and the client see the tank but did not add the file.
    for (const who of [co.emails.admin, co.emails.client]) {
      const refused = await (await signedIn(who)).delete(`/api/uploads/${view.id}`)
      expect(refused.status).toBe(403)
    }
    expect((await aquarist.get(`/api/uploads/${view.id}`)).status).toBe(200)

    expect((await aquarist.delete(`/api/uploads/${view.id}`)).status).toBe(204)
    expect((await aquarist.get(`/api/uploads/${view.id}`)).status).toBe(404)
    expect(existsSync(stored)).toBe(false)
    const plan = await aquarist.get<PlanView>(`/api/tanks/${tankId}/stages`)
    expect(plan.body.stages[1]!.uploads.map(u => u.id)).not.toContain(view.id)
    const audit = auditRows(view.id)
    expect(audit.map(r => r.action)).toEqual(['upload.create', 'upload.delete'])
    expect(audit[1]).toMatchObject({ actorId: co.ids.aquarist, before: { originalName: 'wrong stage.png' } })
    // Gone is gone: a second removal finds nothing.
    expect((await aquarist.delete(`/api/uploads/${view.id}`)).status).toBe(404)
  })
})
