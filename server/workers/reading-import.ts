/**
 * The CSV import, run in a worker thread of the heavy-work pool (server/utils/heavy-work.ts)
 * so that parsing, converting, hashing and writing 100,000 rows never hold up the request
 * loop other companies are served from. It opens its own connection to the same SQLite
 * file (WAL, the same pragmas as the server's) and writes the rows and their audit line in
 * one IMMEDIATE transaction: all of them or none, and the day cap is counted under the
 * write lock, so no concurrent write can take the same room.
 *
 * Framework-free (no Nitro, no h3); its entry is heavy.worker.ts.
 */
import { randomUUID } from 'node:crypto'
import { capPerDay, planDays, planImport, toPreview, type ImportPlan } from '#shared/readings/import-plan'
import type { KitBasisChoice } from '#shared/readings/entry'
import type { ReadingImportInput } from '#shared/schemas/reading'
import type { ImportPreview } from '#shared/types/readings'
import type { MeasuredField } from '#shared/vocabulary'
import type { TidewrightDB } from '#server/db/connection'
import { recordAudit } from '#server/domain/audit/record'
import { testsPerDay } from '#server/domain/readings/day-cap'
import { lockedUntil } from '#server/domain/sign-off/lock'
import { workerConnection } from './connection'

export interface ReadingImportTask {
  dbPath: string
  tankId: string
  actor: { id: string, organisationId: string }
  input: ReadingImportInput
  kit: KitBasisChoice
  /** End of the signed-off period in ms, or null. */
  lockedMs: number | null
  nowMs: number
}

export type ReadingImportResult
  = | { kind: 'done', preview: ImportPreview }
    | { kind: 'field-issues', issues: { field: string, message: string }[] }
    | { kind: 'too-many-rows' }
    /** A sign-off was approved (or reopened) after the request read the boundary: nothing written. */
    | { kind: 'lock-moved' }

const INSERT_SQL = `INSERT INTO readings (id, tank_id, taken_at, entered_by, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity,
  alkalinity_dkh, calcium_mg_l, magnesium_mg_l, phosphate_mg_l, notes, entered, import_key, created_at, updated_at)
  VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)
  ON CONFLICT (tank_id, import_key) DO NOTHING`

/** The plan held to the day cap against what the tank holds now. */
function capped(db: TidewrightDB, tankId: string, plan: ImportPlan): ImportPlan {
  const days = planDays(plan)
  return days ? capPerDay(plan, testsPerDay(db, tankId, days.first, days.last)) : plan
}

/** Plans the file and, unless it is a dry run, writes it; see the file's comment. */
export function readingImport(task: ReadingImportTask): ReadingImportResult {
  const db = workerConnection(task.dbPath)
  const sqlite = db.$client
  const existing = new Set<string>(sqlite.prepare('SELECT import_key FROM readings WHERE tank_id = ? AND import_key IS NOT NULL').pluck().all(task.tankId) as string[])
  const outcome = planImport(task.input, {
    kit: task.kit,
    lockedMs: task.lockedMs ?? Number.NEGATIVE_INFINITY,
    alreadyImported: key => existing.has(key),
    now: new Date(task.nowMs),
  })
  if (outcome.kind !== 'plan') return outcome
  if (task.input.dryRun) return { kind: 'done', preview: toPreview(capped(db, task.tankId, outcome.plan), true, 0) }

  const insert = sqlite.prepare(INSERT_SQL)
  const stamp = new Date(task.nowMs).toISOString()
  const write = sqlite.transaction(() => {
    // Counted inside the write lock: what other writers committed before is seen, and
    // nobody writes until this commits.
    // The boundary was read on the request loop before the file came here; a sign-off decided
    // since would let the plan write into what the supervisor has just signed.
    const lockedNow = lockedUntil(db, task.tankId)
    if ((lockedNow === null ? null : Date.parse(lockedNow)) !== task.lockedMs) return null
    const plan = capped(db, task.tankId, outcome.plan)
    let inserted = 0
    const rows = plan.rows
    for (let i = 0; i < rows.length; i++) {
      const v = (field: MeasuredField) => rows.value(i, field)
      inserted += insert.run(randomUUID(), task.tankId, rows.takenAt[i], task.actor.id, v('ammoniaN'), v('nitriteN'), v('nitrateN'), v('pH'), v('temperatureC'), v('salinity'),
        v('alkalinityDkh'), v('calciumMgL'), v('magnesiumMgL'), v('phosphateMgL'), rows.notes[i], rows.entered[i], rows.key[i], stamp, stamp).changes
    }
    // Same transaction: the rows and their audit line commit together or not at all.
    recordAudit(db, task.actor, { action: 'reading.import', entity: 'tank', entityId: task.tankId, after: { rows: plan.rowCount, inserted, skipped: plan.rowCount - inserted, errors: plan.errors.length } })
    return { plan, inserted }
  })
  const written = write.immediate()
  if (!written) return { kind: 'lock-moved' }
  const { plan, inserted } = written
  return { kind: 'done', preview: toPreview(plan, false, inserted) }
}
