/**
 * The CSV import, run in a worker thread of the heavy-work pool (server/utils/heavy-work.ts)
 * so that parsing, converting, hashing and writing 100,000 rows never hold up the request
 * loop other companies are served from. It opens its own connection to the same SQLite
 * file (WAL, the same pragmas as the server's).
 *
 * Two steps, so the database's write lock is held only for the write (every other company's
 * save waits while it is held):
 * 1. Stage (no write lock): planImport reads and checks the file a chunk at a time (a file on
 *    disk is read in pieces too, never whole: server/workers/file-text.ts), in one
 *    read transaction, and each row that passes goes into a TEMP table of this connection
 *    (temp tables live outside the main database, spill to a file, and take none of its
 *    locks). No array of the file's rows is built: memory stays flat however long the file.
 *    A row the tank already holds is a duplicate (the unique index's look-up, skipped when
 *    the tank holds no imported test at all); a repeat within the file, the temp table's unique key.
 *    Each staged row gets its id here, in the file's order (server/db/ordered-ids.ts), so the
 *    write adds to readings' primary key index at one place instead of all over it.
 * 2. Write, in one short IMMEDIATE transaction: check again what may have changed since
 *    staging (a sign-off decided, tests saved meanwhile that now fill a day: they take its
 *    room first and the file's last staged rows of that day are refused, per row; a test of
 *    the file imported meanwhile: a duplicate, by ON CONFLICT), copy the staged rows into
 *    readings with INSERT ... SELECT (a slice of the file's lines at a time), write the audit
 *    line, commit. All or none.
 * A dry run stages and checks the same way and writes nothing. The temp table is dropped
 * either way.
 *
 * Framework-free (no Nitro, no h3); its entry is heavy.worker.ts.
 */
import { performance } from 'node:perf_hooks'
import type { Statement } from 'better-sqlite3'
import { MAX_REPORTED_ERRORS, planImport, toPreview, type ImportPlan, type ImportRow, type ImportSink, type PlanContext, type PlanOutcome } from '#shared/readings/import-plan'
import type { KitBasisChoice } from '#shared/readings/entry'
import { dayFullRowMessage, dayOf, TESTS_PER_TANK_PER_DAY } from '#shared/readings/limits'
import type { ReadingImportOptions } from '#shared/schemas/reading'
import type { ImportPreview, ImportRowError } from '#shared/types/readings'
import type { TidewrightDB } from '#server/db/connection'
import { orderedIds } from '#server/db/ordered-ids'
import { recordAudit } from '#server/domain/audit/record'
import { testsOnDay } from '#server/domain/readings/day-cap'
import { lockedUntil } from '#server/domain/sign-off/lock'
import { workerConnection } from './connection'
import { fileText, textPieces } from './file-text'

/**
 * Where the file is: its text (sent as JSON, copied into the worker whole) or a temporary
 * file (sent as the request's body, streamed there by the route), read a piece at a time.
 */
export type ImportFileSource = { text: string } | { path: string }

