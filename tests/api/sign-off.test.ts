import { execFileSync } from 'node:child_process'
import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { evaluateCycle } from '../../shared/cycle/engine'
import { RULE_SET_VERSION } from '../../shared/cycle/registry'
import type { Evidence, ReviewItem, SignOffRecordWithSnapshot, SignOffState, VerifyResult } from '../../shared/types/sign-off'
import type { ListOf } from '../../shared/types/list'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import { alerts, auditLog, events, planStages, readings, signOffInputs, signOffs, tanks } from '../../server/db/schema'
import { OTHER_AQUARIST_EMAIL } from '../support/fixtures'
import { ApiClient, signedIn } from '../support/http'
import { SIGN_OFF_COMPANY, SIGN_OFF_USERS, seedSignOffCompany, type SignOffCompany } from '../support/sign-off-tanks'

const { demo } = inject('fixtures')
let db: TidewrightDB
let company: SignOffCompany
/** Copies of the demo nano (cycle complete; one to sign, one to return) and lounge (mid-cycle). */
let complete: string
let midCycle: string
let toReturn: string
const U = SIGN_OFF_USERS

const pdfText = (bytes: Buffer) => execFileSync('pdftotext', ['-layout', '-', '-'], { input: bytes }).toString('utf8')

async function download(api: ApiClient, path: string): Promise<{ status: number, type: string | null, bytes: Buffer }> {
  const response = await fetch(`${api.baseURL}${path}`, { headers: { cookie: api.cookieHeader() } })
  return { status: response.status, type: response.headers.get('content-type'), bytes: Buffer.from(await response.arrayBuffer()) }
}

/** The tank's own lighting acclimation, set on its lighting-ramp stage before it is signed. */
const OWN_ACCLIMATION = { acclimationWeeks: 2, acclimationStartPercent: 20, acclimationEndPercent: 40 }
const lightingStage = (tankId: string) => db.$client.prepare('select id from plan_stages where tank_id = ? and key = \'lighting-ramp\'').get(tankId) as { id: string }

beforeAll(async () => {
  db = openDatabase(inject('dbPath'))
  company = await seedSignOffCompany(db, demo.tanks)
  ;({ complete, toReturn, midCycle } = company.tanks)
  // The sign-off copies carry no build plan: give the one to be signed its lighting stage.
  db.insert(planStages).values({ tankId: complete, position: 8, key: 'lighting-ramp', title: 'Lighting ramp', data: {} }).run()
  const set = await (await signedIn(U.aquarist.email)).patch(`/api/tanks/${complete}/stages/${lightingStage(complete).id}`, { data: OWN_ACCLIMATION })
  if (set.status !== 200) throw new Error(`could not set the lighting stage: ${set.status}`)
})
afterAll(() => db?.$client.close())

describe('asking for sign-off', () => {
  it('lets the aquarist ask when the engine judges the cycle complete; the tank becomes cycled', async () => {
    const aquarist = await signedIn(U.aquarist.email)
    const response = await aquarist.post(`/api/tanks/${complete}/sign-off-requests`, { note: 'Zero for a week' })
    expect(response.status).toBe(201)
    expect(response.body).toMatchObject({ status: 'requested', requestNote: 'Zero for a week', requestedByName: U.aquarist.name })
    expect(db.select().from(tanks).where(eq(tanks.id, complete)).get()?.status).toBe('cycled')
    expect((await aquarist.post(`/api/tanks/${complete}/sign-off-requests`, {})).status).toBe(409)
    expect((await aquarist.post(`/api/tanks/${toReturn}/sign-off-requests`, {})).status).toBe(201)
  })

  it('refuses a request while the cycle is not complete (409), from a client (403), signed out (401), from another company (404)', async () => {
    const aquarist = await signedIn(U.aquarist.email)
    const notDone = await aquarist.post(`/api/tanks/${midCycle}/sign-off-requests`, {})
    expect(notDone.status).toBe(409)
    expect(notDone.body.statusMessage).toContain('not judge this cycle complete')
    expect((await (await signedIn(U.client.email)).post(`/api/tanks/${complete}/sign-off-requests`, {})).status).toBe(403)
    expect((await new ApiClient().post(`/api/tanks/${complete}/sign-off-requests`, {})).status).toBe(401)
    expect((await (await signedIn(OTHER_AQUARIST_EMAIL)).post(`/api/tanks/${complete}/sign-off-requests`, {})).status).toBe(404)
    const bad = await aquarist.post(`/api/tanks/${complete}/sign-off-requests`, { note: 42 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].field).toBe('note')
  })
})

