/**
 * The CSV import, run in a worker thread of the heavy-work pool (server/utils/heavy-work.ts)
 * so that parsing, converting, hashing and writing 100,000 rows never hold up the request
 * loop other companies are served from. It opens its own connection to the same SQLite
 * file (WAL, the same pragmas as the server's) and writes the rows and their audit line in
 * one IMMEDIATE transaction: all of them or none, and the day cap is counted under the
 * write lock, so no concurrent write can take the same room.
 *
 * Rows are written as they are read and checked, a chunk of IMPORT_CHUNK_ROWS at a time
 * (planImport hands them to the sink), so no array of the file's rows is built: memory stays
 * flat however long the file. Whether
 * a row is already held is the unique index's answer (ON CONFLICT DO NOTHING): no set of keys.
 * A dry run reads in one read transaction and writes nothing.
 *
 * Framework-free (no Nitro, no h3); its entry is heavy.worker.ts.
 */
import { randomUUID } from 'node:crypto'
import { performance } from 'node:perf_hooks'
import type { Statement } from 'better-sqlite3'
import { planImport, toPreview, type ImportRow, type ImportSink, type PlanContext, type PlanOutcome } from '#shared/readings/import-plan'
import type { KitBasisChoice } from '#shared/readings/entry'
import type { ReadingImportInput } from '#shared/schemas/reading'
import type { ImportPreview } from '#shared/types/readings'
import type { TidewrightDB } from '#server/db/connection'
import { recordAudit } from '#server/domain/audit/record'
import { testsOnDay } from '#server/domain/readings/day-cap'
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
  /** lockHeldMs: how long the write transaction held the database's write lock (BEGIN IMMEDIATE to COMMIT), 0 on a dry run. */
  = | { kind: 'done', preview: ImportPreview, lockHeldMs: number }
    | { kind: 'field-issues', issues: { field: string, message: string }[] }
    | { kind: 'too-many-rows' }
    /** A sign-off was approved (or reopened) after the request read the boundary: nothing written. */
    | { kind: 'lock-moved' }

const INSERT_SQL = `INSERT INTO readings (id, tank_id, taken_at, entered_by, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity,
  alkalinity_dkh, calcium_mg_l, magnesium_mg_l, phosphate_mg_l, notes, entered, import_key, created_at, updated_at)
  VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)
  ON CONFLICT (tank_id, import_key) DO NOTHING`

const HOLDS_SQL = 'SELECT 1 FROM readings WHERE tank_id = ? AND import_key = ?'

/** Thrown inside the write transaction to undo what it took (a file found too long, a header refused). */
class Refused extends Error {
  constructor(readonly outcome: Exclude<PlanOutcome, { kind: 'plan' }>) {
    super(outcome.kind)
  }
}

/** Statements prepared once per connection: an import runs them up to 100,000 times each. */
const statements = new WeakMap<TidewrightDB, { insert: Statement, holds: Statement }>()
function statementsOf(db: TidewrightDB) {
  let s = statements.get(db)
  if (!s) {
    s = { insert: db.$client.prepare(INSERT_SQL), holds: db.$client.prepare(HOLDS_SQL).pluck() }
    statements.set(db, s)
  }
  return s
}

/** The day cap's starting counts: the tank's current tests on a day, read under the transaction. */
const heldOnDayOf = (db: TidewrightDB, tankId: string) => (day: string) => testsOnDay(db, tankId, day)

/** A sink that writes each row (the real import). */
function writingSink(db: TidewrightDB, task: ReadingImportTask): ImportSink & { inserted: () => number } {
  const { insert, holds } = statementsOf(db)
  const stamp = new Date(task.nowMs).toISOString()
  let inserted = 0
  return {
    heldOnDay: heldOnDayOf(db, task.tankId),
    holds: key => holds.get(task.tankId, key) !== undefined,
    add: ({ takenAt, values: v, notes, key, entered }: ImportRow) => {
      const changes = insert.run(randomUUID(), task.tankId, takenAt, task.actor.id, v.ammoniaN, v.nitriteN, v.nitrateN, v.pH, v.temperatureC, v.salinity,
        v.alkalinityDkh, v.calciumMgL, v.magnesiumMgL, v.phosphateMgL, notes, entered, key, stamp, stamp).changes
      inserted += changes
      return changes === 1
    },
    inserted: () => inserted,
  }
}

/** A sink that only looks (a dry run): the keys this file has taken so far are kept to find repeats within it. */
function lookingSink(db: TidewrightDB, tankId: string): ImportSink {
  const { holds } = statementsOf(db)
  const taken = new Set<string>()
  const held = (key: string) => taken.has(key) || holds.get(tankId, key) !== undefined
  return {
    heldOnDay: heldOnDayOf(db, tankId),
    holds: held,
    add: ({ key }) => {
      if (held(key)) return false
      taken.add(key)
      return true
    },
  }
}

/** Plans the file and, unless it is a dry run, writes it; see the file's comment. */
export function readingImport(task: ReadingImportTask): ReadingImportResult {
  const db = workerConnection(task.dbPath)
  const sqlite = db.$client
  const context: PlanContext = { kit: task.kit, lockedMs: task.lockedMs ?? Number.NEGATIVE_INFINITY, now: new Date(task.nowMs) }
  if (task.input.dryRun) {
    // One read transaction: every look-up sees the same state of the tank.
    const outcome = sqlite.transaction(() => planImport(task.input, context, lookingSink(db, task.tankId))).deferred()
    return outcome.kind === 'plan' ? { kind: 'done', preview: toPreview(outcome.plan, true, 0), lockHeldMs: 0 } : outcome
  }
  let lockedAt = 0
  const write = sqlite.transaction(() => {
    lockedAt = performance.now() // the write lock is held from here (BEGIN IMMEDIATE) to the commit
    // The boundary was read on the request loop before the file came here; a sign-off decided
    // since would let the import write into what the supervisor has just signed. Read inside
    // the write lock, as are the day counts: nobody writes until this commits.
    const lockedNow = lockedUntil(db, task.tankId)
    if ((lockedNow === null ? null : Date.parse(lockedNow)) !== task.lockedMs) return null
    const sink = writingSink(db, task)
    const outcome = planImport(task.input, context, sink)
    if (outcome.kind !== 'plan') throw new Refused(outcome)
    const { plan } = outcome
    const inserted = sink.inserted()
    // Same transaction: the rows and their audit line commit together or not at all.
    recordAudit(db, task.actor, { action: 'reading.import', entity: 'tank', entityId: task.tankId, after: { rows: plan.rowCount, inserted, skipped: plan.rowCount - inserted, errors: plan.errors.length } })
    return { plan, inserted }
  })
  try {
    const written = write.immediate()
    const lockHeldMs = performance.now() - lockedAt
    if (!written) return { kind: 'lock-moved' }
    return { kind: 'done', preview: toPreview(written.plan, false, written.inserted), lockHeldMs }
  }
  catch (error) {
    if (error instanceof Refused) return error.outcome
    throw error
  }
}
