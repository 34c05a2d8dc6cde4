/**
 * The demo company: Brinefield Aquarium Studio, its staff, three clients and four tanks
 * at different points of commissioning. Every name here is invented. Histories are placed
 * relative to `now`, so the demo always looks current.
 */
import { DEFAULT_PLAN_TEMPLATE } from '../../../shared/plan/default-template'
import type { Db } from '../connection'
import { planStageRows } from '../plan-stages'
import { syncAlertsInDb } from '../../domain/alerts/sync'
import { computeAndStoreVerdict } from '../verdicts'
import { clients, events, organisations, planStages, readings, signOffs, sites, tanks, users } from '../schema'
import type { SimulationPlan } from '../../../shared/cycle/simulate'
import { demoHistory, loungePlan, nanoPlan, simulate, studyPlan } from './histories'
import { checkedClient, checkedEvent, checkedSite, checkedStageData, checkedTank } from './checked'
import type { SurveyLoadTank } from '../../../shared/plan/survey-load'
import { eventColumns } from '../../domain/readings/columns'
import { hashPasswordOffline } from './password'
import type { CycleEventKind, Role, UnitSystem } from '../../../shared/vocabulary'

export const DEMO_PASSWORD = 'tidewright-demo'
const DAY = 86_400_000

export interface DemoIds {
  organisationId: string
  users: Record<'admin' | 'aquarist' | 'aquarist2' | 'supervisor' | 'client' | 'client2' | 'client3', string>
  clients: Record<'lowe' | 'quayle' | 'hart', string>
  tanks: Record<'lobby' | 'lounge' | 'nano' | 'study', string>
}

function daysAgo(now: Date, days: number, hour = 9): Date {
  const d = new Date(now.getTime() - days * DAY)
  d.setUTCHours(hour, 0, 0, 0)
  return d
}

/** What a finished stage records so that it meets its commissioning gate: a day-long leak test, a floor checked by an engineer. */
function finishedData(key: string, byName: string, at: Date, roomUse: string): Record<string, unknown> {
  const hoursBefore = (h: number) => new Date(at.getTime() - h * 3_600_000).toISOString()
  if (key === 'leak-test') return { startedAt: hoursBefore(30), endedAt: hoursBefore(3), result: 'pass' }
  if (key === 'site-survey') {
    return {
      roomUse, shellThicknessMm: 10, structuralCheckDone: true, structuralCheckBy: 'Oriel Pennington, Pennington Structural',
      structuralCheckRecordedBy: byName, structuralCheckRecordedAt: hoursBefore(48),
    }
  }
  return {}
}

/**
 * Marks the first `done` stages of a tank's plan as finished by `by`: the building stages an
 * hour apart from `at` (before the cycle starts), and the cycling stage, if among them, at
 * `cycleDoneAt`, which must come after the engine judged the cycle complete.
 */
function finishStages(rows: (typeof planStages.$inferInsert)[], done: number, by: string, at: Date, who = { name: 'Teodor Nakamura-Reyes', roomUse: 'living-area' }, cycleDoneAt?: Date) {
  return rows.map((row, i) => {
    if (i >= done) return i === done ? { ...row, status: 'in-progress' as const } : row
    if (row.key === 'cycling' && !cycleDoneAt) throw new Error('A finished cycling stage needs the moment the cycle was judged complete.')
    const completedAt = (row.key === 'cycling' ? cycleDoneAt! : new Date(at.getTime() + i * 3_600_000)).toISOString()
    return {
      ...row,
      data: finishedData(row.key, who.name, at, who.roomUse),
      status: 'done' as const,
      completedBy: by,
      completedAt,
      checklist: (row.checklist ?? []).map(item => ({ ...item, done: true, doneBy: by, doneAt: completedAt })),
    }
  })
}