describe('the review queue', () => {
  beforeAll(() => {
    // The lounge copy regressed after its request: it waits with an open danger alert.
    db.insert(signOffs).values({ organisationId: company.organisationId, tankId: midCycle, requestedBy: company.users.aquarist, requestedAt: new Date().toISOString(), status: 'requested' }).run()
    db.insert(alerts).values({ organisationId: company.organisationId, tankId: midCycle, kind: 'ammonia-danger', message: 'Total ammonia is high', openedAt: new Date().toISOString(), openKey: `${midCycle}:ammonia-danger` }).run()
  })

  it('shows the supervisor their waiting tanks oldest first, with phase, days cycling and open alerts', async () => {
    const { status, body: { items } } = await (await signedIn(U.supervisor.email)).get<ListOf<ReviewItem>>('/api/reviews')
    expect(status).toBe(200)
    const ids = items.map(i => i.tankId)
    expect(ids).toEqual(expect.arrayContaining([complete, toReturn, midCycle]))
    expect(ids).not.toContain(demo.tanks.nano)
    expect(ids.indexOf(complete)).toBeLessThan(ids.indexOf(toReturn))
    expect(ids.indexOf(complete)).toBeLessThan(ids.indexOf(midCycle))
    const times = items.map(i => i.requestedAt)
    expect(times).toEqual([...times].sort())
    // Whole days since each copy's cycle start; the seed starts cycles at a fixed hour, so
    // the count depends on the time of day the suite runs.
    const wholeDaysCycling = (tankId: string) => {
      const started = db.select({ at: tanks.cycleStartedAt }).from(tanks).where(eq(tanks.id, tankId)).get()?.at
      return Math.floor((Date.now() - Date.parse(started!)) / 86_400_000)
    }
    expect([11, 12]).toContain(wholeDaysCycling(midCycle))
    expect([33, 34]).toContain(wholeDaysCycling(complete))
    const lounge = items.find(i => i.tankId === midCycle)!
    expect(lounge).toMatchObject({ phase: expect.not.stringMatching(/^complete$/), openAlerts: 1, daysCycling: wholeDaysCycling(midCycle) })
    expect(lounge.overrideGrounds.join(' ')).toMatch(/not complete.*1 danger alert is not resolved/)
    expect(items.find(i => i.tankId === complete)).toMatchObject({ phase: 'complete', openAlerts: 0, daysCycling: wholeDaysCycling(complete), clientName: U.client.name, overrideGrounds: [] })
  })

  it('is empty for a supervisor with no tanks, and refused to aquarists and clients', async () => {
    expect((await (await signedIn(U.supervisor2.email)).get('/api/reviews')).body).toEqual({ items: [] })
    const otherCompany = await (await signedIn('supervisor@tidewright.test')).get<ListOf<ReviewItem>>('/api/reviews')
    expect(otherCompany.body.items.map(i => i.tankId)).toEqual([demo.tanks.nano])
    expect((await (await signedIn(U.aquarist.email)).get('/api/reviews')).status).toBe(403)
    expect((await (await signedIn(U.client.email)).get('/api/reviews')).status).toBe(403)
    expect((await new ApiClient().get('/api/reviews')).status).toBe(401)
  })
})

describe('the evidence', () => {
  it('brings the tank, the verdict, readings, events, stages, alerts and sign-offs together for staff', async () => {
    const { status, body } = await (await signedIn(U.supervisor.email)).get<Evidence>(`/api/tanks/${midCycle}/evidence`)
    expect(status).toBe(200)
    expect(body.tank.name).toBe('Saltmarsh test lounge')
    expect(body.readings.length).toBe(db.select().from(readings).where(eq(readings.tankId, midCycle)).all().length)
    // The lounge copy's seeded events (bacteria and the doses of its simulated history), in time order.
    const seeded = db.select({ kind: events.kind, at: events.at }).from(events).where(eq(events.tankId, midCycle)).all()
      .sort((a, b) => a.at.localeCompare(b.at)).map(e => e.kind)
    expect(body.events.map(e => e.kind)).toEqual(seeded)
    expect(seeded).toEqual(expect.arrayContaining(['ammonia-dose', 'bacteria-dose']))
    expect(body.stages).toHaveLength(0)
    expect(body.alerts).toHaveLength(1)
    expect(body.signOffs[0]?.status).toBe('requested')
    expect(body.overrideGrounds.length).toBeGreaterThan(0)
    expect(body.canDecide).toBe(true)
    const every = body.verdict.findings.flatMap(f => f.readingIds)
    const known = new Set(body.readings.map(r => r.id))
    expect(every.every(id => known.has(id))).toBe(true)
  })

  it('is for staff only (403 for a client) and 404 for another company', async () => {
    expect((await (await signedIn(U.client.email)).get(`/api/tanks/${complete}/evidence`)).status).toBe(403)
    expect((await (await signedIn(OTHER_AQUARIST_EMAIL)).get(`/api/tanks/${complete}/evidence`)).status).toBe(404)
  })
})

