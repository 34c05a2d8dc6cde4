/**
 * A scratch company for the attention board and the danger-first screens, written into the
 * real test database: one tank in each situation the board ranks (an open danger alert, a
 * week-old silence, a quiet plan, a tank being built) and a fish-in tank with fish and no
 * tests yet, so a client can save the first bad test. Verdicts and alerts are evaluated
 * exactly as the seed does it; nothing here touches the demo company other tests count.
 */
import { and, eq, sql } from 'drizzle-orm'
import type { TidewrightDB } from '../../server/db/connection'
import { syncAlertsInDb } from '../../server/domain/alerts/sync'
import { planStageRows } from '../../server/db/plan-stages'
import { clients, events, organisations, planStages, readings, tanks, users } from '../../server/db/schema'
import { hashPasswordOffline } from '../../server/db/seed/password'
import { computeAndStoreVerdict } from '../../server/db/verdicts'
import { DEFAULT_PLAN_TEMPLATE } from '../../shared/plan/default-template'
import { PASSWORD } from './fixtures'
import { copyTank } from './sign-off-tanks'

export const ATTENTION_USERS = {
  aquarist: { email: 'aquarist@kelpwater-reef.test', name: 'Ilse Varga-Moreno', role: 'aquarist' },
  aquarist2: { email: 'aquarist2@kelpwater-reef.test', name: 'Rufus Abernethy', role: 'aquarist' },
  supervisor: { email: 'supervisor@kelpwater-reef.test', name: 'Dagny Okonkwo', role: 'supervisor' },
  client: { email: 'client@kelpwater-reef.test', name: 'Philippa Tremaine', role: 'client' },
} as const

export interface AttentionCompany {
  organisationId: string
  users: Record<keyof typeof ATTENTION_USERS, string>
  /** `firstTest` and `secondTest`: fish in, no tests yet, so the first bad test opens an alert. */
  tanks: { alerting: string, silent: string, quiet: string, building: string, firstTest: string, secondTest: string }
}

const DAY_MS = 86_400_000

/** Moves a tank's readings, events and cycle start `days` into the past. */
function ageTank(db: TidewrightDB, tankId: string, days: number) {
  const shift = `-${days} days`
  db.update(readings).set({ takenAt: sql`strftime('%Y-%m-%dT%H:%M:%fZ', ${readings.takenAt}, ${shift})` }).where(eq(readings.tankId, tankId)).run()
  db.update(events).set({ at: sql`strftime('%Y-%m-%dT%H:%M:%fZ', ${events.at}, ${shift})` }).where(eq(events.tankId, tankId)).run()
  const tank = db.select().from(tanks).where(eq(tanks.id, tankId)).get()!
  db.update(tanks).set({ cycleStartedAt: new Date(Date.parse(tank.cycleStartedAt!) - days * DAY_MS).toISOString() }).where(eq(tanks.id, tankId)).run()
}

/** The scratch company, its people and tanks. */
export async function seedAttentionCompany(db: TidewrightDB, source: { study: string, lounge: string }): Promise<AttentionCompany> {
  const passwordHash = await hashPasswordOffline(PASSWORD)
  const now = new Date()
  const org = db.insert(organisations).values({ name: 'Kelpwater Reef Care', settings: { defaultUnits: 'us' } }).returning().get()
  const tremaine = db.insert(clients).values({ organisationId: org.id, name: ATTENTION_USERS.client.name }).returning().get().id
  const ids = {} as AttentionCompany['users']
  for (const [key, u] of Object.entries(ATTENTION_USERS) as [keyof typeof ATTENTION_USERS, (typeof ATTENTION_USERS)[keyof typeof ATTENTION_USERS]][]) {
    ids[key] = db.insert(users).values({ organisationId: org.id, email: u.email, name: u.name, role: u.role, passwordHash, clientId: key === 'client' ? tremaine : null, units: 'us' }).returning().get().id
  }
  const mine = { organisationId: org.id, clientId: tremaine, siteId: null, supervisorId: ids.supervisor }

  // The study reef's history: fish in, ammonia spiking over the action level in the last two days.
  const alerting = copyTank(db, source.study, 'Kelpwater alerting reef', { ...mine, aquaristId: ids.aquarist2, status: 'cycling' })
  const verdict = computeAndStoreVerdict(db, alerting, now)!
  syncAlertsInDb(db, alerting, verdict, { now, baseUrl: 'http://localhost:3000' })

  // The lounge's history a week older: nobody has tested for days.
  const silent = copyTank(db, source.lounge, 'Kelpwater silent reef', { ...mine, aquaristId: ids.aquarist, status: 'cycling' })
  ageTank(db, silent, 7)
  computeAndStoreVerdict(db, silent, now)

  const newTank = (name: string, values: Partial<typeof tanks.$inferInsert>) => {
    const id = db.insert(tanks).values({
      ...mine, name, shape: 'rectangular', dimensions: { lengthMm: 1200, widthMm: 500, heightMm: 500 }, volumeLitres: 300, aquaristId: ids.aquarist, ...values,
    }).returning().get().id
    db.insert(planStages).values(planStageRows(id, DEFAULT_PLAN_TEMPLATE)).run()
    computeAndStoreVerdict(db, id, now)
    return id
  }
  const quiet = newTank('Kelpwater quiet reef', { status: 'planned' })
  const building = newTank('Kelpwater building reef', { status: 'building' })
  db.update(planStages).set({ status: 'done', completedBy: ids.aquarist, completedAt: now.toISOString() }).where(and(eq(planStages.tankId, building), eq(planStages.key, 'site-survey'))).run()
  db.update(planStages).set({ status: 'in-progress' }).where(and(eq(planStages.tankId, building), eq(planStages.key, 'leak-test'))).run()

  // Fish went in yesterday; no test yet, so no alert yet.
  const withFish = (name: string) => {
    const id = newTank(name, { status: 'cycling', cycleMethod: 'fish-in', cycleStartedAt: new Date(now.getTime() - DAY_MS).toISOString(), usualTestHour: 23 })
    db.insert(events).values({ tankId: id, at: new Date(now.getTime() - DAY_MS + 3_600_000).toISOString(), kind: 'livestock-added', amount: 2, group: 'fish', notes: 'Two hardy damselfish' }).run()
    computeAndStoreVerdict(db, id, now)
    return id
  }
  const firstTest = withFish('Kelpwater first-test reef')
  const secondTest = withFish('Kelpwater second-test reef')

  return { organisationId: org.id, users: ids, tanks: { alerting, silent, quiet, building, firstTest, secondTest } }
}
