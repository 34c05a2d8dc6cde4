import { beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedIn } from '../support/http'
import { auditRows, seedScratchCompany, type ScratchCompany } from '../support/company'
import type { TankList, TankView } from '../../shared/types/tanks'
import type { PlanView } from '../../shared/types/plan'
import { DEFAULT_PLAN_TEMPLATE } from '../../shared/plan/default-template'

const { demo } = inject('fixtures')
let co: ScratchCompany
beforeAll(async () => { co = await seedScratchCompany('tanks') })

const body = (extra: Record<string, unknown> = {}) => ({
  name: 'Atrium reef', clientId: co.clientId, siteId: co.siteId, shape: 'rectangular',
  dimensions: { lengthMm: 1200, widthMm: 500, heightMm: 550 }, sumpLitres: 120, material: 'glass',
  waterSource: 'mixed', cycleMethod: 'fishless', supervisorId: co.ids.supervisor, ...extra,
})

describe('POST /api/tanks', () => {
  it('creates a tank with a server-computed volume and its own copy of the default plan', async () => {
    const api = await signedIn(co.emails.aquarist)
    const created = await api.post<TankView>('/api/tanks', body({ dimensions: { lengthMm: 1200, widthMm: 500, heightMm: 550, diameterMm: 999 } }))
    expect(created.status).toBe(201)
    // 1.2 m x 0.5 m x 0.55 m = 0.33 m3 = 330 L (arithmetic).
    expect(created.body).toMatchObject({ status: 'planned', volumeLitres: 330, sumpLitres: 120, aquaristId: co.ids.aquarist, supervisorName: expect.stringMatching(/^supervisor /) })
    // Only the dimensions the shape uses are kept.
    expect(created.body.dimensions).toEqual({ lengthMm: 1200, widthMm: 500, heightMm: 550 })
    const plan = await api.get<PlanView>(`/api/tanks/${created.body.id}/stages`)
    expect(plan.body.stages.map(s => s.key)).toEqual(DEFAULT_PLAN_TEMPLATE.map(s => s.key))
    expect(plan.body.stages.every(s => s.status === 'not-started')).toBe(true)
    expect(auditRows(created.body.id)[0]).toMatchObject({ action: 'tank.create', actorId: co.ids.aquarist })
    const list = await api.get<TankList>(`/api/tanks?clientId=${co.clientId}`)
    expect(list.body.items.find(t => t.id === created.body.id)).toMatchObject({ currentStageKey: 'site-survey', stagesDone: 0, stagesTotal: DEFAULT_PLAN_TEMPLATE.length })
  })

  it('computes a cylinder from its diameter (pi r^2 h)', async () => {
    const api = await signedIn(co.emails.admin)
    const created = await api.post<TankView>('/api/tanks', body({ name: 'Column', shape: 'cylinder', dimensions: { diameterMm: 600, heightMm: 1000 }, siteId: null }))
    expect(created.status).toBe(201)
    expect(created.body.volumeLitres).toBeCloseTo(Math.PI * 0.3 * 0.3 * 1 * 1000, 1)
  })

  it('refuses missing dimensions, bad values and foreign references with 400 and field messages', async () => {
    const api = await signedIn(co.emails.aquarist)
    const missing = await api.post('/api/tanks', body({ dimensions: { lengthMm: 1200, widthMm: 500 } }))
    expect(missing.status).toBe(400)
    expect(missing.body.data.issues).toEqual([{ field: 'dimensions.heightMm', message: expect.any(String) }])
    const bad = await api.post('/api/tanks', body({ name: '', shape: 'triangle', sumpLitres: -5 }))
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues.map((i: { field: string }) => i.field)).toEqual(expect.arrayContaining(['name', 'shape', 'sumpLitres']))
    const bow = await api.post('/api/tanks', body({ shape: 'bow-front', dimensions: { lengthMm: 1000, widthMm: 400, heightMm: 500, bowDepthMm: 800 } }))
    expect(bow.status).toBe(400)
    expect(bow.body.data.issues[0].field).toBe('dimensions.bowDepthMm')
    const foreign = await api.post('/api/tanks', body({ clientId: demo.clients.lowe, siteId: null, aquaristId: demo.users.aquarist, supervisorId: co.ids.client }))
    expect(foreign.status).toBe(400)
    expect(foreign.body.data.issues.map((i: { field: string }) => i.field).sort()).toEqual(['aquaristId', 'clientId', 'supervisorId'])
    const wrongSite = await api.post('/api/tanks', body({ clientId: co.otherClientId }))
    expect(wrongSite.body.data.issues).toEqual([{ field: 'siteId', message: expect.any(String) }])
  })

  it('is 403 for supervisors and clients, 401 signed out', async () => {
    expect((await (await signedIn(co.emails.supervisor)).post('/api/tanks', body())).status).toBe(403)
    expect((await (await signedIn(co.emails.client)).post('/api/tanks', body())).status).toBe(403)
    expect((await new ApiClient().post('/api/tanks', body())).status).toBe(401)
  })
})

