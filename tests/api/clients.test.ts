import { beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedIn } from '../support/http'
import { auditRows, seedScratchCompany, type ScratchCompany } from '../support/company'
import type { ClientList, ClientView, SiteView, StaffMember } from '../../shared/types/clients'
import type { ListOf } from '../../shared/types/list'

const { demo, other } = inject('fixtures')
let co: ScratchCompany
beforeAll(async () => { co = await seedScratchCompany('clients') })

describe('clients', () => {
  it('an aquarist creates, edits, archives and restores a client, each change audited', async () => {
    const api = await signedIn(co.emails.aquarist)
    const created = await api.post<ClientView>('/api/clients', { name: '  Perpetua Vance ', email: 'P.Vance@Example.test', phone: '+1 555 0100' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ name: 'Perpetua Vance', email: 'p.vance@example.test', tankCount: 0, sites: [] })
    const id = created.body.id
    const patched = await api.patch<ClientView>(`/api/clients/${id}`, { phone: '+1 555 0199', notes: 'Prefers mornings' })
    expect(patched.body).toMatchObject({ phone: '+1 555 0199', notes: 'Prefers mornings', email: 'p.vance@example.test' })
    const archived = await api.post<ClientView>(`/api/clients/${id}/archive`, {})
    expect(archived.body.archivedAt).not.toBeNull()
    const list = await api.get<ClientList>('/api/clients?q=Vance')
    expect(list.body.items).toEqual([])
    const archivedList = await api.get<ClientList>('/api/clients?q=Vance&archived=true')
    expect(archivedList.body.items.map(c => c.id)).toEqual([id])
    const restored = await api.post<ClientView>(`/api/clients/${id}/archive`, { archived: false })
    expect(restored.body.archivedAt).toBeNull()
    const read = await (await signedIn(co.emails.supervisor)).get<ClientView>(`/api/clients/${id}`)
    expect(read.status).toBe(200)
    expect(read.body).toMatchObject({ id, name: 'Perpetua Vance', phone: '+1 555 0199', archivedAt: null })
    const badArchive = await api.post(`/api/clients/${id}/archive`, { archived: 'yes' })
    expect(badArchive.status).toBe(400)
    expect(badArchive.body.data.issues[0].field).toBe('archived')
    const log = auditRows(id)
    expect(log.map(r => r.action)).toEqual(['client.create', 'client.update', 'client.archive', 'client.restore'])
    expect(log[1]).toMatchObject({ actorId: co.ids.aquarist, before: { phone: '+1 555 0100' }, after: { phone: '+1 555 0199' } })
  })

  it('lists, searches, sorts and pages on the server within the company only', async () => {
    const api = await signedIn(co.emails.supervisor)
    const all = await api.get<ClientList>('/api/clients?sort=name&dir=asc&pageSize=1')
    expect(all.status).toBe(200)
    expect(all.body.total).toBeGreaterThanOrEqual(2)
    expect(all.body.items).toHaveLength(1)
    const page2 = await api.get<ClientList>('/api/clients?sort=name&dir=asc&pageSize=1&page=2')
    expect(page2.body.items[0]!.name.localeCompare(all.body.items[0]!.name)).toBeGreaterThan(0)
    const search = await api.get<ClientList>('/api/clients?q=Second%20client')
    expect(search.body.items.map(c => c.id)).toEqual([co.otherClientId])
    const demoList = await (await signedIn('aquarist@tidewright.test')).get<ClientList>('/api/clients?pageSize=100')
    expect(demoList.body.items.some(c => c.id === co.clientId)).toBe(false)
    expect(demoList.body.items.find(c => c.id === demo.clients.lowe)).toMatchObject({ tankCount: 2, siteCount: 2 })
  })

  it('refuses bad input with 400 and field messages, without echoing it', async () => {
    const api = await signedIn(co.emails.admin)
    const response = await api.post('/api/clients', { name: '', email: 'not-an-address<script>' })
    expect(response.status).toBe(400)
    const fields = response.body.data.issues.map((i: { field: string }) => i.field)
    expect(fields).toContain('name')
    expect(fields).toContain('email')
    expect(JSON.stringify(response.body)).not.toContain('<script>')
    expect((await api.get('/api/clients?pageSize=500')).status).toBe(400)
    expect((await api.patch(`/api/clients/${co.clientId}`, { name: 'x'.repeat(500) })).status).toBe(400)
  })

  it('is 404 for another company\'s client, 403 for the wrong role, 401 signed out', async () => {
    const api = await signedIn(co.emails.aquarist)
    expect((await api.get(`/api/clients/${demo.clients.lowe}`)).status).toBe(404)
    expect((await api.patch(`/api/clients/${demo.clients.lowe}`, { name: 'Taken' })).status).toBe(404)
    expect((await api.post(`/api/clients/${demo.clients.lowe}/archive`, {})).status).toBe(404)
    const client = await signedIn(co.emails.client)
    expect((await client.get('/api/clients')).status).toBe(403)
    expect((await client.post('/api/clients', { name: 'Me' })).status).toBe(403)
    const supervisor = await signedIn(co.emails.supervisor)
    expect((await supervisor.post('/api/clients', { name: 'Not mine to add' })).status).toBe(403)
    expect((await new ApiClient().get('/api/clients')).status).toBe(401)
  })
})

