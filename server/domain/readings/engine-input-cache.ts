/**
 * A tank's current readings and events as the rule engine reads them, kept in memory between
 * verdict refreshes so a new test does not re-read and re-map a year of history.
 *
 * Why it is never out of date: triggers on `readings` and `events` count every insert, update
 * and delete of a tank's rows in `tank_data_revisions`, on every connection (a CSV import in a
 * worker thread, a correction, a delete, an edit, an event, a restore by hand). A copy is used
 * only while the tank's count still equals the count it was read at; otherwise the rows are
 * read again. The one change applied in place is the commonest: a new test saved on this
 * connection, whose transaction read the count right after its insert (so the count moved by
 * exactly that row) and whose position in the order is certain. Anything else reads again.
 *
 * Framework-free: takes a `Db`; each handle (the server's connection, a worker's, a test's)
 * keeps its own copies.
 */
import { prepareHistory, withReadingAdded, type PreparedHistory } from '../../../shared/cycle/history'
import type { CycleEvent, CycleReading } from '../../../shared/cycle/types'
import { partitionPoint } from '../../../shared/sorted'
import { CYCLE_EVENT_KINDS, type CycleEventKind, type EventKind } from '../../../shared/vocabulary'
import type { Db } from '../../db/connection'
import { preparedPerDb } from '../../db/prepared'
import type { readings } from '../../db/schema'
import { tankDataRevisionInDb } from './data-revision'
import { KeptTanks } from './kept-tanks'
import { engineValuesOf, tankEngineReadings, tankEvents, type EngineReadingValues } from './current'

/** What the engine reads of a tank's rows, and the count of changes they were read at. */
export interface EngineRows {
  revision: number
  readings: readonly CycleReading[]
  events: readonly CycleEvent[]
  /** The same rows parsed and ordered for the engine, once asked for (`preparedHistoryOf`). */
  prepared?: PreparedHistory
}

/**
 * The rows' history as the engine orders it, prepared the first time it is asked for and kept
 * with them: the next evaluation, and the next test placed into the copy, start from it.
 */
export function preparedHistoryOf(rows: EngineRows): PreparedHistory {
  rows.prepared ??= prepareHistory(rows.readings, rows.events)
  return rows.prepared
}

/**
 * Kept per handle: at most 64 tanks (a year of a client's tests is some hundreds of kB) and
 * 250,000 tests together (about 200 MB with their prepared histories; a 100,000-test import is
 * kept, three of them are not). The least recently used goes first.
 */
const KEPT = { maxTanks: 64, maxReadings: 250_000 }

const copies = preparedPerDb(() => new KeptTanks<EngineRows>(KEPT))

const defined = <T>(value: T | null): T | undefined => value ?? undefined

const isCycleEventKind = (kind: EventKind): kind is CycleEventKind => (CYCLE_EVENT_KINDS as readonly string[]).includes(kind)

/** A current reading (its engine values, `engineValuesOf` for a row) as the engine takes it. */
export function toCycleReading([id, takenAt, createdAt, ammoniaN, nitriteN, nitrateN, pH, temperatureC, salinity, alkalinityDkh, calciumMgL, magnesiumMgL, phosphateMgL]: EngineReadingValues): CycleReading {
  return {
    id,
    takenAt,
    // Two tests taken in the same minute: the one entered last is the latest.
    enteredAt: createdAt,
    ammoniaN: defined(ammoniaN),
    nitriteN: defined(nitriteN),
    nitrateN: defined(nitrateN),
    pH: defined(pH),
    temperatureC: defined(temperatureC),
    salinity: defined(salinity),
    alkalinityDkh: defined(alkalinityDkh),
    calciumMgL: defined(calciumMgL),
    magnesiumMgL: defined(magnesiumMgL),
    phosphateMgL: defined(phosphateMgL),
  }
}

/** Reads the tank's rows from the database, as every refresh did before this copy was kept. */
export function readEngineRows(db: Db, tankId: string, revision: number): EngineRows {
  return {
    revision,
    // Each row made the engine's reading as it comes (see tankEngineReadings): no list of the raw rows.
    readings: Array.from(tankEngineReadings(db, tankId), values => toCycleReading(values)),
    events: tankEvents(db, tankId).flatMap(({ kind, ...e }): CycleEvent[] => isCycleEventKind(kind)
      ? [{ id: e.id, at: e.at, enteredAt: e.createdAt, kind, amount: defined(e.amount), group: defined(e.group) }]
      : []),
  }
}

/**
 * The tank's current readings and events in the engine's shape and order: the kept copy when
 * the tank's count has not moved since, otherwise read again (and kept). The arrays are shared:
 * callers read them and never change them.
 */
export function engineRows(db: Db, tankId: string): EngineRows {
  // The count is read before the rows: rows read after it are at least as new, so a copy is never
  // labelled newer than its content (a write in between moves the count and the next call reads again).
  const revision = tankDataRevisionInDb(db, tankId)
  const kept = copies(db).get(tankId)
  if (kept?.revision === revision) return kept
  const rows = readEngineRows(db, tankId, revision)
  copies(db).keep(tankId, rows)
  return rows
}

/** How many current tests the tank's kept copy holds, when one is kept at the tank's current revision. */
export function keptTestCount(db: Db, tankId: string): number | undefined {
  const kept = copies(db).get(tankId)
  return kept && kept.revision === tankDataRevisionInDb(db, tankId) ? kept.readings.length : undefined
}

type ReadingRow = typeof readings.$inferSelect

/** A new test as `noteTestAppended` takes it: the row inserted and the tank's count read right after the insert, in its transaction. */
export interface AppendedTest {
  row: ReadingRow
  revisionAfter: number
}

/**
 * After a new test (not a correction) was inserted and committed on this handle: `revisionAfter`
 * is the tank's count read in the same transaction right after the insert. When the kept copy
 * is the one just before it, the test is placed into a new copy where the database's order
 * (taken, then entered, then row order) puts it; when that order is not certain from the copy
 * (another row taken and entered at the same instants) or the copy is older, the copy is dropped.
 * Any handle may be told (the heavy-work pool's, for a tank evaluated there): the count says
 * whether its copy is the one just before the test.
 */
export function noteTestAppended(db: Db, tankId: string, row: ReadingRow, revisionAfter: number): void {
  const byTank = copies(db)
  const kept = byTank.get(tankId)
  if (!kept) return
  if (kept.revision !== revisionAfter - 1 || row.tankId !== tankId || row.correctsId !== null) {
    byTank.drop(tankId)
    return
  }
  const at = placeOf(kept.readings, row.takenAt, row.createdAt)
  if (at === undefined) {
    byTank.drop(tankId)
    return
  }
  const reading = toCycleReading(engineValuesOf(row))
  const next = kept.readings.slice()
  next.splice(at, 0, reading)
  // The engine's history takes the test in its own place too (or is prepared afresh when first asked).
  const prepared = kept.prepared && withReadingAdded(kept.prepared, reading, next)
  byTank.keep(tankId, { revision: revisionAfter, readings: next, events: kept.events, prepared })
}

/** Where a test taken at `takenAt` and entered at `enteredAt` goes; undefined when a row ties on both (row order decides). */
function placeOf(list: readonly CycleReading[], takenAt: string, enteredAt: string): number | undefined {
  const low = partitionPoint(list, r => r.takenAt < takenAt || (r.takenAt === takenAt && r.enteredAt! < enteredAt))
  const next = list[low]
  if (next && next.takenAt === takenAt && next.enteredAt === enteredAt) return undefined
  return low
}