/** Inserts the whole demo company into an empty, migrated database. */
export async function seedDemo(db: Db, now = new Date()): Promise<DemoIds> {
  const passwordHash = await hashPasswordOffline(DEMO_PASSWORD)
  return db.transaction((tx) => {
    const org = tx.insert(organisations).values({
      name: 'Brinefield Aquarium Studio',
      settings: { defaultUnits: 'us' },
    }).returning().get()
    const orgId = org.id

    const client = (name: string, email: string, phone: string) =>
      tx.insert(clients).values({ organisationId: orgId, ...checkedClient({ name, email, phone }) }).returning().get().id
    const lowe = client('Marguerite Lowe', 'client@tidewright.test', '+1 555 0142')
    const quayle = client('Idris Quayle', 'client2@tidewright.test', '+1 555 0187')
    const hart = client('Fenella Hart', 'client3@tidewright.test', '+1 555 0119')

    const user = (email: string, name: string, role: Role, clientId: string | null = null, units: UnitSystem = 'us') =>
      tx.insert(users).values({ organisationId: orgId, email, name, role, passwordHash, clientId, units }).returning().get().id
    const ids = {
      admin: user('admin@tidewright.test', 'Odile Fairbanks', 'admin'),
      aquarist: user('aquarist@tidewright.test', 'Teodor Nakamura-Reyes', 'aquarist'),
      aquarist2: user('aquarist2@tidewright.test', 'Wren Castellanos', 'aquarist', null, 'metric'),
      supervisor: user('supervisor@tidewright.test', 'Hollis Achterberg', 'supervisor'),
      client: user('client@tidewright.test', 'Marguerite Lowe', 'client', lowe),
      client2: user('client2@tidewright.test', 'Idris Quayle', 'client', quayle, 'metric'),
      client3: user('client3@tidewright.test', 'Fenella Hart', 'client', hart),
    }

    const site = (clientId: string, label: string, address: string, roomNotes: string, accessNotes: string | null = null) =>
      tx.insert(sites).values({ organisationId: orgId, clientId, ...checkedSite({ label, address, roomNotes, accessNotes }) }).returning().get().id
    const loweHome = site(lowe, 'Marlowe House', '14 Marlowe Lane, Eastbridge', 'Lounge, north wall, suspended timber floor', 'Key with the neighbour at no. 12')
    const lowePractice = site(lowe, 'Lowe Family Dentistry', '3 Harbour Parade, Eastbridge', 'Reception lobby, concrete slab', 'Open 8-18 weekdays')
    const quayleFlat = site(quayle, 'Quayside flat', 'Flat 6, 22 Quay Street, Westhollow', 'Living room, second floor, concrete floor')
    const hartHouse = site(hart, 'Fernhill', '9 Fernhill Rise, Northmere', 'Study, ground floor, away from the window')

    // The form's fields go through the tank form's rules, and the volume is the one the server computes from the dimensions.
    type TankForm = Parameters<typeof checkedTank>[0]
    type TankExtras = Omit<typeof tanks.$inferInsert, keyof TankForm | 'volumeLitres'>
    const facts = new Map<string, SurveyLoadTank>()
    const tank = (form: TankForm, extras: TankExtras) => {
      const row = tx.insert(tanks).values({ ...extras, ...checkedTank(form) }).returning().get()
      facts.set(row.id, row)
      return row.id
    }
    const lobby = tank({
      clientId: lowe, siteId: lowePractice, name: 'Harbour Parade lobby reef',
      shape: 'rectangular', dimensions: { lengthMm: 1500, widthMm: 600, heightMm: 600 }, sumpLitres: 120,
      material: 'glass', waterSource: 'mixed', cycleMethod: 'fishless',
      aquaristId: ids.aquarist, supervisorId: ids.supervisor,
    }, { organisationId: orgId, status: 'planned' })
    const loungeStart = daysAgo(now, 12)
    const lounge = tank({
      clientId: lowe, siteId: loweHome, name: 'Marlowe lounge reef',
      shape: 'bow-front', dimensions: { lengthMm: 1100, widthMm: 480, heightMm: 550, bowDepthMm: 100 }, sumpLitres: 80,
      material: 'glass', waterSource: 'mixed', cycleMethod: 'fishless',
      aquaristId: ids.aquarist, supervisorId: ids.supervisor,
    }, { organisationId: orgId, status: 'cycling', cycleStartedAt: loungeStart.toISOString(), usualTestHour: 18 })
    const nanoStart = daysAgo(now, 34)
    const nano = tank({
      clientId: quayle, siteId: quayleFlat, name: 'Quay Street nano',
      shape: 'cube', dimensions: { sideMm: 450 }, sumpLitres: 0,
      material: 'glass', waterSource: 'natural', cycleMethod: 'fishless',
      aquaristId: ids.aquarist, supervisorId: ids.supervisor,
    }, { organisationId: orgId, status: 'cycled', cycleStartedAt: nanoStart.toISOString(), usualTestHour: 19 })
    const studyStart = daysAgo(now, 9)
    const study = tank({
      clientId: hart, siteId: hartHouse, name: 'Fernhill study reef',
      shape: 'rectangular', dimensions: { lengthMm: 900, widthMm: 450, heightMm: 500 }, sumpLitres: 0,
      material: 'acrylic', waterSource: 'mixed', cycleMethod: 'fish-in',
      aquaristId: ids.aquarist2, supervisorId: ids.supervisor,
    }, { organisationId: orgId, status: 'cycling', cycleStartedAt: studyStart.toISOString(), usualTestHour: 8 })

    // Each stage's values pass the stage form and its commissioning gate, as if entered through them.
    const plan = (tankId: string, rows: (typeof planStages.$inferInsert)[]) => rows.map(row => ({
      ...row,
      data: checkedStageData(row.key, row.data ?? {}, {
        closing: row.status === 'done', now, tank: facts.get(tankId)!, stages: rows.map(r => ({ key: r.key, data: r.data ?? {} })),
      }),
    }))
    const signOffRequested = new Date(now.getTime() - 2 * 3_600_000)
    const nanoCycleClosed = new Date(signOffRequested.getTime() - 3_600_000)
    tx.insert(planStages).values([
      ...plan(lobby, finishStages(planStageRows(lobby, DEFAULT_PLAN_TEMPLATE), 1, ids.aquarist, daysAgo(now, 2), { name: 'Teodor Nakamura-Reyes', roomUse: 'office' })),
      ...plan(lounge, finishStages(planStageRows(lounge, DEFAULT_PLAN_TEMPLATE), 6, ids.aquarist, daysAgo(now, 15))),
      // The nano's aquarist closed the cycling stage on the last clean tests, just before asking for sign-off.
      ...plan(nano, finishStages(planStageRows(nano, DEFAULT_PLAN_TEMPLATE), 7, ids.aquarist, daysAgo(now, 38), undefined, nanoCycleClosed)),
      ...plan(study, finishStages(planStageRows(study, DEFAULT_PLAN_TEMPLATE), 6, ids.aquarist2, daysAgo(now, 11), { name: 'Wren Castellanos', roomUse: 'living-area' })),
    ]).run()

    // Today's test counts only once it is at least an hour old: the demo never shows a test from the future.
    const notAfter = new Date(now.getTime() - 3_600_000)
    const notes: Partial<Record<CycleEventKind, string>> = {
      'ammonia-dose': 'Dosed to about 2 ppm NH3',
      'bacteria-dose': 'Bottled nitrifying bacteria, full starter dose',
      'livestock-added': 'Three hardy damselfish',
    }
    const addHistory = (tankId: string, enteredBy: string, staff: string, plan: SimulationPlan) => {
      const history = demoHistory(simulate(plan), notAfter, notes)
      if (history.readings.length) tx.insert(readings).values(history.readings.map(r => ({ tankId, enteredBy, ...r }))).run()
      // The aquarist started the cycle; the client logs the daily doses.
      if (history.events.length) {
        tx.insert(events).values(history.events.map((e, i) => ({ tankId, ...e, enteredBy: i < 2 ? staff : enteredBy }))).run()
      }
    }
    addHistory(lounge, ids.client, ids.aquarist, loungePlan(now))
    addHistory(nano, ids.client2, ids.aquarist, nanoPlan(now))
    addHistory(study, ids.client3, ids.aquarist2, studyPlan(now))
    const studyDay7 = new Date(Date.parse(studyPlan(now).start) + 7 * DAY + 19 * 3_600_000)
    if (studyDay7 <= notAfter) {
      const note = checkedEvent({ at: studyDay7.toISOString(), kind: 'note', notes: 'Client fed heavily over the weekend' }, notAfter)
      tx.insert(events).values({ tankId: study, ...eventColumns(note), enteredBy: ids.client3 }).run()
    }

    // The stored verdicts open their alerts too (the study reef's ammonia spike), with the e-mail queued.
    const baseUrl = process.env.NUXT_PUBLIC_BASE_URL || 'http://localhost:3000'
    for (const tankId of [lobby, lounge, nano, study]) {
      const verdict = computeAndStoreVerdict(tx, tankId, now)
      if (verdict) syncAlertsInDb(tx, tankId, verdict, { now, baseUrl })
    }

    // 'cycled' means awaiting sign-off: the nano's aquarist has asked the supervisor to sign it.
    tx.insert(signOffs).values({
      organisationId: orgId, tankId: nano, requestedBy: ids.aquarist, requestedAt: signOffRequested.toISOString(),
      requestNote: 'Clearance dose processed; ammonia and nitrite have read zero since. Ready for review.', status: 'requested',
    }).run()

    return {
      organisationId: orgId,
      users: ids,
      clients: { lowe, quayle, hart },
      tanks: { lobby, lounge, nano, study },
    }
  })
}