describe('sites', () => {
  it('adds, edits and archives a client\'s site', async () => {
    const api = await signedIn(co.emails.aquarist)
    const created = await api.post<SiteView>(`/api/clients/${co.otherClientId}/sites`, { label: 'Harbour office', address: '2 Quay Row', roomNotes: 'Concrete slab', accessNotes: 'Badge at desk' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ clientId: co.otherClientId, label: 'Harbour office', roomNotes: 'Concrete slab' })
    const patched = await api.patch<SiteView>(`/api/sites/${created.body.id}`, { accessNotes: null, roomNotes: 'Slab, second floor' })
    expect(patched.body).toMatchObject({ accessNotes: null, roomNotes: 'Slab, second floor' })
    const archived = await api.post<SiteView>(`/api/sites/${created.body.id}/archive`, {})
    expect(archived.body.archivedAt).not.toBeNull()
    const listed = await api.get<ListOf<SiteView>>(`/api/clients/${co.otherClientId}/sites`)
    expect(listed.body.items.map(s => s.id)).toContain(created.body.id)
    expect(auditRows(created.body.id).map(r => r.action)).toEqual(['site.create', 'site.update', 'site.archive'])
  })

  it('validates, scopes and checks roles', async () => {
    const api = await signedIn(co.emails.aquarist)
    const bad = await api.post(`/api/clients/${co.clientId}/sites`, { label: '   ' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].field).toBe('label')
    expect((await api.post(`/api/clients/${demo.clients.lowe}/sites`, { label: 'Sneaky' })).status).toBe(404)
    const otherAquarist = await signedIn('aquarist@other-company.test')
    expect((await otherAquarist.patch(`/api/sites/${co.siteId}`, { label: 'Taken' })).status).toBe(404)
    expect((await otherAquarist.get(`/api/clients/${co.clientId}/sites`)).status).toBe(404)
    const client = await signedIn(co.emails.client)
    expect((await client.patch(`/api/sites/${co.siteId}`, { label: 'Mine now' })).status).toBe(403)
    expect((await client.post(`/api/sites/${co.siteId}/archive`, {})).status).toBe(403)
    expect((await otherAquarist.post(`/api/sites/${co.siteId}/archive`, {})).status).toBe(404)
    expect((await api.patch('/api/sites/not-an-id', { label: 'x' })).status).toBe(400)
    expect(other.organisationId).not.toBe(co.organisationId)
  })
})

describe('GET /api/staff', () => {
  it('lists the company\'s staff for the pickers, not clients and not another company', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { status, body } = await api.get<ListOf<StaffMember>>('/api/staff')
    expect(status).toBe(200)
    expect(body.items.map(s => s.id).sort()).toEqual([co.ids.admin, co.ids.aquarist, co.ids.supervisor].sort())
    expect((await (await signedIn(co.emails.client)).get('/api/staff')).status).toBe(403)
    expect((await new ApiClient().get('/api/staff')).status).toBe(401)
  })
})
