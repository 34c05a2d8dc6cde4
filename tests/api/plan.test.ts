import { beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedIn } from '../support/http'
import { auditRows, seedScratchCompany, type ScratchCompany } from '../support/company'
import type { TankView } from '../../shared/types/tanks'
import type { PlanTemplateView, PlanView } from '../../shared/types/plan'
import { DEFAULT_PLAN_TEMPLATE } from '../../shared/plan/default-template'

const { demo, other } = inject('fixtures')
let co: ScratchCompany
beforeAll(async () => { co = await seedScratchCompany('plan') })

async function newTank(api: ApiClient, name = 'Plan reef') {
  const { body } = await api.post<TankView>('/api/tanks', {
    name, clientId: co.clientId, shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 450 },
  })
  const plan = await api.get<PlanView>(`/api/tanks/${body.id}/stages`)
  return { tank: body, plan: plan.body }
}

describe('build plan stages', () => {
  it('ticks, notes and finishes a stage with who and when; starting it moves a planned tank to building', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { tank, plan } = await newTank(api)
    const survey = plan.stages[0]!
    const first = survey.checklist[0]!
    const started = await api.patch<PlanView>(`/api/tanks/${tank.id}/stages/${survey.id}`, {
      status: 'in-progress', checklist: [{ id: first.id, done: true }], notes: 'North wall, no direct sun',
      data: { roomUse: 'living-area', shellThicknessMm: 10 },
    })
    expect(started.status).toBe(200)
    const s = started.body.stages[0]!
    expect(s).toMatchObject({ status: 'in-progress', notes: 'North wall, no direct sun', data: { roomUse: 'living-area', shellThicknessMm: 10 } })
    expect(s.checklist[0]).toMatchObject({ done: true, doneBy: co.ids.aquarist, doneByName: expect.stringMatching(/^aquarist /) })
    expect(s.checklist[1]!.done).toBe(false)
    expect((await api.get<TankView>(`/api/tanks/${tank.id}`)).body.status).toBe('building')
    // 900 x 450 x 450 mm filled stands far over 40 psf on its own footprint: closing needs the structural check recorded.
    const unchecked = await api.patch(`/api/tanks/${tank.id}/stages/${survey.id}`, { status: 'done' })
    expect(unchecked.status).toBe(400)
    expect(unchecked.body.data.issues[0]).toMatchObject({ field: 'data.structuralCheckBy', message: expect.stringMatching(/^The footprint load is \d+ % of the design live load/) })
    const done = await api.patch<PlanView>(`/api/tanks/${tank.id}/stages/${survey.id}`, { status: 'done', data: { shellThicknessMm: null, structuralCheckDone: true, structuralCheckBy: 'Ines Halloran, structural engineer' } })
    expect(done.status, JSON.stringify(done.body)).toBe(200)
    expect(done.body.stages[0]).toMatchObject({ status: 'done', completedBy: co.ids.aquarist, data: { roomUse: 'living-area', structuralCheckBy: 'Ines Halloran, structural engineer', structuralCheckRecordedBy: expect.stringMatching(/^aquarist /) } })
    expect(done.body.stages[0]!.completedAt).toEqual(expect.any(String))
    expect(done.body.stages[0]!.data).not.toHaveProperty('shellThicknessMm')
    const log = auditRows(survey.id)
    expect(log.map(r => r.action)).toEqual(['plan-stage.update', 'plan-stage.update'])
    expect(log[1]).toMatchObject({ before: { status: 'in-progress' }, after: { status: 'done' } })
    expect(auditRows(tank.id).map(r => r.action)).toContain('tank.status')
  })

  it('skipping needs a reason; finishing the water fill starts the cycle once', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { tank, plan } = await newTank(api, 'Fill reef')
    const substrate = plan.stages.find(s => s.key === 'substrate')!
    const noReason = await api.patch(`/api/tanks/${tank.id}/stages/${substrate.id}`, { status: 'skipped' })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.issues).toEqual([{ field: 'skipReason', message: 'Say why the stage is skipped.' }])
    const skipped = await api.patch<PlanView>(`/api/tanks/${tank.id}/stages/${substrate.id}`, { status: 'skipped', skipReason: 'Bare-bottom tank' })
    expect(skipped.body.stages.find(s => s.id === substrate.id)).toMatchObject({ status: 'skipped', skipReason: 'Bare-bottom tank' })
    const fill = plan.stages.find(s => s.key === 'water-fill')!
    await api.patch(`/api/tanks/${tank.id}/stages/${fill.id}`, { data: { targetSalinity: 35, temperatureC: 25 } })
    await api.patch(`/api/tanks/${tank.id}/stages/${fill.id}`, { status: 'done' })
    const cycling = (await api.get<TankView>(`/api/tanks/${tank.id}`)).body
    expect(cycling.status).toBe('cycling')
    expect(cycling.cycleStartedAt).toEqual(expect.any(String))
    // Re-opening and finishing again keeps the first start date.
    await api.patch(`/api/tanks/${tank.id}/stages/${fill.id}`, { status: 'in-progress' })
    await api.patch(`/api/tanks/${tank.id}/stages/${fill.id}`, { status: 'done' })
    expect((await api.get<TankView>(`/api/tanks/${tank.id}`)).body).toMatchObject({ status: 'cycling', cycleStartedAt: cycling.cycleStartedAt })
  })

  it('checks stage helper values against the stage\'s own schema', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { tank, plan } = await newTank(api, 'Checked reef')
    const leak = plan.stages.find(s => s.key === 'leak-test')!
    const bad = await api.patch(`/api/tanks/${tank.id}/stages/${leak.id}`, { data: { startedAt: 'yesterday', result: 'maybe', depthMm: 40 } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues.map((i: { field: string }) => i.field)).toEqual(expect.arrayContaining(['data.startedAt', 'data.result']))
    const ok = await api.patch<PlanView>(`/api/tanks/${tank.id}/stages/${leak.id}`, { data: { startedAt: '2026-03-01T09:00:00.000Z', endedAt: '2026-03-02T21:00:00.000Z', result: 'pass' } })
    expect(ok.status, JSON.stringify(ok.body)).toBe(200)
    expect(ok.body.stages.find(s => s.id === leak.id)!.data).toEqual({ startedAt: '2026-03-01T09:00:00.000Z', endedAt: '2026-03-02T21:00:00.000Z', result: 'pass' })
    const ghost = await api.patch(`/api/tanks/${tank.id}/stages/${leak.id}`, { checklist: [{ id: 'not-an-item', done: true }] })
    expect(ghost.status).toBe(400)
    expect(ghost.body.data.issues[0].field).toBe('checklist')
  })

  it('a client reads their own plan (read only), not another client\'s; staff of another company get 404', async () => {
    const api = await signedIn(co.emails.aquarist)
    const { tank, plan } = await newTank(api, 'Shared reef')
    const client = await signedIn(co.emails.client)
    const read = await client.get<PlanView>(`/api/tanks/${tank.id}/stages`)
    expect(read.status).toBe(200)
    expect(read.body.canEdit).toBe(false)
    expect((await client.patch(`/api/tanks/${tank.id}/stages/${plan.stages[0]!.id}`, { notes: 'mine' })).status).toBe(403)
    const otherClient = await signedIn(co.emails.otherClient)
    expect((await otherClient.get(`/api/tanks/${tank.id}/stages`)).status).toBe(404)
    const foreign = await signedIn('aquarist@other-company.test')
    expect((await foreign.get(`/api/tanks/${tank.id}/stages`)).status).toBe(404)
    expect((await foreign.patch(`/api/tanks/${tank.id}/stages/${plan.stages[0]!.id}`, { notes: 'x' })).status).toBe(404)
    // A stage of one tank addressed through another tank is not found.
    const { tank: second } = await newTank(api, 'Second reef')
    expect((await api.patch(`/api/tanks/${second.id}/stages/${plan.stages[0]!.id}`, { notes: 'x' })).status).toBe(404)
    expect((await api.patch(`/api/tanks/${tank.id}/stages/not-a-uuid`, { notes: 'x' })).status).toBe(400)
    expect((await new ApiClient().get(`/api/tanks/${tank.id}/stages`)).status).toBe(401)
    expect(other.tankId).not.toBe(tank.id)
  })

  it('supervisors read but may not change stages', async () => {
    const sup = await signedIn('supervisor@tidewright.test')
    const plan = await sup.get<PlanView>(`/api/tanks/${demo.tanks.lounge}/stages`)
    expect(plan.status).toBe(200)
    expect(plan.body.stages.filter(s => s.status === 'done')).toHaveLength(6)
    expect((await sup.patch(`/api/tanks/${demo.tanks.lounge}/stages/${plan.body.stages[6]!.id}`, { notes: 'x' })).status).toBe(403)
  })
})

