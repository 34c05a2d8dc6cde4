/**
 * The lock of a signed tank for an entry dated after the decision: it stays locked when the
 * engine input the decision was made from holds it (saved before the decision, dated after it),
 * and changes freely when it does not (saved after). Asked through the real server on a real
 * SQLite file, on a scratch company's copy of the demo nano (its cycle complete).
 */
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { FUTURE_SKEW_MS } from '../../shared/readings/entry'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { readings } from '../../server/db/schema'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { signedIn } from '../support/http'
import { copyTank } from '../support/sign-off-tanks'

const { demo } = inject('fixtures')
let db: TidewrightDB
let company: ScratchCompany
let tank: string

/** A clean test dated a minute short of the furthest ahead a save accepts: after a decision made meanwhile. */
const cleanTestAhead = () => ({
  takenAt: new Date(Date.now() + FUTURE_SKEW_MS - 60_000).toISOString(), ammonia: 0, nitrite: 0, nitrate: 10, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' },
  pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
})

beforeAll(async () => {
  company = await seedScratchCompany('signed-input-lock')
  db = openDatabase(inject('dbPath'))
  tank = copyTank(db, demo.tanks.nano, 'Signed input nano', {
    organisationId: company.organisationId, clientId: company.clientId, siteId: null,
    aquaristId: company.ids.aquarist, supervisorId: company.ids.supervisor, status: 'cycling',
  })
})
afterAll(() => db?.$client.close())

describe('the lock of an entry dated after the decision', () => {
  it('refuses to change a test the signed input holds, and lets one saved after the decision change', async () => {
    const aquarist = await signedIn(company.emails.aquarist)
    const supervisor = await signedIn(company.emails.supervisor)
    // Saved before the decision, dated after it: the signed input holds it.
    const before = await aquarist.post<{ reading: { id: string, takenAt: string } }>(`/api/tanks/${tank}/readings`, cleanTestAhead())
    expect(before.status, JSON.stringify(before.body).slice(0, 300)).toBe(201)
    const heldId = before.body.reading.id
    expect((await aquarist.post(`/api/tanks/${tank}/sign-off-requests`, { note: 'Zero for a week' })).status).toBe(201)
    const decision = await supervisor.post<{ decidedAt: string }>(`/api/tanks/${tank}/sign-off/decision`, { decision: 'approve' })
    expect(decision.status, JSON.stringify(decision.body).slice(0, 300)).toBe(200)
    expect(Date.parse(before.body.reading.takenAt)).toBeGreaterThan(Date.parse(decision.body.decidedAt))

    const held = await aquarist.patch(`/api/tanks/${tank}/readings/${heldId}`, { nitrate: 12 })
    expect(held.status).toBe(409)
    expect(held.body.statusMessage).toMatch(/signed off on .* can no longer be changed/)
    expect((await aquarist.request('DELETE', `/api/tanks/${tank}/readings/${heldId}`)).status).toBe(409)
    expect(db.select({ nitrateN: readings.nitrateN }).from(readings).where(eq(readings.id, heldId)).get()).toEqual({ nitrateN: 10 })

    // Saved after the decision: not in what was signed.
    const later = await aquarist.post<{ reading: { id: string } }>(`/api/tanks/${tank}/readings`, cleanTestAhead())
    expect(later.status, JSON.stringify(later.body).slice(0, 300)).toBe(201)
    const edited = await aquarist.patch(`/api/tanks/${tank}/readings/${later.body.reading.id}`, { nitrate: 12 })
    expect(edited.status, JSON.stringify(edited.body).slice(0, 300)).toBe(200)
    expect((await aquarist.request('DELETE', `/api/tanks/${tank}/readings/${later.body.reading.id}`)).status).toBe(204)
  })
})