describe('the decision', () => {
  it('may be made only by the tank\'s supervisor or an admin', async () => {
    for (const email of [U.aquarist.email, U.client.email, OTHER_AQUARIST_EMAIL, U.supervisor2.email]) {
      const response = await (await signedIn(email)).post(`/api/tanks/${complete}/sign-off/decision`, { decision: 'approve' })
      expect(response.status, email).toBe(403)
    }
    expect(db.select().from(signOffs).where(and(eq(signOffs.tankId, complete), eq(signOffs.status, 'requested'))).get()).toBeDefined()
  })

  it('refuses an override without a written reason (400), then records it with the reason', async () => {
    const supervisor = await signedIn(U.supervisor.email)
    const refused = await supervisor.post(`/api/tanks/${midCycle}/sign-off/decision`, { decision: 'approve', note: '' })
    expect(refused.status).toBe(400)
    expect(refused.body.data.issues).toEqual([{ field: 'note', message: expect.stringContaining('write why') }])
    expect(db.select().from(tanks).where(eq(tanks.id, midCycle)).get()?.status).toBe('cycling')
    const { status, body } = await supervisor.post<SignOffRecordWithSnapshot>(`/api/tanks/${midCycle}/sign-off/decision`, { decision: 'approve', note: 'Client moving abroad; tank handed to a public aquarium team who will finish the cycle.' })
    expect(status).toBe(200)
    expect(body).toMatchObject({ status: 'approved', override: true, decidedByName: U.supervisor.name })
    expect(body.snapshot?.overrideGrounds.join(' ')).toMatch(/not complete/)
    expect(body.snapshot?.overrideGrounds.join(' ')).toMatch(/1 danger alert is not resolved/)
    const audit = db.select().from(auditLog).where(eq(auditLog.entityId, body.id)).all().map(a => a.action)
    expect(audit).toContain('sign-off.approve-override')
    const evidence = await supervisor.get<Evidence>(`/api/tanks/${midCycle}/evidence`)
    expect(evidence.body.signOffs[0]).toMatchObject({ override: true, decisionNote: expect.stringContaining('public aquarium') })
  })

  it('approves with the engine: stores input and verdict so the same rule set reproduces it exactly', async () => {
    const supervisor = await signedIn(U.supervisor.email)
    const { status, body } = await supervisor.post<SignOffRecordWithSnapshot>(`/api/tanks/${complete}/sign-off/decision`, { decision: 'approve' })
    expect(status).toBe(200)
    expect(body).toMatchObject({ status: 'approved', override: false, ruleSetVersion: RULE_SET_VERSION })
    expect(db.select().from(tanks).where(eq(tanks.id, complete)).get()?.status).toBe('signed-off')
    const stored = db.select().from(signOffs).where(eq(signOffs.id, body.id)).get()!
    const snapshot = stored.snapshot as unknown as NonNullable<SignOffRecordWithSnapshot['snapshot']>
    expect(snapshot.verdict.phase).toBe('complete')
    // The input is kept beside the snapshot; the answer carries the verdict, not the input.
    const input = db.select().from(signOffInputs).where(eq(signOffInputs.signOffId, body.id)).get()!.input
    expect(input.now).toBe(stored.decidedAt)
    expect(input.readings.length).toBeGreaterThan(30)
    expect(evaluateCycle(input)).toEqual(snapshot.verdict)
    expect(body.snapshot).not.toHaveProperty('input')
    expect(body.snapshot!.verdict).toEqual(snapshot.verdict)
    expect((await supervisor.post(`/api/tanks/${complete}/sign-off/decision`, { decision: 'approve' })).status).toBe(409)
  })

  it('returns a tank with a note (required) and sends it back to cycling', async () => {
    const admin = await signedIn(U.admin.email)
    const noNote = await admin.post(`/api/tanks/${toReturn}/sign-off/decision`, { decision: 'return' })
    expect(noNote.status).toBe(400)
    expect(noNote.body.data.issues[0].field).toBe('note')
    expect((await admin.post(`/api/tanks/${toReturn}/sign-off/decision`, { decision: 'maybe' })).status).toBe(400)
    const { status, body } = await admin.post<SignOffRecordWithSnapshot>(`/api/tanks/${toReturn}/sign-off/decision`, { decision: 'return', note: 'Photo of the leak test is missing.' })
    expect(status).toBe(200)
    expect(body).toMatchObject({ status: 'returned', decisionNote: 'Photo of the leak test is missing.', decidedByName: U.admin.name })
    expect(db.select().from(tanks).where(eq(tanks.id, toReturn)).get()?.status).toBe('cycling')
    expect(db.select().from(signOffs).where(eq(signOffs.id, body.id)).get()?.verificationCode).toBeNull()
  })
})

