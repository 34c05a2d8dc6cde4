/**
 * A tank's current readings and events as the rule engine reads them (its prepared history:
 * parsed, checked and in order), kept in memory between verdict refreshes so a new test does not
 * re-read and re-order a year of history.
 *
 * Why it is never out of date: triggers on `readings` and `events` count every insert, update
 * and delete of a tank's rows in `tank_data_revisions`, on every connection (a CSV import in a
 * worker thread, a correction, a delete, an edit, an event, a restore by hand). A copy is used
 * only while the tank's count still equals the count it was read at; otherwise the rows are
 * read again. The one change applied in place is the commonest: a new test saved on this
 * connection, whose transaction read the count right after its insert (so the count moved by
 * exactly that row). Anything else reads again.
 *
 * Framework-free: takes a `Db`; each handle (the server's connection, a worker's, a test's)
 * keeps its own copies.
 */
import { prepareHistory, withReadingAdded, type PreparedHistory, type PreparedInput } from '../../../shared/cycle/history'
import { HistoryStream, type StreamedInputHead } from '../../../shared/cycle/history-stream'
import type { CycleEvent, CycleReading } from '../../../shared/cycle/types'
import { CYCLE_EVENT_KINDS, type CycleEventKind, type EventKind } from '../../../shared/vocabulary'
import type { Db } from '../../db/connection'
import { preparedPerDb } from '../../db/prepared'
import type { readings } from '../../db/schema'
import { tankDataRevisionInDb } from './data-revision'
import { KeptTanks } from './kept-tanks'
import { engineValuesOf, tankEngineReadings, tankEvents, type EngineReadingValues } from './current'

/** A tank's history as the engine reads it, and the count of changes it was read at. */
export interface KeptHistory {
  revision: number
  /** How many current tests it was made from (one whose time does not parse included). */
  tests: number
  /** How many it holds in memory: all of them. */
  held: number
  history: PreparedHistory
}

/** A tank's history folded as it streamed past and held for its window (HistoryStream), and the count of changes it was read at. */
export interface KeptStream {
  revision: number
  tests: number
  /** How many it holds in memory: its window's. */
  held: number
  stream: HistoryStream
}

type KeptCopy = KeptHistory | KeptStream

const isStream = (kept: KeptCopy): kept is KeptStream => 'stream' in kept

/**
 * Kept per handle: at most 64 tanks (a year of a client's tests is some hundreds of kB) and
 * 250,000 tests together (about 70 MB of prepared history; a 100,000-test import is kept, three of
 * them are not). The least recently used goes first.
 */
const KEPT = { maxTanks: 64, maxReadings: 250_000 }

const copies = preparedPerDb(() => new KeptTanks<KeptCopy>(KEPT))

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

/** The tank's current events the engine reads, in their order. */
function cycleEventsOf(db: Db, tankId: string): CycleEvent[] {
  return tankEvents(db, tankId).flatMap(({ kind, ...e }): CycleEvent[] => isCycleEventKind(kind)
    ? [{ id: e.id, at: e.at, enteredAt: e.createdAt, kind, amount: defined(e.amount), group: defined(e.group) }]
    : [])
}

/**
 * The tank's current readings and events as the engine takes them, in the database's order (time
 * taken, then entered, then row order): what a sign-off records and re-runs. Read anew each time.
 */
export function readEngineInput(db: Db, tankId: string): { readings: CycleReading[], events: CycleEvent[] } {
  return { readings: Array.from(tankEngineReadings(db, tankId), toCycleReading), events: cycleEventsOf(db, tankId) }
}

/**
 * Reads the tank's history from the database and prepares it a row at a time: no reading is held
 * in the shape it was read in, so a long history is held once, in order, and not twice.
 */
export function readKeptHistory(db: Db, tankId: string, revision: number): KeptHistory {
  function* readings(): Generator<CycleReading> {
    for (const values of tankEngineReadings(db, tankId)) yield toCycleReading(values)
  }
  return keptAt(revision, prepareHistory(readings(), cycleEventsOf(db, tankId)))
}