describe('PATCH /api/tanks/:id', () => {
  it('edits the profile, recomputes the volume and audits before and after', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { body: tank } = await api.post<TankView>('/api/tanks', body({ name: 'Hall cube', shape: 'cube', dimensions: { sideMm: 600 } }))
    expect(tank.volumeLitres).toBe(216)
    const patched = await api.patch<TankView>(`/api/tanks/${tank.id}`, { name: 'Hall cube (larger)', shape: 'cube', dimensions: { sideMm: 700 }, cycleMethod: 'fish-in', material: 'acrylic' })
    expect(patched.status).toBe(200)
    expect(patched.body).toMatchObject({ name: 'Hall cube (larger)', volumeLitres: 343, cycleMethod: 'fish-in', material: 'acrylic' })
    const log = auditRows(tank.id)
    expect(log.at(-1)).toMatchObject({ action: 'tank.update', before: { volumeLitres: 216 }, after: { volumeLitres: 343 } })
  })

  it('moves a tank to another client and drops the old client\'s site', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { body: tank } = await api.post<TankView>('/api/tanks', body({ name: 'Movable' }))
    const moved = await api.patch<TankView>(`/api/tanks/${tank.id}`, { clientId: co.otherClientId })
    expect(moved.body).toMatchObject({ clientId: co.otherClientId, siteLabel: null })
  })

  it('refuses a shape without dimensions (400), another company\'s tank (404), and the wrong role (403)', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { body: tank } = await api.post<TankView>('/api/tanks', body({ name: 'Guarded' }))
    const halves = await api.patch(`/api/tanks/${tank.id}`, { shape: 'cube' })
    expect(halves.status).toBe(400)
    expect(halves.body.data.issues[0].field).toBe('dimensions')
    expect((await api.patch(`/api/tanks/${demo.tanks.lounge}`, { name: 'Taken' })).status).toBe(404)
    expect((await (await signedIn(co.emails.supervisor)).patch(`/api/tanks/${tank.id}`, { name: 'No' })).status).toBe(403)
    expect((await (await signedIn(co.emails.client)).patch(`/api/tanks/${tank.id}`, { name: 'No' })).status).toBe(403)
  })
})

describe('GET /api/tanks with plan stages', () => {
  it('filters and sorts by the current stage', async () => {
    const api = await signedIn('supervisor@tidewright.test')
    const leak = await api.get<TankList>('/api/tanks?stage=leak-test')
    expect(leak.status).toBe(200)
    // The demo lobby tank has finished its site survey only.
    expect(leak.body.items.map(t => t.id)).toEqual([demo.tanks.lobby])
    expect(leak.body.items[0]).toMatchObject({ currentStageKey: 'leak-test', currentStageTitle: 'Leak test', stagesDone: 1 })
    const sorted = await api.get<TankList>('/api/tanks?sort=stage&dir=asc')
    const done = sorted.body.items.map(t => t.stagesDone)
    expect(done).toEqual([...done].sort((a, b) => a - b))
    expect((await api.get('/api/tanks?stage=Leak%20Test')).status).toBe(400)
  })
})