describe('the locked record', () => {
  it('refuses to write livestock back-dated into the signed period (409), accepts it after', async () => {
    const aquarist = await signedIn(U.aquarist.email)
    const early = await aquarist.post(`/api/tanks/${complete}/start-stocking`, { livestock: { group: 'invertebrates', count: 5, at: new Date(Date.now() - 3 * 86_400_000).toISOString() } })
    expect(early.status).toBe(409)
    expect(early.body.statusMessage).toMatch(/signed off on .* can no longer be changed/)
    expect(db.select().from(tanks).where(eq(tanks.id, complete)).get()?.status).toBe('signed-off')
    expect((await (await signedIn(U.client.email)).post(`/api/tanks/${complete}/start-stocking`, {})).status).toBe(403)
  })

  it('writes the first livestock through the event form\'s rules: no animals dated in the future, none without a count', async () => {
    const aquarist = await signedIn(U.aquarist.email)
    const future = await aquarist.post(`/api/tanks/${complete}/start-stocking`, { livestock: { group: 'fish', count: 2, at: new Date(Date.now() + 2 * 86_400_000).toISOString() } })
    console.log(`[sign-off] start of stocking with livestock dated two days ahead: ${future.status}`)
    expect(future.status).toBe(400)
    expect(future.body.data.issues[0].field).toBe('livestock.at')
    const uncounted = await aquarist.post(`/api/tanks/${complete}/start-stocking`, { livestock: { group: 'fish' } })
    expect(uncounted.status).toBe(400)
    expect(db.select().from(tanks).where(eq(tanks.id, complete)).get()?.status).toBe('signed-off')
    expect(db.select().from(events).where(and(eq(events.tankId, complete), eq(events.kind, 'livestock-added'))).all()).toHaveLength(0)
  })

  it('corrects a locked reading with a new linked entry and a reason; the original stays', async () => {
    const supervisor = await signedIn(U.supervisor.email)
    const original = db.select().from(readings).where(eq(readings.tankId, complete)).all().find(r => r.ammoniaN !== null)!
    const noReason = await supervisor.post(`/api/tanks/${complete}/readings/${original.id}/corrections`, { ammoniaN: 0.1 })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.issues[0].field).toBe('reason')
    const { status, body } = await supervisor.post(`/api/tanks/${complete}/readings/${original.id}/corrections`, { ammoniaN: 0.1, reason: 'Kit read against the wrong colour card' })
    expect(status).toBe(201)
    expect(body).toMatchObject({ correctsId: original.id, correctionReason: 'Kit read against the wrong colour card', ammoniaN: 0.1, takenAt: original.takenAt, nitriteN: original.nitriteN })
    expect(db.select().from(readings).where(eq(readings.id, original.id)).get()).toEqual(original)
    const again = await supervisor.post(`/api/tanks/${complete}/readings/${original.id}/corrections`, { ammoniaN: 0.2, reason: 'Second thoughts' })
    expect(again.status).toBe(409)
    expect(again.body.data.latestId).toBe(body.id)
    expect((await supervisor.post(`/api/tanks/${complete}/readings/${body.id}/corrections`, { ammoniaN: 0.05, reason: 'Re-read the card in daylight' })).status).toBe(201)
    const evidence = await supervisor.get<Evidence>(`/api/tanks/${complete}/evidence`)
    expect(evidence.body.readings.find(r => r.id === original.id)?.correctedById).toBe(body.id)
    expect(db.select().from(auditLog).where(eq(auditLog.entityId, body.id)).get()?.action).toBe('reading.correct')
    expect((await supervisor.post(`/api/tanks/${complete}/readings/${demo.tanks.lounge}/corrections`, { reason: 'No such reading' })).status).toBe(404)
    expect((await (await signedIn(U.client.email)).post(`/api/tanks/${complete}/readings/${original.id}/corrections`, { reason: 'Mine' })).status).toBe(403)
  })

  it('corrects an event the same way', async () => {
    const aquarist = await signedIn(U.aquarist.email)
    const evidence = await aquarist.get<Evidence>(`/api/tanks/${complete}/evidence`)
    const dose = evidence.body.events.find(e => e.kind === 'ammonia-dose')!
    const { status, body } = await aquarist.post(`/api/tanks/${complete}/events/${dose.id}/corrections`, { amount: 1.5, reason: 'Dose was 1.5, not 1.65' })
    expect(status).toBe(201)
    expect(body).toMatchObject({ correctsId: dose.id, amount: 1.5, kind: 'ammonia-dose', at: dose.at })
  })

  it('shows every stored test and event with its trail, oldest first, field for field as stored', async () => {
    const evidence = (await (await signedIn(U.supervisor.email)).get<Evidence>(`/api/tanks/${complete}/evidence`)).body
    // Read here with SQL of the test's own, in the answer's field order, so the order of the fields is checked too.
    const storedReadings = db.$client.prepare(`select r.id, r.taken_at as takenAt, a.name as enteredByName,
        r.ammonia_n as ammoniaN, r.nitrite_n as nitriteN, r.nitrate_n as nitrateN, r.ph as pH, r.temperature_c as temperatureC,
        r.salinity, r.alkalinity_dkh as alkalinityDkh, r.calcium_mg_l as calciumMgL, r.magnesium_mg_l as magnesiumMgL,
        r.phosphate_mg_l as phosphateMgL, r.notes, r.corrects_id as correctsId, r.correction_reason as correctionReason,
        later.id as correctedById, r.created_at as createdAt
      from readings r left join users a on a.id = r.entered_by left join readings later on later.corrects_id = r.id
      where r.tank_id = ? order by r.taken_at, r.created_at, r.rowid`).all(complete) as Record<string, unknown>[]
    const storedEvents = db.$client.prepare(`select e.id, e.at, e.kind, e.amount, e."group", e.notes, a.name as enteredByName,
        e.corrects_id as correctsId, e.correction_reason as correctionReason, later.id as correctedById
      from events e left join users a on a.id = e.entered_by left join events later on later.corrects_id = e.id
      where e.tank_id = ? order by e.at, e.created_at, e.rowid`).all(complete) as Record<string, unknown>[]
    // The corrections above: a reading corrected twice in a chain, an event once.
    expect(storedReadings.filter(r => r.correctedById).length).toBe(2)
    expect(storedReadings.filter(r => r.correctsId && r.correctionReason && r.enteredByName).length).toBe(2)
    expect(storedEvents.filter(e => e.correctedById).length).toBe(1)
    expect(evidence.readings).toEqual(storedReadings)
    expect(evidence.readings.map(r => Object.keys(r))).toEqual(storedReadings.map(r => Object.keys(r)))
    expect(evidence.events).toEqual(storedEvents)
    expect(evidence.events.map(e => Object.keys(e))).toEqual(storedEvents.map(e => Object.keys(e)))
    expect({ readingsTotal: evidence.readingsTotal, eventsTotal: evidence.eventsTotal }).toEqual({ readingsTotal: storedReadings.length, eventsTotal: storedEvents.length })
  })

  it('keeps the audit log append-only in the database itself', () => {
    const count = db.select().from(auditLog).all().length
    expect(count).toBeGreaterThan(3)
    expect(() => db.$client.prepare('UPDATE audit_log SET action = ? WHERE id = (SELECT min(id) FROM audit_log)').run('rewritten')).toThrow(/append-only/)
    expect(() => db.$client.prepare('DELETE FROM audit_log').run()).toThrow(/append-only/)
    expect(db.select().from(auditLog).all().length).toBe(count)
    expect(db.select().from(auditLog).all().some(a => a.action === 'rewritten')).toBe(false)
  })
})