/**
 * The tank's engine input for `head` (its profile, thresholds and `now`) from its history folded
 * as it streams past (shared/cycle/history-stream.ts) and held only for the `windowDays` before
 * `now`: from the fold kept for the tank while its count has not moved (a saved test goes on
 * from it), else from the rows streamed again in time order, that fold kept in place of any copy.
 * Undefined when the rows do not come in the history's time order; the engine throws
 * BeyondWindow when the window cannot settle the verdict. Either way the caller evaluates the
 * whole history instead (`keptHistory`). `revision`: the tank's count, read before the rows are,
 * as keptHistory reads it.
 */
export function streamedInput(db: Db, tankId: string, head: StreamedInputHead, windowDays: number, revision: number): PreparedInput | undefined {
  const kept = copies(db).get(tankId)
  const input = kept?.revision === revision && isStream(kept) ? kept.stream.inputAt(head) : undefined
  if (input) return input
  function* readings(): Generator<CycleReading> {
    for (const values of tankEngineReadings(db, tankId)) yield toCycleReading(values)
  }
  const stream = HistoryStream.read(head, readings(), cycleEventsOf(db, tankId), windowDays)
  if (!stream) return undefined
  copies(db).keep(tankId, { revision, tests: stream.tests, held: stream.held, stream })
  return stream.inputAt(head)
}

/** What the tank's copy kept at its current count (`revision`, read now unless given) is: the whole history, a fold held for its window, or none. */
export function keptCopyKind(db: Db, tankId: string, revision = tankDataRevisionInDb(db, tankId)): 'whole' | 'stream' | undefined {
  const kept = copies(db).get(tankId)
  if (!kept || kept.revision !== revision) return undefined
  return isStream(kept) ? 'stream' : 'whole'
}

/** A kept copy of `history`: every test it was made from is either in its order or left out for its time. */
function keptAt(revision: number, history: PreparedHistory): KeptHistory {
  const tests = history.readings.length + history.ignoredReadingIds.length
  return { revision, tests, held: tests, history }
}

/**
 * The tank's current history as the engine reads it: the kept copy when the tank's count has not
 * moved since, otherwise read again (and kept). It is shared: callers read it and never change it.
 * `revision`: the tank's count, read now unless the caller read it before any rows of its own.
 */
export function keptHistory(db: Db, tankId: string, revision = tankDataRevisionInDb(db, tankId)): KeptHistory {
  // The count is read before the rows: rows read after it are at least as new, so a copy is never
  // labelled newer than its content (a write in between moves the count and the next call reads again).
  const kept = copies(db).get(tankId)
  if (kept?.revision === revision && !isStream(kept)) return kept
  const read = readKeptHistory(db, tankId, revision)
  copies(db).keep(tankId, read)
  return read
}

/** How many current tests the tank's kept copy holds, when one is kept at the tank's current revision. */
export function keptTestCount(db: Db, tankId: string): number | undefined {
  const kept = copies(db).get(tankId)
  return kept && kept.revision === tankDataRevisionInDb(db, tankId) ? kept.tests : undefined
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
 * is the one just before it, the test is placed into a new copy where the history's order puts
 * it (a total order: the database's row order never decides it); a copy read at or after the
 * count already holds it and stays; when the copy is older, or the test ties with one already
 * there on time and id, the copy is dropped.
 * Any handle may be told (the heavy-work pool's, for a tank evaluated there): the count says
 * whether its copy is the one just before the test.
 */
export function noteTestAppended(db: Db, tankId: string, row: ReadingRow, revisionAfter: number): void {
  const byTank = copies(db)
  const kept = byTank.get(tankId)
  if (!kept) return
  // A copy read at or after the test's own count holds it already (or what became of it since):
  // saves on one tank that overtook each other reach the pool after it read the history anew.
  if (row.tankId === tankId && kept.revision >= revisionAfter) return
  if (kept.revision !== revisionAfter - 1 || row.tankId !== tankId || row.correctsId !== null) {
    byTank.drop(tankId)
    return
  }
  const reading = toCycleReading(engineValuesOf(row))
  if (isStream(kept)) {
    const stream = kept.stream.withTestAppended(reading)
    if (stream) byTank.keep(tankId, { revision: revisionAfter, tests: stream.tests, held: stream.held, stream })
    else byTank.drop(tankId)
    return
  }
  const history = withReadingAdded(kept.history, reading)
  if (history) byTank.keep(tankId, keptAt(revisionAfter, history))
  else byTank.drop(tankId)
}
