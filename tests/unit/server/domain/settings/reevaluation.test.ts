/**
 * A threshold change against a real migrated SQLite file: the save marks every verdict of the
 * company stale in its own transaction, a stale verdict is never read as current, and the
 * progress counts the verdicts made again and the phases that changed.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase, type TidewrightDB } from '../../../../../server/db/connection'
import { clients, organisations, tanks, tankVerdicts, users } from '../../../../../server/db/schema'
import { computeAndStoreVerdict, tanksWithStaleVerdicts } from '../../../../../server/db/verdicts'
import { reevaluationProgress, staleCompanyTanks } from '../../../../../server/domain/settings/reevaluation'
import { readCompanySettings, saveCompanySettings } from '../../../../../server/domain/settings/update'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-reevaluation-'))
let db: TidewrightDB
afterAll(() => {
  db?.$client.close()
  rmSync(dir, { recursive: true, force: true })
})
beforeAll(() => {
  db = openDatabase(join(dir, 'reevaluation.sqlite'))
  migrateDatabase(db)
})

const HOUR = 3_600_000
const now = new Date('2026-11-20T12:00:00Z')

function company(name: string, tankCount: number) {
  const organisationId = db.insert(organisations).values({ name }).returning().get().id
  const clientId = db.insert(clients).values({ organisationId, name: `${name} client` }).returning().get().id
  const admin = { id: db.insert(users).values({ organisationId, email: `admin@${organisationId}.test`, name: 'Admin', role: 'admin' }).returning().get().id, organisationId }
  const tankIds = Array.from({ length: tankCount }, (_, i) => {
    const id = db.insert(tanks).values({ organisationId, clientId, name: `${name} tank ${i}`, volumeLitres: 200 }).returning().get().id
    computeAndStoreVerdict(db, id, now)
    return id
  })
  return { organisationId, admin, tankIds }
}

const staleOf = (id: string) => db.select({ stale: tankVerdicts.stale }).from(tankVerdicts).where(eq(tankVerdicts.tankId, id)).get()?.stale
function save(co: ReturnType<typeof company>, thresholds: Record<string, number>, version?: number) {
  const view = readCompanySettings(db, co.organisationId)!
  return saveCompanySettings(db, co.admin, { name: view.name, settings: { ...view.settings, thresholds }, version: version ?? view.version }, now)
}

describe('re-evaluation after a threshold change', () => {
  it('marks every verdict of the company stale with the save, and none of another company', () => {
    const co = company('Saltmarsh Reefs', 3)
    const other = company('Brackwater Aquaria', 2)
    expect(reevaluationProgress(db, co.organisationId)).toEqual({ total: 0, done: 0, phaseChanged: 0 })
    const saved = save(co, { ammoniaZeroN: 0.1 })
    expect(saved).toMatchObject({ ok: true, thresholdsChanged: ['ammoniaZeroN'] })
    expect(co.tankIds.map(staleOf)).toEqual([true, true, true])
    expect(other.tankIds.map(staleOf)).toEqual([false, false])
    expect(reevaluationProgress(db, co.organisationId)).toEqual({ total: 3, done: 0, phaseChanged: 0 })
    // A verdict made a minute ago is current by age, but stale by its mark: a read makes it again.
    expect(tanksWithStaleVerdicts(db, new Date(now.getTime() + 60_000), HOUR, co.tankIds).sort()).toEqual([...co.tankIds].sort())
    expect(staleCompanyTanks(db, co.organisationId, 2)).toHaveLength(2)

    computeAndStoreVerdict(db, co.tankIds[0]!, now)
    expect(staleOf(co.tankIds[0]!)).toBe(false)
    expect(reevaluationProgress(db, co.organisationId)).toEqual({ total: 3, done: 1, phaseChanged: 0 })
    expect(tanksWithStaleVerdicts(db, new Date(now.getTime() + 60_000), HOUR, co.tankIds).sort()).toEqual(co.tankIds.slice(1).sort())
  })

  it('counts a verdict whose phase changed, and starts the count again at the next change', () => {
    const co = company('Tidepool Works', 2)
    save(co, { ammoniaZeroN: 0.1 })
    // Stands in for a re-evaluation that moved the tank to another phase.
    db.update(tankVerdicts).set({ phase: 'ammonia', stale: false }).where(eq(tankVerdicts.tankId, co.tankIds[1]!)).run()
    expect(reevaluationProgress(db, co.organisationId)).toEqual({ total: 2, done: 1, phaseChanged: 1 })
    save(co, { ammoniaZeroN: 0.2 })
    expect(reevaluationProgress(db, co.organisationId)).toEqual({ total: 2, done: 0, phaseChanged: 0 })
  })

  it('marks nothing when only other settings change, or when the save is refused as stale', () => {
    const co = company('Coralline Services', 2)
    const view = readCompanySettings(db, co.organisationId)!
    expect(saveCompanySettings(db, co.admin, { name: 'Coralline Services Ltd', settings: view.settings, version: view.version }, now)).toMatchObject({ ok: true, thresholdsChanged: [] })
    expect(save(co, { ammoniaZeroN: 0.1 }, view.version)).toMatchObject({ ok: false, status: 409 })
    expect(co.tankIds.map(staleOf)).toEqual([false, false])
    expect(reevaluationProgress(db, co.organisationId)).toEqual({ total: 0, done: 0, phaseChanged: 0 })
  })

  it('leaves archived tanks out', () => {
    const co = company('Lagoon Fitters', 2)
    db.update(tanks).set({ archivedAt: now.toISOString() }).where(eq(tanks.id, co.tankIds[0]!)).run()
    save(co, { ammoniaZeroN: 0.1 })
    expect(co.tankIds.map(staleOf)).toEqual([false, true])
    expect(reevaluationProgress(db, co.organisationId)).toMatchObject({ total: 1 })
  })
})