describe('the certificate', () => {
  let code = ''

  it('is a one-page PDF the client can download, naming tank, client, supervisor, plan and a code', async () => {
    const client = await signedIn(U.client.email)
    const { status, type, bytes } = await download(client, `/api/tanks/${complete}/certificate.pdf`)
    expect(status).toBe(200)
    expect(type).toBe('application/pdf')
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-')
    const text = pdfText(bytes)
    expect(text).toContain('Saltmarsh test nano')
    expect(text).toContain(U.client.name)
    expect(text).toContain(U.supervisor.name)
    expect(text).toContain('Fishless cycle')
    expect(text).toContain('Total ammonia')
    expect(text).toContain('Soft corals')
    expect(text).not.toContain('Signed against')
    // The tank's own acclimation (2 weeks, 20 % to 40 %), not the defaults (4 weeks, 30 % to 60 %).
    expect(text.replace(/\s+/g, ' ')).toContain('(20 %, 30 %, 40 %)')
    code = /TW(?:-[0-9A-Z]{4}){6}/.exec(text)?.[0] ?? ''
    expect(code).toBe(db.select().from(signOffs).where(and(eq(signOffs.tankId, complete), eq(signOffs.status, 'approved'))).get()?.verificationCode)
    const info = execFileSync('pdfinfo', ['-'], { input: bytes }).toString()
    expect(info).toMatch(/Pages:\s+1\n/)
    expect(execFileSync('pdffonts', ['-'], { input: bytes }).toString()).toMatch(/SourceSans3/)
  })

  it('keeps the lighting plan as signed when the stage changes afterwards', async () => {
    const aquarist = await signedIn(U.aquarist.email)
    const changed = await aquarist.patch(`/api/tanks/${complete}/stages/${lightingStage(complete).id}`, { data: { acclimationWeeks: 6, acclimationStartPercent: 10, acclimationEndPercent: 70 } })
    expect(changed.status).toBe(200)
    const text = pdfText((await download(await signedIn(U.client.email), `/api/tanks/${complete}/certificate.pdf`)).bytes)
    expect(text.replace(/\s+/g, ' ')).toContain('(20 %, 30 %, 40 %)')
    const snapshot = db.select().from(signOffs).where(and(eq(signOffs.tankId, complete), eq(signOffs.status, 'approved'))).get()?.snapshot as { acclimation?: unknown } | undefined
    expect(snapshot?.acclimation).toEqual({ weeks: 2, startPercent: 20, endPercent: 40 })
  })

  it('shows an override on the certificate', async () => {
    const { bytes } = await download(await signedIn(U.supervisor.email), `/api/tanks/${midCycle}/certificate.pdf`)
    const text = pdfText(bytes)
    expect(text).toContain('Signed against the engine')
    expect(text).toContain('public aquarium')
  })

  it('is not for another client, nor for a tank without a current sign-off', async () => {
    expect((await download(await signedIn(U.client2.email), `/api/tanks/${complete}/certificate.pdf`)).status).toBe(404)
    expect((await download(await signedIn(U.client.email), `/api/tanks/${toReturn}/certificate.pdf`)).status).toBe(404)
    expect((await download(new ApiClient(), `/api/tanks/${complete}/certificate.pdf`)).status).toBe(401)
  })

  it('verifies publicly with minimal facts; a tampered code does not verify', async () => {
    const anyone = new ApiClient()
    const { status, body } = await anyone.get<VerifyResult>(`/api/verify/${code}`)
    expect(status).toBe(200)
    expect(body).toEqual({ valid: true, status: 'approved', tankName: 'Saltmarsh test nano', company: SIGN_OFF_COMPANY, signedAt: expect.any(String), supervisorName: U.supervisor.name, reopenedAt: null })
    const last = code.at(-1)!
    const tampered = code.slice(0, -1) + (last === 'A' ? 'B' : 'A')
    expect((await anyone.get(`/api/verify/${tampered}`)).status).toBe(404)
    expect((await anyone.get(`/api/verify/${code.toLowerCase()}`)).status).toBe(200)
    expect((await anyone.get('/api/verify/TW-1234')).status).toBe(400)
  })

  it('reopening (with a reason, by the supervisor) unlocks the record and the code then reads reopened', async () => {
    const supervisor = await signedIn(U.supervisor.email)
    expect((await (await signedIn(U.aquarist.email)).post(`/api/tanks/${complete}/sign-off/reopen`, { reason: 'Because' })).status).toBe(403)
    expect((await supervisor.post(`/api/tanks/${complete}/sign-off/reopen`, {})).status).toBe(400)
    const { status, body } = await supervisor.post(`/api/tanks/${complete}/sign-off/reopen`, { reason: 'Client reports a cloudy tank; re-test before stocking.' })
    expect(status).toBe(200)
    expect(body).toMatchObject({ status: 'reopened', reopenedByName: U.supervisor.name })
    expect(db.select().from(tanks).where(eq(tanks.id, complete)).get()?.status).toBe('cycling')
    expect((await new ApiClient().get<VerifyResult>(`/api/verify/${code}`)).body).toMatchObject({ valid: false, status: 'reopened' })
    expect((await download(await signedIn(U.client.email), `/api/tanks/${complete}/certificate.pdf`)).status).toBe(404)
    expect(db.select().from(auditLog).where(and(eq(auditLog.entityId, body.id), eq(auditLog.action, 'sign-off.reopen'))).get()).toBeDefined()
    const state = await supervisor.get<SignOffState>(`/api/tanks/${complete}/sign-off`)
    expect(state.body).toMatchObject({ lockedUntil: null, canReopen: false, hasCertificate: false })
  })
})

