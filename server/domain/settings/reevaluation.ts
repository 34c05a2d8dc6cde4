/**
 * Re-evaluating a company's tanks after its thresholds change. The save marks every stored
 * verdict of the company stale in its own transaction (so no verdict made under the old
 * limits is ever read as current); the verdicts are then made again in bounded batches, and a
 * read of a stale verdict makes it again first. Progress is counted from the marks themselves,
 * so it survives a restart and needs no job table. Framework-free.
 */
import { and, eq, inArray, isNull, sql } from 'drizzle-orm'
import type { ReevaluationProgress } from '../../../shared/types/settings'
import type { Db } from '../../db/connection'
import { tanks, tankVerdicts } from '../../db/schema'

/** How many tanks one batch re-evaluates before the server serves other requests again. */
export const REEVALUATION_BATCH = 10

const companyTanks = (db: Db, organisationId: string) =>
  db.select({ id: tanks.id }).from(tanks).where(eq(tanks.organisationId, organisationId))

/**
 * Marks the stored verdict of every tank of the company that is not archived stale, keeping
 * its phase to compare with later. Call it inside the transaction that saves the thresholds.
 */
export function markCompanyVerdictsStale(db: Db, organisationId: string): void {
  // Marks of an earlier change (and of tanks archived since) would count in this one's progress.
  db.update(tankVerdicts).set({ phaseBeforeReevaluation: null })
    .where(inArray(tankVerdicts.tankId, companyTanks(db, organisationId))).run()
  const open = db.select({ id: tanks.id }).from(tanks).where(and(eq(tanks.organisationId, organisationId), isNull(tanks.archivedAt)))
  db.update(tankVerdicts).set({ stale: true, phaseBeforeReevaluation: sql`${tankVerdicts.phase}` })
    .where(inArray(tankVerdicts.tankId, open)).run()
}

/** Up to `limit` tanks of the company whose verdict still waits for re-evaluation. */
export function staleCompanyTanks(db: Db, organisationId: string, limit = REEVALUATION_BATCH): string[] {
  return db.select({ id: tankVerdicts.tankId }).from(tankVerdicts)
    .where(and(eq(tankVerdicts.stale, true), inArray(tankVerdicts.tankId, companyTanks(db, organisationId))))
    .limit(limit).all().map(r => r.id)
}

/** How far the last threshold change's re-evaluation has come, and how many tanks changed phase. */
export function reevaluationProgress(db: Db, organisationId: string): ReevaluationProgress {
  const row = db.select({
    total: sql<number>`count(*)`,
    done: sql<number>`coalesce(sum(case when ${tankVerdicts.stale} = 0 then 1 else 0 end), 0)`,
    phaseChanged: sql<number>`coalesce(sum(case when ${tankVerdicts.stale} = 0 and ${tankVerdicts.phase} <> ${tankVerdicts.phaseBeforeReevaluation} then 1 else 0 end), 0)`,
  }).from(tankVerdicts)
    .where(and(sql`${tankVerdicts.phaseBeforeReevaluation} is not null`, inArray(tankVerdicts.tankId, companyTanks(db, organisationId)))).get()
  return { total: Number(row?.total ?? 0), done: Number(row?.done ?? 0), phaseChanged: Number(row?.phaseChanged ?? 0) }
}
