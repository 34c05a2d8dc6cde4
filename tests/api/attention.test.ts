/**
 * GET /api/attention through the real server: every visible tank with what it needs
 * today, most urgent first, filtered by aquarist. The scratch company has one tank in each
 * situation; a test is expected every 36 h while cycling (the engine's default interval).
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { openDatabase, type TidewrightDB } from '../../server/db/connection'
import type { AttentionBoard, AttentionItem } from '../../shared/types/attention'
import type { NotificationList } from '../../shared/types/alerts'
import { ApiClient, signedIn } from '../support/http'
import { caughtMail, tick, waitForMail } from '../support/mail'
import type { TankList } from '../../shared/types/tanks'
import { ATTENTION_USERS, seedAttentionCompany, type AttentionCompany } from '../support/attention-company'
import { seedScratchCompany, type ScratchCompany } from '../support/company'
import { NITRITE_FALLING, NITRITE_FALLING_SLOWLY, seedCyclingTank, seedDangerTank } from '../support/forecast-tanks'

const { demo } = inject('fixtures')
let db: TidewrightDB
let company: AttentionCompany
beforeAll(async () => {
  db = openDatabase(inject('dbPath'))
  company = await seedAttentionCompany(db, demo.tanks)
})
afterAll(() => db?.$client.close())

const board = async (api: ApiClient, query = '') => {
  const response = await api.get<AttentionBoard>(`/api/attention${query}`)
  expect(response.status, JSON.stringify(response.body)).toBe(200)
  return response.body
}
const item = (b: AttentionBoard, tankId: string) => b.items.find(i => i.tankId === tankId) as AttentionItem

describe('GET /api/attention', () => {
  it('puts the tank with an open danger alert first and a quiet plan last, and says how long a silent tank has gone untested', async () => {
    const api = await signedIn(ATTENTION_USERS.supervisor.email)
    const b = await board(api)
    const names = b.items.map(i => i.tankId)
    expect(names).toHaveLength(6)
    expect(names[0]).toBe(company.tanks.alerting)
    expect(names.indexOf(company.tanks.silent)).toBeLessThan(names.indexOf(company.tanks.quiet))

    const alerting = item(b, company.tanks.alerting)
    expect(alerting.signals[0]).toMatchObject({ kind: 'alert', severity: 'danger', title: 'Danger alert, not acknowledged', acknowledgedByName: null })
    expect(alerting.signals[0]!.detail).toMatch(/ammonia/i)

    const silent = item(b, company.tanks.silent)
    const overdue = silent.signals.find(s => s.kind === 'overdue-test')!
    // The lounge's last test was this morning; moved a week back it is 7 days old.
    expect(overdue.title).toMatch(/^No test for (6|7|8) days$/)
    expect(overdue.detail).toContain('every 36 h')
    expect(item(b, company.tanks.quiet)).toMatchObject({ urgency: 0, signals: [] })
    expect(item(b, company.tanks.building).signals.some(s => s.kind === 'overdue-test')).toBe(false)
    expect(b.aquarists.map(a => a.name)).toEqual([ATTENTION_USERS.aquarist.name, ATTENTION_USERS.aquarist2.name])
  })

  it('shows who acknowledged an alert, and an acknowledged alert still outranks a missed test', async () => {
    const aquarist2 = await signedIn(ATTENTION_USERS.aquarist2.email)
    // The tank may carry more than one danger alert (ammonia over the action level and, once the
    // verdict is re-judged over time, the EPA four-day free-ammonia criterion): acknowledge each.
    const active = (await aquarist2.get(`/api/alerts?tankId=${company.tanks.alerting}&status=active`)).body.items as { id: string }[]
    expect(active.length).toBeGreaterThan(0)
    for (const { id } of active) expect((await aquarist2.post(`/api/alerts/${id}/acknowledge`, { note: 'Water change booked' })).status).toBe(200)
    const b = await board(aquarist2)
    expect(b.items[0]!.tankId).toBe(company.tanks.alerting)
    const alertSignals = b.items[0]!.signals.filter(s => s.kind === 'alert')
    expect(alertSignals).toHaveLength(active.length)
    for (const signal of alertSignals) expect(signal).toMatchObject({ title: 'Danger alert, acknowledged', acknowledgedByName: ATTENTION_USERS.aquarist2.name })
  })

  it('filters by aquarist and sorts by name or by the longest silence, as the query says', async () => {
    const api = await signedIn(ATTENTION_USERS.aquarist.email)
    const theirs = await board(api, `?aquarist=${company.users.aquarist2}`)
    expect(theirs.items.map(i => i.tankId)).toEqual([company.tanks.alerting])
    // The filter narrows the list, not the choices.
    expect(theirs.aquarists).toHaveLength(2)
    expect((await board(api, '?aquarist=unassigned')).items).toEqual([])
    const byName = (await board(api, '?sort=name')).items.map(i => i.tankName)
    expect(byName).toEqual([...byName].sort((a, b) => a.localeCompare(b)))
    // The alerting tank was tested today, yet stays first: danger is pinned whatever the order.
    const byTest = (await board(api, '?sort=last-test')).items.filter(i => i.lastTestAt)
    expect(byTest.map(i => i.tankId).slice(0, 2)).toEqual([company.tanks.alerting, company.tanks.silent])
  })

  it('is re-judged as time passes: two days on, the tank tested today is overdue too', async () => {
    const api = await signedIn(ATTENTION_USERS.aquarist.email)
    const later = new Date(Date.now() + 2 * 86_400_000).toISOString()
    const response = await api.request<AttentionBoard>('GET', '/api/attention', undefined, { 'x-tidewright-test-now': later })
    expect(response.status).toBe(200)
    expect(item(response.body, company.tanks.alerting).signals.map(s => s.kind)).toContain('overdue-test')
  })

  it('shows a client only their own tanks, and no other company\'s', async () => {
    const client = await board(await signedIn(ATTENTION_USERS.client.email))
    expect(client.items.map(i => i.tankId).sort()).toEqual(Object.values(company.tanks).sort())
    const demoClient = await board(await signedIn('client@tidewright.test'))
    expect(demoClient.items.some(i => Object.values(company.tanks).includes(i.tankId))).toBe(false)
    expect(demoClient.items.every(i => i.clientName === 'Marguerite Lowe')).toBe(true)
  })

  it('keeps the tank with a danger alert first when sorted by name', async () => {
    const api = await signedIn(ATTENTION_USERS.aquarist.email)
    const ids = (await board(api, '?sort=name')).items.map(i => i.tankId)
    expect(ids[0]).toBe(company.tanks.alerting)
  })

  it('is 401 signed out and 400 for an unknown sort or aquarist', async () => {
    expect((await new ApiClient().get('/api/attention')).status).toBe(401)
    const api = await signedIn(ATTENTION_USERS.aquarist.email)
    const badSort = await api.get('/api/attention?sort=loudest')
    expect(badSort.status).toBe(400)
    expect(badSort.body.data.issues[0].field).toBe('sort')
    expect((await api.get('/api/attention?aquarist=not-an-id')).status).toBe(400)
  })
})

describe('GET /api/attention?sort=completion', () => {
  // Names chosen so that name order, urgency order and completion order all differ.
  let scratch: ScratchCompany
  let tanks: { soon: string, later: string, threeTests: string, danger: string }
  beforeAll(async () => {
    scratch = await seedScratchCompany('board-completion')
    tanks = {
      later: seedCyclingTank(scratch, 'Anchor reef', NITRITE_FALLING_SLOWLY),
      threeTests: seedCyclingTank(scratch, 'Coral Bay reef', { ammonia: [1.6, 1.2, 0.6], nitrite: [0.3, 0.9, 1.2], nitrate: [0, 0, 0.1] }),
      soon: seedCyclingTank(scratch, 'Marlin reef', NITRITE_FALLING),
      danger: seedDangerTank(scratch, 'Zephyr reef'),
    }
  })

  it('orders by the soonest likely completion, keeps the danger alert on top and puts "not enough data" last', async () => {
    const api = await signedIn(scratch.emails.aquarist)
    const b = await board(api, '?sort=completion')
    expect(b.items.map(i => i.tankId)).toEqual([tanks.danger, tanks.soon, tanks.later, tanks.threeTests])
    expect(item(b, tanks.danger).signals[0]).toMatchObject({ kind: 'alert', severity: 'danger' })
    for (const id of [tanks.soon, tanks.later]) expect(item(b, id).forecast!.status, id).toBe('forecast')
    expect(Date.parse(item(b, tanks.soon).forecast!.likely!)).toBeLessThan(Date.parse(item(b, tanks.later).forecast!.likely!))
    expect(item(b, tanks.threeTests).forecast).toMatchObject({ status: 'not-enough-data', gap: 'sparse', likely: null })
    // The default order is unchanged: danger, then by urgency and name.
    expect((await board(api)).items.map(i => i.tankId)).toEqual([tanks.danger, tanks.later, tanks.threeTests, tanks.soon])
  })

  it('carries the same forecast the tank list gives for the same moment', async () => {
    const api = await signedIn(scratch.emails.aquarist)
    const at = { 'x-tidewright-test-now': new Date().toISOString() }
    const b = (await api.request<AttentionBoard>('GET', '/api/attention?sort=completion', undefined, at)).body
    const list = (await api.request<TankList>('GET', '/api/tanks?pageSize=50', undefined, at)).body
    for (const id of [tanks.soon, tanks.later, tanks.threeTests, tanks.danger]) {
      const listed = list.items.find(t => t.id === id)!.forecast!
      expect(item(b, id).forecast, id).toEqual({ status: listed.status, gap: listed.gap, completion: listed.completion, likely: listed.likely })
    }
  })

  it('gives no forecast for a tank that is not cycling', async () => {
    const api = await signedIn(ATTENTION_USERS.aquarist.email)
    const b = await board(api, '?sort=completion')
    expect(item(b, company.tanks.quiet).forecast).toBeNull()
    expect(item(b, company.tanks.building).forecast).toBeNull()
    // Without a forecast, planned and building tanks come after the cycling ones.
    const ids = b.items.map(i => i.tankId)
    expect(ids.indexOf(company.tanks.quiet)).toBeGreaterThan(ids.indexOf(company.tanks.firstTest))
  })
})

describe('danger on a client\'s own tank', () => {
  it('a client who switched the danger e-mail off still gets the notice in the app, not the e-mail; the aquarist still gets both', async () => {
    const client = await signedIn(ATTENTION_USERS.client.email)
    expect((await client.request('PUT', '/api/me/notification-preferences', { emailKinds: { 'tank-danger': false } })).status).toBe(200)
    // Two damselfish went in yesterday; 2 ppm total ammonia as NH3 is far over the 0.5 ppm action level (common practice).
    const saved = await client.post(`/api/tanks/${company.tanks.firstTest}/readings`, {
      takenAt: new Date(Date.now() - 60_000).toISOString(), ammonia: 2, nitrite: 0, nitrate: 0,
      basis: { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' }, pH: 8.1, temperature: 25, temperatureUnit: 'C', salinity: 35, salinityMode: 'practical',
    })
    expect(saved.status).toBe(201)
    // The save answers danger first, with the water change to do.
    expect(saved.body.findings[0]).toMatchObject({ severity: 'danger', ruleId: 'ammonia.action-threshold' })
    expect(saved.body.actions.some((a: { kind: string }) => a.kind === 'water-change')).toBe(true)
    const aquarist = await signedIn(ATTENTION_USERS.aquarist.email)
    const [alert] = (await aquarist.get(`/api/alerts?tankId=${company.tanks.firstTest}&status=active`)).body.items
    expect(alert).toBeDefined()
    const notices = (await client.get<NotificationList>('/api/notifications')).body.items
    expect(notices.find(n => n.alertId === alert.id)).toMatchObject({ kind: 'tank-danger', title: 'Act now: Kelpwater first-test reef' })
    await tick(new Date())
    await waitForMail('the aquarist\'s alert e-mail', all => all.some(m => m.messageId === `<alert-${alert.id}-opened@mail.tidewright.invalid>`))
    expect((await caughtMail()).filter(m => m.messageId.includes(alert.id)).flatMap(m => m.envelopeTo)).toEqual([ATTENTION_USERS.aquarist.email])
  })
})