describe('plan template', () => {
  it('is the default until the admin replaces it; new tanks then copy the company\'s own', async () => {
    const admin = await signedIn(co.emails.admin)
    const initial = await admin.get<PlanTemplateView>('/api/plan-template')
    expect(initial.body).toMatchObject({ isDefault: true })
    expect(initial.body.stages).toHaveLength(DEFAULT_PLAN_TEMPLATE.length)
    const stages = [
      { key: 'site-survey', title: 'Site visit', checklist: ['Power checked by an electrician'] },
      { key: 'water-fill', title: 'Fill', checklist: [] },
    ]
    const put = await admin.request<PlanTemplateView>('PUT', '/api/plan-template', { stages })
    expect(put.status).toBe(200)
    expect(put.body).toEqual({ isDefault: false, stages })
    const { plan } = await newTank(await signedIn(co.emails.aquarist), 'Template reef')
    expect(plan.stages.map(s => [s.key, s.title, s.checklist.map(i => i.label)])).toEqual([
      ['site-survey', 'Site visit', ['Power checked by an electrician']],
      ['water-fill', 'Fill', []],
    ])
    expect(auditRows(co.organisationId).map(r => r.action)).toContain('plan-template.replace')
    // The demo company's template is untouched.
    const demoTemplate = await (await signedIn('admin@tidewright.test')).get<PlanTemplateView>('/api/plan-template')
    expect(demoTemplate.body.isDefault).toBe(true)
  })

  it('refuses duplicate keys, empty plans and bad keys (400); only an admin may change it (403)', async () => {
    const admin = await signedIn(co.emails.admin)
    const dup = await admin.request('PUT', '/api/plan-template', { stages: [{ key: 'a', title: 'A', checklist: [] }, { key: 'a', title: 'B', checklist: [] }] })
    expect(dup.status).toBe(400)
    expect(dup.body.data.issues[0].field).toBe('stages')
    expect((await admin.request('PUT', '/api/plan-template', { stages: [] })).status).toBe(400)
    const badKey = await admin.request('PUT', '/api/plan-template', { stages: [{ key: 'Has Spaces', title: 'A', checklist: [] }] })
    expect(badKey.body.data.issues[0].field).toBe('stages.0.key')
    const aquarist = await signedIn(co.emails.aquarist)
    expect((await aquarist.request('PUT', '/api/plan-template', { stages: [{ key: 'a', title: 'A', checklist: [] }] })).status).toBe(403)
    expect((await aquarist.get('/api/plan-template')).status).toBe(200)
    expect((await (await signedIn(co.emails.client)).get('/api/plan-template')).status).toBe(403)
  })
})
