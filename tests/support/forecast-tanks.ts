/**
 * Cycling tanks with a chosen test history, written straight into the test database
 * for a scratch company and dated back from now, so forecast tests see a tank at a
 * known point of its cycle whatever day they run.
 */
import { inject } from 'vitest'
import { syncAlertsInDb } from '../../server/domain/alerts/sync'
import { openDatabase } from '../../server/db/connection'
import { events, readings, tanks } from '../../server/db/schema'
import { computeAndStoreVerdict } from '../../server/db/verdicts'
import type { ScratchCompany } from './company'

const DAY = 86_400_000

/** Daily tests, oldest first, mg/L as N; the last one was taken an hour ago. */
export interface DailyColumns {
  ammonia: readonly number[]
  nitrite: readonly number[]
  nitrate: readonly number[]
}

/**
 * The textbook fishless course to day 16 (a dose of about 2 ppm NH3 on day 0, nitrite
 * past its peak and halving every few days): shapes from reference.md section 9
 * (common practice, no published source).
 */
export const NITRITE_FALLING: DailyColumns = {
  ammonia: [1.6, 1.6, 1.5, 1.3, 1.0, 0.6, 0.3, 0.1, 0, 0, 0.3, 0, 0, 0, 0, 0],
  nitrite: [0, 0, 0.1, 0.3, 0.6, 0.9, 1.2, 1.4, 1.5, 1.5, 1.4, 1.3, 1.1, 0.8, 0.5, 0.25],
  nitrate: [0, 0, 0, 0, 0.05, 0.1, 0.15, 0.2, 0.3, 0.4, 0.5, 0.7, 0.9, 1.1, 1.3, 1.5],
}

/** Adds a fishless cycling tank for the company's client with these daily tests; returns its id. `dbPath`: a server of the test's own. */
export function seedCyclingTank(company: ScratchCompany, name: string, columns: DailyColumns, now = new Date(), dbPath: string = inject('dbPath')): string {
  const db = openDatabase(dbPath)
  try {
    const days = columns.ammonia.length
    const lastAt = now.getTime() - 3_600_000
    const dayAt = (i: number) => new Date(lastAt - (days - 1 - i) * DAY).toISOString()
    const tankId = db.insert(tanks).values({
      organisationId: company.organisationId, clientId: company.clientId, siteId: company.siteId, name, volumeLitres: 300,
      cycleMethod: 'fishless', status: 'cycling', cycleStartedAt: new Date(lastAt - days * DAY).toISOString(), aquaristId: company.ids.aquarist,
    }).returning().get().id
    db.insert(events).values([
      { tankId, at: new Date(lastAt - days * DAY + 3_600_000).toISOString(), kind: 'ammonia-dose', amount: 1.645, enteredBy: company.ids.aquarist },
      { tankId, at: new Date(lastAt - days * DAY + 3_600_000).toISOString(), kind: 'bacteria-dose', enteredBy: company.ids.aquarist },
    ]).run()
    db.insert(readings).values(columns.ammonia.map((ammoniaN, i) => ({
      tankId, takenAt: dayAt(i), enteredBy: company.ids.client, ammoniaN, nitriteN: columns.nitrite[i], nitrateN: columns.nitrate[i], pH: 8.1, temperatureC: 25.5, salinity: 34,
    }))).run()
    computeAndStoreVerdict(db, tankId, now)
    return tankId
  }
  finally {
    db.$client.close()
  }
}

/**
 * The same course with nitrite past its peak falling more slowly (about a sixth a day
 * instead of a third): its range lies about a week after NITRITE_FALLING's.
 */
export const NITRITE_FALLING_SLOWLY: DailyColumns = {
  ...NITRITE_FALLING,
  nitrite: [0, 0, 0.1, 0.3, 0.6, 0.9, 1.2, 1.4, 1.5, 1.5, 1.35, 1.2, 1.0, 0.8, 0.65, 0.5],
}

/**
 * Adds a fish-in tank for the company's client whose fish went in two days ago and whose
 * test an hour ago read 2 ppm total ammonia as NH3 (1.645 mg/L as N): over the 0.5 ppm
 * action level with fish in (common practice, no published source), so it has an open
 * danger alert, made as the server makes it. Returns its id.
 */
export function seedDangerTank(company: ScratchCompany, name: string, now = new Date(), dbPath: string = inject('dbPath')): string {
  const db = openDatabase(dbPath)
  try {
    const tankId = db.insert(tanks).values({
      organisationId: company.organisationId, clientId: company.clientId, siteId: company.siteId, name, volumeLitres: 300,
      cycleMethod: 'fish-in', status: 'cycling', cycleStartedAt: new Date(now.getTime() - 2 * DAY).toISOString(), aquaristId: company.ids.aquarist,
    }).returning().get().id
    db.insert(events).values({ tankId, at: new Date(now.getTime() - 2 * DAY + 3_600_000).toISOString(), kind: 'livestock-added', amount: 2, group: 'fish', enteredBy: company.ids.aquarist }).run()
    db.insert(readings).values({
      tankId, takenAt: new Date(now.getTime() - 3_600_000).toISOString(), enteredBy: company.ids.client, ammoniaN: 1.645, nitriteN: 0, nitrateN: 0, pH: 8.1, temperatureC: 25.5, salinity: 34,
    }).run()
    const verdict = computeAndStoreVerdict(db, tankId, now)!
    syncAlertsInDb(db, tankId, verdict, { now, baseUrl: 'http://localhost:3000' })
    return tankId
  }
  finally {
    db.$client.close()
  }
}
