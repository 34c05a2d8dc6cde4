/**
 * Test data beyond the demo company: a second, unrelated company, so every test can
 * prove that nothing crosses between tenants.
 */
import { DEFAULT_PLAN_TEMPLATE } from '../../shared/plan/default-template'
import type { TidewrightDB } from '../../server/db/connection'
import { planStageRows } from '../../server/db/plan-stages'
import { clients, organisations, planStages, tanks, users } from '../../server/db/schema'
import { DEMO_PASSWORD, seedDemo, type DemoIds } from '../../server/db/seed/demo'
import { hashPasswordOffline } from '../../server/db/seed/password'

export interface OtherCompanyIds {
  organisationId: string
  aquaristId: string
  clientUserId: string
  tankId: string
}

export interface Fixtures {
  demo: DemoIds
  other: OtherCompanyIds
}

export const PASSWORD = DEMO_PASSWORD
export const OTHER_AQUARIST_EMAIL = 'aquarist@other-company.test'
export const OTHER_CLIENT_EMAIL = 'client@other-company.test'
/** An account only the sign-in throttling test uses: it gets locked out, so no other test may sign in with it. */
export const LOCKOUT_EMAIL = 'lockout@other-company.test'

/** A second company with one aquarist, one client and one tank. */
export async function seedOtherCompany(db: TidewrightDB): Promise<OtherCompanyIds> {
  const passwordHash = await hashPasswordOffline(PASSWORD)
  return db.transaction((tx) => {
    const org = tx.insert(organisations).values({ name: 'Tidal Reach Aquaria' }).returning().get()
    const client = tx.insert(clients).values({ organisationId: org.id, name: 'Ansel Brookmoor' }).returning().get()
    const aquarist = tx.insert(users).values({ organisationId: org.id, email: OTHER_AQUARIST_EMAIL, name: 'Juno Pellworth', role: 'aquarist', passwordHash }).returning().get()
    const clientUser = tx.insert(users).values({ organisationId: org.id, email: OTHER_CLIENT_EMAIL, name: 'Ansel Brookmoor', role: 'client', clientId: client.id, passwordHash }).returning().get()
    tx.insert(users).values({ organisationId: org.id, email: LOCKOUT_EMAIL, name: 'Tamsin Orrell', role: 'aquarist', passwordHash }).run()
    const tank = tx.insert(tanks).values({
      organisationId: org.id, clientId: client.id, name: 'Brookmoor hall reef', volumeLitres: 400,
      status: 'cycling', aquaristId: aquarist.id, cycleStartedAt: new Date().toISOString(),
    }).returning().get()
    tx.insert(planStages).values(planStageRows(tank.id, DEFAULT_PLAN_TEMPLATE)).run()
    return { organisationId: org.id, aquaristId: aquarist.id, clientUserId: clientUser.id, tankId: tank.id }
  })
}

/** Demo company plus the second company, into a migrated empty database. */
export async function seedFixtures(db: TidewrightDB): Promise<Fixtures> {
  const demo = await seedDemo(db)
  const other = await seedOtherCompany(db)
  return { demo, other }
}
