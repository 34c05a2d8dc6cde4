/**
 * Commissioning gates on PATCH /api/tanks/:id/stages/:stageId through the real server: a leak
 * test stands at least 24 h before it passes (common practice, no published source: 24-48 h),
 * and a site survey whose footprint load is over the occupancy's design live load (IRC Table
 * R301.5; IBC Table 1607.1 from memory) closes only with the structural check recorded.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { PlanView, StageView } from '../../shared/types/plan'
import type { TankView } from '../../shared/types/tanks'
import { auditRows, seedScratchCompany, type ScratchCompany } from '../support/company'
import { signedIn, type ApiClient } from '../support/http'

let co: ScratchCompany
let api: ApiClient
beforeAll(async () => {
  co = await seedScratchCompany('gates')
  api = await signedIn(co.emails.aquarist)
})

async function stageOf(name: string, key: string, dimensions = { lengthMm: 900, widthMm: 450, heightMm: 450 }): Promise<{ tank: TankView, stage: StageView }> {
  const { body: tank } = await api.post<TankView>('/api/tanks', { name, clientId: co.clientId, shape: 'rectangular', dimensions })
  const plan = await api.get<PlanView>(`/api/tanks/${tank.id}/stages`)
  return { tank, stage: plan.body.stages.find(s => s.key === key)! }
}
const HOUR = 3_600_000
const ago = (hours: number) => new Date(Date.now() - hours * HOUR).toISOString()

describe('leak test', () => {
  it('refuses a pass after 0 hours with a field message, and leaves the stage as it was', async () => {
    const { tank, stage } = await stageOf('Zero-hour reef', 'leak-test')
    const now = ago(0.1)
    const zero = await api.patch(`/api/tanks/${tank.id}/stages/${stage.id}`, { data: { startedAt: now, endedAt: now, result: 'pass' } })
    expect(zero.status).toBe(400)
    expect(zero.body.data.issues).toEqual([{ field: 'data.endedAt', message: 'A leak test stands at least 24 h before it can pass; this one stood 0 h.' }])
    const closing = await api.patch(`/api/tanks/${tank.id}/stages/${stage.id}`, { status: 'done', data: { startedAt: ago(23.9), endedAt: ago(0.1), result: 'pass' } })
    expect(closing.status).toBe(400)
    expect(closing.body.data.issues[0].message).toContain('this one stood 23.8 h')
    const plan = (await api.get<PlanView>(`/api/tanks/${tank.id}/stages`)).body
    expect(plan.stages.find(s => s.id === stage.id)).toMatchObject({ status: 'not-started', data: {} })
    expect(auditRows(stage.id)).toEqual([])
  })

  it('refuses an end before the start, a time in the future, and closing without a pass', async () => {
    const { tank, stage } = await stageOf('Backwards reef', 'leak-test')
    const backwards = await api.patch(`/api/tanks/${tank.id}/stages/${stage.id}`, { data: { startedAt: ago(2), endedAt: ago(30) } })
    expect(backwards.body.data.issues).toEqual([{ field: 'data.endedAt', message: 'The check comes after the fill: enter a later time.' }])
    const future = await api.patch(`/api/tanks/${tank.id}/stages/${stage.id}`, { data: { startedAt: new Date(Date.now() + 48 * HOUR).toISOString() } })
    expect(future.body.data.issues).toEqual([{ field: 'data.startedAt', message: 'The fill time cannot be in the future.' }])
    const noResult = await api.patch(`/api/tanks/${tank.id}/stages/${stage.id}`, { status: 'done', data: { startedAt: ago(30), endedAt: ago(2) } })
    expect(noResult.status).toBe(400)
    expect(noResult.body.data.issues).toEqual([{ field: 'data.result', message: 'The stage is done only once the leak test has passed.' }])
  })

  it('passes and closes after 28 hours with the entered times kept', async () => {
    const { tank, stage } = await stageOf('Day-long reef', 'leak-test')
    const startedAt = ago(30)
    const endedAt = ago(2)
    const done = await api.patch<PlanView>(`/api/tanks/${tank.id}/stages/${stage.id}`, { status: 'done', data: { startedAt, endedAt, result: 'pass' } })
    expect(done.status, JSON.stringify(done.body)).toBe(200)
    expect(done.body.stages.find(s => s.id === stage.id)).toMatchObject({ status: 'done', data: { startedAt, endedAt, result: 'pass' } })
  })
})

describe('site survey over the design load', () => {
  it('closes only with the structural check recorded, by whom; the check is stamped with who recorded it', async () => {
    const { tank, stage } = await stageOf('Heavy reef', 'site-survey')
    const refused = await api.patch(`/api/tanks/${tank.id}/stages/${stage.id}`, { status: 'done', data: { roomUse: 'sleeping-room', structuralCheckDone: true } })
    expect(refused.status).toBe(400)
    expect(refused.body.data.issues[0].field).toBe('data.structuralCheckBy')
    const closed = await api.patch<PlanView>(`/api/tanks/${tank.id}/stages/${stage.id}`, { status: 'done', data: { roomUse: 'sleeping-room', structuralCheckDone: true, structuralCheckBy: 'Corwin Ashdown, PE' } })
    expect(closed.status).toBe(200)
    const data = closed.body.stages.find(s => s.id === stage.id)!.data
    expect(data).toMatchObject({ structuralCheckDone: true, structuralCheckBy: 'Corwin Ashdown, PE', structuralCheckRecordedBy: expect.any(String), structuralCheckRecordedAt: expect.any(String) })
  })

  it('a small tank on a shop\'s first floor (100 psf) is under the design load and closes without one', async () => {
    // 300 x 300 x 300 mm: about 28 kg of water and 11 kg of glass on 0.09 m2, roughly 90 psf: over 40 psf at home, under 100 psf in a shop.
    const { tank, stage } = await stageOf('Counter nano', 'site-survey', { lengthMm: 300, widthMm: 300, heightMm: 300 })
    const home = await api.patch(`/api/tanks/${tank.id}/stages/${stage.id}`, { status: 'done', data: { roomUse: 'living-area' } })
    expect(home.status).toBe(400)
    const shop = await api.patch<PlanView>(`/api/tanks/${tank.id}/stages/${stage.id}`, { status: 'done', data: { roomUse: 'retail-first' } })
    expect(shop.status, JSON.stringify(shop.body)).toBe(200)
    const office = await api.patch(`/api/tanks/${tank.id}/stages/${stage.id}`, { data: { roomUse: 'warehouse' } })
    expect(office.status).toBe(400)
    expect(office.body.data.issues[0]).toEqual({ field: 'data.roomUse', message: 'Choose how the room is used.' })
  })
})