describe('after sign-off', () => {
  it('shows the client the livestock and lighting plan, and the tank moves to stocking', async () => {
    const client = await signedIn(U.client.email)
    // The override-approved lounge copy belongs to the second client.
    const own = await signedIn(U.client2.email)
    const { body } = await own.get<SignOffState>(`/api/tanks/${midCycle}/sign-off`)
    expect(body.tankStatus).toBe('signed-off')
    expect(body.plan?.steps.map(s => s.group)).toEqual(['fish', 'invertebrates', 'soft-coral', 'lps-coral', 'sps-coral'])
    expect(body.plan?.lighting).toHaveLength(5)
    expect(body.plan?.lighting[0]).toMatchObject({ week: 0, plateauPercent: 30 })
    expect(body.canStartStocking).toBe(false)
    expect((await client.get(`/api/tanks/${midCycle}/sign-off`)).status).toBe(404)
    const aquarist = await signedIn(U.aquarist.email)
    const started = await aquarist.post(`/api/tanks/${midCycle}/start-stocking`, { livestock: { group: 'fish', count: 2, notes: 'Two small gobies' } })
    expect(started.status).toBe(200)
    expect(started.body.status).toBe('stocking')
    expect(db.select().from(tanks).where(eq(tanks.id, midCycle)).get()?.status).toBe('stocking')
    expect((await aquarist.post(`/api/tanks/${midCycle}/start-stocking`, {})).status).toBe(409)
  })

  it('a returned tank can be asked for again; livestock logged after the sign-off moves it to stocking', async () => {
    const aquarist = await signedIn(U.aquarist.email)
    expect((await aquarist.post(`/api/tanks/${toReturn}/sign-off-requests`, { note: 'Leak-test photo added' })).status).toBe(201)
    expect((await (await signedIn(U.supervisor.email)).post(`/api/tanks/${toReturn}/sign-off/decision`, { decision: 'approve' })).status).toBe(200)
    expect(db.select().from(tanks).where(eq(tanks.id, toReturn)).get()?.status).toBe('signed-off')
    // Livestock written by another route (as the events form does), then any change runs the tank-data hook.
    const fish = db.insert(events).values({ tankId: toReturn, at: new Date(Date.now() + 60_000).toISOString(), kind: 'livestock-added', group: 'fish', amount: 2 }).returning().get()
    expect(db.select().from(tanks).where(eq(tanks.id, toReturn)).get()?.status).toBe('signed-off')
    expect((await aquarist.post(`/api/tanks/${toReturn}/events/${fish.id}/corrections`, { amount: 3, reason: 'Three went in, not two' })).status).toBe(201)
    expect(db.select().from(tanks).where(eq(tanks.id, toReturn)).get()?.status).toBe('stocking')
  })
})