export interface ReadingImportTask {
  dbPath: string
  tankId: string
  actor: { id: string, organisationId: string }
  /** How the file is read, and whether to write. */
  input: ReadingImportOptions & { dryRun: boolean }
  file: ImportFileSource
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

/**
 * The staged rows: the columns of readings the file gives, keyed by the file's row number.
 * A repeat within the file is a row with an import key already staged; as the key hashes the
 * row's time, it is unique with the time in front: a file in time order (either way) then
 * adds to one end of the index, where the key alone (random) went anywhere in it.
 */
const CREATE_STAGE_SQL = `CREATE TEMP TABLE import_stage (line INTEGER PRIMARY KEY, id TEXT NOT NULL, taken_at TEXT NOT NULL,
  ammonia_n REAL, nitrite_n REAL, nitrate_n REAL, ph REAL, temperature_c REAL, salinity REAL,
  alkalinity_dkh REAL, calcium_mg_l REAL, magnesium_mg_l REAL, phosphate_mg_l REAL,
  notes TEXT, entered TEXT NOT NULL, import_key TEXT NOT NULL, UNIQUE (taken_at, import_key))`

const STAGE_SQL = `INSERT INTO temp.import_stage (line, id, taken_at, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity,
  alkalinity_dkh, calcium_mg_l, magnesium_mg_l, phosphate_mg_l, notes, entered, import_key)
  VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)
  ON CONFLICT (taken_at, import_key) DO NOTHING`

/**
 * File rows copied into readings by one statement. readings has row triggers (the tank's data
 * revision), so SQLite first copies what the SELECT gives into a transient table of its own,
 * whose page cache is SQLite's default (16 MB), not the temp schema's: the whole staged file at
 * once held 14 MiB more in the worker at 100,000 rows (4 MiB at 10,000). A slice of 4,096 rows
 * is about 1.5 MB however long the file, and the slices took no time we could measure.
 */
export const PUBLISH_SLICE_LINES = 4096

// The rows of one slice of the file's lines (@from to @to), in file order. (SQLite needs a WHERE before an upsert clause on INSERT ... SELECT.)
const PUBLISH_SQL = `INSERT INTO readings (id, tank_id, taken_at, entered_by, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity,
  alkalinity_dkh, calcium_mg_l, magnesium_mg_l, phosphate_mg_l, notes, entered, import_key, created_at, updated_at)
  SELECT id, @tankId, taken_at, @enteredBy, ammonia_n, nitrite_n, nitrate_n, ph, temperature_c, salinity,
  alkalinity_dkh, calcium_mg_l, magnesium_mg_l, phosphate_mg_l, notes, entered, import_key, @stamp, @stamp
  FROM temp.import_stage WHERE line BETWEEN @from AND @to ORDER BY line
  ON CONFLICT (tank_id, import_key) DO NOTHING`

const HOLDS_SQL = 'SELECT 1 FROM readings WHERE tank_id = ? AND import_key = ?'
const HOLDS_ANY_SQL = 'SELECT 1 FROM readings WHERE tank_id = ? AND import_key IS NOT NULL LIMIT 1'

/** Statements on the main database, prepared once per connection: staging runs `holds` up to 100,000 times. */
const statements = new WeakMap<TidewrightDB, { holds: Statement, holdsAny: Statement }>()
function statementsOf(db: TidewrightDB): { holds: Statement, holdsAny: Statement } {
  let s = statements.get(db)
  if (!s) {
    s = { holds: db.$client.prepare(HOLDS_SQL).pluck(), holdsAny: db.$client.prepare(HOLDS_ANY_SQL).pluck() }
    statements.set(db, s)
  }
  return s
}

/** The temp table's statements (prepared for each import, as the table lives only as long as it) and its rows per day. */
export interface Stage {
  /** Rows staged on each day (YYYY-MM-DD, UTC): the days the write checks again. */
  perDay: Map<string, number>
  insert: Statement
  hasKey: Statement
  count: Statement
  lastLine: Statement
  ofDay: Statement
  drop: Statement
  publish: Statement
}

function openStage(db: TidewrightDB): Stage {
  const sqlite = db.$client
  sqlite.exec('DROP TABLE IF EXISTS temp.import_stage') // left by an import cut short
  sqlite.exec(CREATE_STAGE_SQL)
  return {
    perDay: new Map(),
    insert: sqlite.prepare(STAGE_SQL),
    hasKey: sqlite.prepare('SELECT 1 FROM temp.import_stage WHERE taken_at = ? AND import_key = ?').pluck(),
    count: sqlite.prepare('SELECT count(*) FROM temp.import_stage').pluck(),
    lastLine: sqlite.prepare('SELECT max(line) FROM temp.import_stage').pluck(),
    ofDay: sqlite.prepare('SELECT line, import_key AS key FROM temp.import_stage WHERE substr(taken_at, 1, 10) = ? ORDER BY line'),
    drop: sqlite.prepare('DELETE FROM temp.import_stage WHERE line = ?'),
    publish: sqlite.prepare(PUBLISH_SQL),
  }
}

/** Stages each row that passes (see the file's comment). Runs in staging's read transaction. */
function stagingSink(db: TidewrightDB, tankId: string, stage: Stage, nowMs: number): ImportSink {
  const { holds, holdsAny } = statementsOf(db)
  // Ids in the file's order, which the write keeps: readings' primary key index takes them as an append (server/db/ordered-ids.ts).
  const idOf = orderedIds(nowMs)
  // Asked once, in the read transaction every look-up shares: a tank that holds no imported
  // test holds none of the file's keys, and its rows are not looked up one by one (a first
  // import, the long one). A row imported meanwhile is still a duplicate, by the write's ON CONFLICT.
  const tankHolds = holdsAny.get(tankId) === undefined
    ? () => false
    : (key: string) => holds.get(tankId, key) !== undefined
  return {
    heldOnDay: day => testsOnDay(db, tankId, day),
    holds: ({ takenAt, key }) => tankHolds(key) || stage.hasKey.get(takenAt, key) !== undefined,
    add: ({ line, takenAt, values: v, notes, key, entered }: ImportRow) => {
      if (tankHolds(key)) return false
      const staged = stage.insert.run(line, idOf(line), takenAt, v.ammoniaN, v.nitriteN, v.nitrateN, v.pH, v.temperatureC, v.salinity,
        v.alkalinityDkh, v.calciumMgL, v.magnesiumMgL, v.phosphateMgL, notes, entered, key).changes === 1
      if (staged) {
        const day = dayOf(takenAt)
        stage.perDay.set(day, (stage.perDay.get(day) ?? 0) + 1)
      }
      return staged
    },
  }
}

/** What the check made under the write lock changed: rows now duplicates, rows now over their day's cap. */
interface Recheck {
  duplicates: number
  refused: ImportRowError[]
}

/**
 * Under the write lock: each day the staged rows fall on, held to its cap against the tests
 * the tank holds now (staging counted the tests it held then). Tests saved meanwhile take
 * the day's room first; the file's last staged rows of a day with too little room are
 * unstaged and refused, and rows the tank now holds (imported meanwhile) unstaged as duplicates.
 */
function recheckDays(db: TidewrightDB, tankId: string, stage: Stage): Recheck {
  const { holds } = statementsOf(db)
  const result: Recheck = { duplicates: 0, refused: [] }
  for (const [day, n] of stage.perDay) {
    const held = testsOnDay(db, tankId, day)
    if (held + n <= TESTS_PER_TANK_PER_DAY) continue
    let room = TESTS_PER_TANK_PER_DAY - held
    for (const { line, key } of stage.ofDay.all(day) as { line: number, key: string }[]) {
      if (holds.get(tankId, key) !== undefined) {
        stage.drop.run(line)
        result.duplicates++
      }
      else if (room > 0) room--
      else {
        stage.drop.run(line)
        result.refused.push({ row: line, field: 'takenAt', message: dayFullRowMessage(day) })
      }
    }
  }
  return result
}

/** Folds what the write found into the plan: the answer then says what was written. */
function settle(plan: ImportPlan, recheck: Recheck, staged: number, inserted: number): void {
  // Staged rows the insert found held (imported since the check) are duplicates too.
  const lateDuplicates = recheck.duplicates + (staged - inserted)
  plan.added -= lateDuplicates + recheck.refused.length
  plan.duplicates += lateDuplicates
  if (!recheck.refused.length) return
  plan.errorCount += recheck.refused.length
  const refusedRows = new Set(recheck.refused.map(e => e.row))
  plan.preview = plan.preview.filter(p => !refusedRows.has(p.row))
  // The first 200 of both, in file order: the plan's list already holds its own first 200.
  plan.errors = [...plan.errors, ...recheck.refused].sort((a, b) => a.row - b.row).slice(0, MAX_REPORTED_ERRORS)
}

/** Step 1: the file read, checked and staged; the stage is left for commitStaged (or dropStage). */
export function stageImport(task: ReadingImportTask): { outcome: PlanOutcome, db: TidewrightDB, stage: Stage } {
  const db = workerConnection(task.dbPath)
  const context: PlanContext = { kit: task.kit, lockedMs: task.lockedMs ?? Number.NEGATIVE_INFINITY, now: new Date(task.nowMs) }
  const stage = openStage(db)
  // One read transaction: every look-up sees the same state of the tank; the temp table's writes take no lock of the main database.
  const text = 'path' in task.file ? fileText(task.file.path) : textPieces(task.file.text)
  const outcome = db.$client.transaction(() => planImport(text, task.input, context, stagingSink(db, task.tankId, stage, task.nowMs))).deferred()
  return { outcome, db, stage }
}

/** Drops the staged rows. */
export function dropStage(db: TidewrightDB): void {
  db.$client.exec('DROP TABLE IF EXISTS temp.import_stage')
}

/** Copies the staged rows into readings, PUBLISH_SLICE_LINES of the file's lines at a time, in file order; returns the rows written. */
function publishStaged(task: ReadingImportTask, stage: Stage): number {
  const last = (stage.lastLine.get() as number | null) ?? 0
  const params = { tankId: task.tankId, enteredBy: task.actor.id, stamp: new Date(task.nowMs).toISOString(), from: 0, to: 0 }
  let inserted = 0
  // Line 1 is the header: the first row is line 2.
  for (let from = 2; from <= last; from += PUBLISH_SLICE_LINES) {
    params.from = from
    params.to = from + PUBLISH_SLICE_LINES - 1
    inserted += stage.publish.run(params).changes
  }
  return inserted
}

/** Step 2: the staged rows written in one short transaction (see the file's comment), or null when a sign-off moved. */
export function commitStaged(task: ReadingImportTask, db: TidewrightDB, stage: Stage, plan: ImportPlan): { inserted: number, lockHeldMs: number } | null {
  let lockedAt = 0
  const write = db.$client.transaction(() => {
    lockedAt = performance.now() // the write lock is held from here (BEGIN IMMEDIATE) to the commit
    // The boundary was read on the request loop before the file came here; a sign-off decided
    // since would let the import write into what the supervisor has just signed.
    const lockedNow = lockedUntil(db, task.tankId)
    if ((lockedNow === null ? null : Date.parse(lockedNow)) !== task.lockedMs) return null
    const recheck = recheckDays(db, task.tankId, stage)
    const staged = stage.count.get() as number
    const inserted = publishStaged(task, stage)
    settle(plan, recheck, staged, inserted)
    // Same transaction: the rows and their audit line commit together or not at all.
    recordAudit(db, task.actor, { action: 'reading.import', entity: 'tank', entityId: task.tankId, after: { rows: plan.rowCount, inserted, skipped: plan.rowCount - inserted, errors: plan.errors.length } })
    return inserted
  })
  // SQLite copies the log into the database file after a commit that left it long (its
  // checkpoint, in the committing call but after the lock is released: no writer waits for it).
  // Run here after the commit instead, so the time measured is the lock's alone.
  const sqlite = db.$client
  const autocheckpoint = sqlite.pragma('wal_autocheckpoint', { simple: true }) as number
  sqlite.pragma('wal_autocheckpoint = 0')
  let inserted: number | null
  let lockHeldMs: number
  try {
    inserted = write.immediate()
    lockHeldMs = performance.now() - lockedAt
  }
  finally {
    sqlite.pragma(`wal_autocheckpoint = ${autocheckpoint}`)
  }
  if (inserted !== null) sqlite.pragma('wal_checkpoint(PASSIVE)')
  return inserted === null ? null : { inserted, lockHeldMs }
}

/** Plans the file and, unless it is a dry run, writes it; see the file's comment. */
export function readingImport(task: ReadingImportTask): ReadingImportResult {
  const { outcome, db, stage } = stageImport(task)
  try {
    if (outcome.kind !== 'plan') return outcome
    const { plan } = outcome
    if (task.input.dryRun) return { kind: 'done', preview: toPreview(plan, true, 0), lockHeldMs: 0 }
    const written = commitStaged(task, db, stage, plan)
    if (!written) return { kind: 'lock-moved' }
    return { kind: 'done', preview: toPreview(plan, false, written.inserted), lockHeldMs: written.lockHeldMs }
  }
  finally {
    dropStage(db)
  }
}
