/**
 * What was signed stays signed: the certificate and the verification page print the
 * tank's facts as they stood at the decision. After sign-off the signed facts change only
 * with a written amendment (which the certificate shows) or by reopening; stages finished
 * in the signed record and entries held in its snapshot stay locked whatever their date.
 */
import { execFileSync } from 'node:child_process'
import { desc, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { clients, planStages, readings, signOffs, tanks } from '../../server/db/schema'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { ApiClient } from '../support/http'
import { copyTank } from '../support/sign-off-tanks'

const pdfText = (bytes: Buffer) => execFileSync('pdftotext', ['-layout', '-', '-'], { input: bytes }).toString('utf8')

async function certificateText(api: ApiClient, tankId: string): Promise<string> {
  const response = await fetch(`${api.baseURL}/api/tanks/${tankId}/certificate.pdf`, { headers: { cookie: api.cookieHeader() } })
  expect(response.status).toBe(200)
  return pdfText(Buffer.from(await response.arrayBuffer()))
}

let db: TidewrightDB
let company: ScratchCompany
let tankId: string
let aquarist: ApiClient
let supervisor: ApiClient
let code: string

beforeAll(async () => {
  db = openDatabase(inject('dbPath'))
  company = await seedScratchCompany('signed-record')
  // A copy of the demo nano, whose cycle the engine judges complete.
  tankId = copyTank(db, inject('fixtures').demo.tanks.nano, 'Heron Quay reef', {
    organisationId: company.organisationId, clientId: company.clientId, siteId: company.siteId,
    aquaristId: company.ids.aquarist, supervisorId: company.ids.supervisor,
  })
  const stages = db.select().from(planStages).where(eq(planStages.tankId, inject('fixtures').demo.tanks.nano)).all()
  db.insert(planStages).values(stages.map(({ id: _id, createdAt: _c, updatedAt: _u, tankId: _t, completedBy: _b, ...s }) => ({ ...s, tankId }))).run()
  aquarist = await new ApiClient().signIn(company.emails.aquarist)
  supervisor = await new ApiClient().signIn(company.emails.supervisor)
  expect((await aquarist.post(`/api/tanks/${tankId}/sign-off-requests`, { note: 'Zero for a week' })).status).toBe(201)
  const decided = await supervisor.post(`/api/tanks/${tankId}/sign-off/decision`, { decision: 'approve', note: 'Evidence is clear' })
  expect(decided.status).toBe(200)
  code = db.select({ code: signOffs.verificationCode }).from(signOffs).where(eq(signOffs.tankId, tankId)).get()!.code!
})
afterAll(() => db?.$client.close())

describe('the certificate after sign-off', () => {
  it('prints the facts as signed even when the client record and the tank\'s people change', async () => {
    const before = await certificateText(aquarist, tankId)
    expect(before).toContain('Heron Quay reef')
    expect(before).toContain('91 L')
    const clientName = db.select({ name: clients.name }).from(clients).where(eq(clients.id, company.clientId)).get()!.name
    expect(before).toContain(clientName)
    // Things any company may still change after sign-off: the client's name, the tank's aquarist.
    expect((await aquarist.patch(`/api/clients/${company.clientId}`, { name: 'Renamed Client Ltd' })).status).toBe(200)
    expect((await aquarist.patch(`/api/tanks/${tankId}`, { material: 'acrylic' })).status).toBe(200)
    db.update(tanks).set({ aquaristId: company.ids.admin }).where(eq(tanks.id, tankId)).run()
    const after = await certificateText(aquarist, tankId)
    expect(after).toBe(before)
  })

  it('prints the final tests of the input the decision was made from, whatever the live tank holds since', async () => {
    const before = await certificateText(aquarist, tankId)
    expect(before).toContain('Final tests')
    expect(before).not.toContain('No tests recorded.')
    // A test saved after the decision, and the signed one before it changed behind the lock's back.
    const saved = await aquarist.post(`/api/tanks/${tankId}/readings`, { takenAt: new Date().toISOString(), ammonia: 0.75, nitrite: 0.65, nitrate: 43.7, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, pH: 7.6, temperature: 27.3, temperatureUnit: 'C', salinity: 33.1, salinityMode: 'practical' })
    expect(saved.status, JSON.stringify(saved.body).slice(0, 300)).toBe(201)
    const signedLatest = db.select().from(readings).where(eq(readings.tankId, tankId)).orderBy(desc(readings.takenAt)).all()[1]!
    db.update(readings).set({ nitrateN: 41.9, pH: 7.4 }).where(eq(readings.id, signedLatest.id)).run()
    const after = await certificateText(aquarist, tankId)
    expect(after).toBe(before)
    db.update(readings).set({ nitrateN: signedLatest.nitrateN, pH: signedLatest.pH }).where(eq(readings.id, signedLatest.id)).run()
    db.delete(readings).where(eq(readings.id, saved.body.reading.id)).run()
  })

  it('prints the verification link from the configured base URL, never from request headers', async () => {
    const response = await fetch(`${aquarist.baseURL}/api/tanks/${tankId}/certificate.pdf`, { headers: { 'cookie': aquarist.cookieHeader(), 'x-forwarded-host': 'phish.example', 'x-forwarded-proto': 'https' } })
    const text = pdfText(Buffer.from(await response.arrayBuffer()))
    expect(text).not.toContain('phish.example')
    expect(text).toContain(`http://localhost:3000/verify/${code}`)
  })

  it('refuses an edit of a signed fact without a reason (409), and the certificate does not move', async () => {
    const before = await certificateText(aquarist, tankId)
    const renamed = await aquarist.patch(`/api/tanks/${tankId}`, { name: 'Quietly renamed reef' })
    expect(renamed.status).toBe(409)
    expect(renamed.body.data.issues[0].field).toBe('amendmentReason')
    const resized = await aquarist.patch(`/api/tanks/${tankId}`, { shape: 'cube', dimensions: { sideMm: 600 } })
    expect(resized.status).toBe(409)
    expect((await aquarist.patch(`/api/tanks/${tankId}`, { cycleMethod: 'fish-in' })).status).toBe(409)
    expect(db.select({ name: tanks.name, volume: tanks.volumeLitres }).from(tanks).where(eq(tanks.id, tankId)).get()).toEqual({ name: 'Heron Quay reef', volume: 91.1 })
    expect(await certificateText(aquarist, tankId)).toBe(before)
    const verify = await new ApiClient().get(`/api/verify/${code}`)
    expect(verify.body).toMatchObject({ valid: true, tankName: 'Heron Quay reef' })
  })

  it('accepts an amendment with a reason: the certificate keeps the signed facts and shows the amendment', async () => {
    const amended = await aquarist.patch(`/api/tanks/${tankId}`, { name: 'Heron Quay lobby reef', amendmentReason: 'The client renamed the room' })
    expect(amended.status).toBe(200)
    expect(amended.body.name).toBe('Heron Quay lobby reef')
    const text = await certificateText(aquarist, tankId)
    expect(text).toMatch(/Tank\s+Heron Quay reef/)
    expect(text).toContain('Amended after signing')
    expect(text).toMatch(/"Heron Quay reef"\s+changed to\s+"Heron Quay lobby reef"/)
    expect(text).toMatch(/The\s+client\s+renamed\s+the\s+room/)
    expect((await new ApiClient().get(`/api/verify/${code}`)).body.tankName).toBe('Heron Quay reef')
  })

  it('keeps stages finished in the signed record and entries in the snapshot locked, whatever their date', async () => {
    const plan = await aquarist.get(`/api/tanks/${tankId}/stages`)
    const done = plan.body.stages.find((s: { status: string }) => s.status === 'done')
    expect((await aquarist.patch(`/api/tanks/${tankId}/stages/${done.id}`, { notes: 'Rewritten after sign-off' })).status).toBe(409)
    // A reading dated after the decision that the snapshot nonetheless holds (its clock ran ahead).
    const latest = db.select().from(readings).where(eq(readings.tankId, tankId)).all().at(-1)!
    const future = new Date(Date.now() + 3_600_000).toISOString()
    db.update(readings).set({ takenAt: future }).where(eq(readings.id, latest.id)).run()
    const edited = await aquarist.patch(`/api/tanks/${tankId}/readings/${latest.id}`, { notes: 'Edited after sign-off' })
    expect(edited.status).toBe(409)
    expect((await aquarist.delete(`/api/tanks/${tankId}/readings/${latest.id}`)).status).toBe(409)
  })
})

describe('stocking after sign-off', () => {
  it('records a client\'s livestock event without moving the tank; only staff start stocking', async () => {
    const client = await new ApiClient().signIn(company.emails.client)
    const at = new Date().toISOString()
    const logged = await client.post(`/api/tanks/${tankId}/events`, { at, kind: 'livestock-added', group: 'fish', amount: 2, notes: 'Two clownfish from the shop' })
    expect(logged.status).toBe(201)
    expect(db.select({ status: tanks.status }).from(tanks).where(eq(tanks.id, tankId)).get()!.status).toBe('signed-off')
    expect((await aquarist.post(`/api/tanks/${tankId}/events`, { at, kind: 'livestock-added', group: 'fish', amount: 1, notes: 'Goby added by the aquarist' })).status).toBe(201)
    expect(db.select({ status: tanks.status }).from(tanks).where(eq(tanks.id, tankId)).get()!.status).toBe('stocking')
  })
})
