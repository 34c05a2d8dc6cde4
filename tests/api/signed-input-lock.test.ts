/**
 * The lock of a signed tank for an entry dated after the decision: it stays locked when the
 * engine input the decision was made from holds it (saved before the decision, dated after it),
 * and changes freely when it does not (saved after). Asked through the real server on a real
 * SQLite file, on a scratch company's copy of the demo nano (its cycle complete).
 */
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { readings } from '../../server/db/schema'
import { computeAndStoreVerdict } from '../../server/db/verdicts'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { signedIn } from '../support/http'
import { copyTank } from '../support/sign-off-tanks'

const { demo } = inject('fixtures')
const DAY = 86_400_000
let db: TidewrightDB
let company: ScratchCompany
let tank: string
/** A clean test saved before the decision but dated a day after it: the signed input holds it. */
let heldId: string

beforeAll(async () => {
  company = await seedScratchCompany('signed-input-lock')
  db = openDatabase(inject('dbPath'))
  tank = copyTank(db, demo.tanks.nano, 'Signed input nano', {
    organisationId: company.organisationId, clientId: company.clientId, siteId: null,
    aquaristId: company.ids.aquarist, supervisorId: company.ids.supervisor, status: 'cycling',
  })
  heldId = db.insert(readings).values({ tankId: tank, takenAt: new Date(Date.now() + DAY).toISOString(), ammoniaN: 0, nitriteN: 0, nitrateN: 10, pH: 8.1, temperatureC: 25.5, salinity: 35 }).returning().get().id
  computeAndStoreVerdict(db, tank, new Date())
})
afterAll(() => db?.$client.close())

describe('the lock of an entry dated after the decision', () => {
  it('refuses to change a test the signed input holds, and lets one saved after the decision change', async () => {
    const aquarist = await signedIn(company.emails.aquarist)
    const supervisor = await signedIn(company.emails.supervisor)
    expect((await aquarist.post(`/api/tanks/${tank}/sign-off-requests`, { note: 'Zero for a week' })).status).toBe(201)
    const decision = await supervisor.post<{ decidedAt: string }>(`/api/tanks/${tank}/sign-off/decision`, { decision: 'approve' })
    expect(decision.status, JSON.stringify(decision.body).slice(0, 300)).toBe(200)
    expect(Date.parse(decision.body.decidedAt)).toBeLessThan(Date.now() + DAY / 2)

    const held = await aquarist.patch(`/api/tanks/${tank}/readings/${heldId}`, { nitrate: 12 })
    expect(held.status).toBe(409)
    expect(held.body.statusMessage).toMatch(/signed off on .* can no longer be changed/)
    expect((await aquarist.request('DELETE', `/api/tanks/${tank}/readings/${heldId}`)).status).toBe(409)
    expect(db.select({ nitrateN: readings.nitrateN }).from(readings).where(eq(readings.id, heldId)).get()).toEqual({ nitrateN: 10 })

    const later = await aquarist.post<{ reading: { id: string } }>(`/api/tanks/${tank}/readings`, {
      takenAt: new Date(Date.now() + 2 * DAY).toISOString(), ammonia: 0, nitrite: 0, nitrate: 10, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' },
      pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
    })
    expect(later.status, JSON.stringify(later.body).slice(0, 300)).toBe(201)
    const edited = await aquarist.patch(`/api/tanks/${tank}/readings/${later.body.reading.id}`, { nitrate: 12 })
    expect(edited.status, JSON.stringify(edited.body).slice(0, 300)).toBe(200)
    expect((await aquarist.request('DELETE', `/api/tanks/${tank}/readings/${later.body.reading.id}`)).status).toBe(204)
  })
})
