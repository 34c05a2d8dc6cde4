/**
 * A tank's readings and events as they stand now, and the trail of corrections behind them.
 *
 * A correction never changes a row: it adds a new row whose `corrects_id` names the row it
 * replaces. A row is current while no correction names it. The rule engine, the chart and
 * the CSV export read current rows only, so a corrected value is shown once; the history
 * and the evidence read every row, each carrying who replaced it, when and why.
 *
 * Framework-free: takes a `Db` (the connection or a transaction).
 */
import { and, asc, count, eq, gte, isNull, lte, sql, type SQL } from 'drizzle-orm'
import { alias, type AnySQLiteColumn } from 'drizzle-orm/sqlite-core'
import { toIsoInstant } from '../../../shared/readings/fields'
import type { Replacement } from '../../../shared/types/readings'
import type { Db } from '../../db/connection'
import { iterateValues, preparedValues } from '../../db/iterate'
import { preparedPerDb } from '../../db/prepared'
import { events, readings, users } from '../../db/schema'
import { tankDataRevisionInDb } from './data-revision'

/** An inclusive time window, ISO-8601; either end may be open. */
export interface TimeRange {
  from?: string
  to?: string
}

type ReadingRow = typeof readings.$inferSelect
type EventRow = typeof events.$inferSelect

/** A stored row with who entered it and, once corrected, what replaced it. */
export type WithTrail<Row> = Row & { enteredByName: string | null, replacedBy: Replacement | null }
export type ReadingWithTrail = WithTrail<ReadingRow>
export type EventWithTrail = WithTrail<EventRow>

/** Which rows to read: only the current ones, or every row with its trail. */
export type Which = 'current' | 'all'

const author = alias(users, 'author')
const laterReading = alias(readings, 'later_reading')
const laterEvent = alias(events, 'later_event')
const corrector = alias(users, 'corrector')

// The routes' schemas have read the range with the same rule; a text it refuses bounds nothing.
const iso = (time: string) => toIsoInstant(time) ?? time

function withTrail<Row>(row: Row, enteredByName: string | null, later: Omit<Replacement, 'byName'> | null, byName: string | null): WithTrail<Row> {
  return { ...row, enteredByName, replacedBy: later ? { ...later, byName } : null }
}

/** The filter for a tank's readings in a range; `current` leaves out replaced rows. */
function readingFilter(tankId: string, range: TimeRange, which: Which): SQL | undefined {
  const conditions: SQL[] = [eq(readings.tankId, tankId)]
  if (range.from) conditions.push(gte(readings.takenAt, iso(range.from)))
  if (range.to) conditions.push(lte(readings.takenAt, iso(range.to)))
  if (which === 'current') conditions.push(isNull(laterReading.id))
  return and(...conditions)
}

/** The filter for a tank's events in a range; `current` leaves out replaced rows. */
function eventFilter(tankId: string, range: TimeRange, which: Which): SQL | undefined {
  const conditions: SQL[] = [eq(events.tankId, tankId)]
  if (range.from) conditions.push(gte(events.at, iso(range.from)))
  if (range.to) conditions.push(lte(events.at, iso(range.to)))
  if (which === 'current') conditions.push(isNull(laterEvent.id))
  return and(...conditions)
}

/** Readings joined to their author and to the correction that replaced them, if any. */
function readingQuery(db: Db) {
  return db.select({
    row: readings, enteredByName: author.name, byName: corrector.name,
    later: { id: laterReading.id, reason: laterReading.correctionReason, at: laterReading.createdAt },
  }).from(readings)
    .leftJoin(author, eq(author.id, readings.enteredBy))
    .leftJoin(laterReading, eq(laterReading.correctsId, readings.id))
    .leftJoin(corrector, eq(corrector.id, laterReading.enteredBy))
    .$dynamic()
}

/** Events joined to their author and to the correction that replaced them, if any. */
function eventQuery(db: Db) {
  return db.select({
    row: events, enteredByName: author.name, byName: corrector.name,
    later: { id: laterEvent.id, reason: laterEvent.correctionReason, at: laterEvent.createdAt },
  }).from(events)
    .leftJoin(author, eq(author.id, events.enteredBy))
    .leftJoin(laterEvent, eq(laterEvent.correctsId, events.id))
    .leftJoin(corrector, eq(corrector.id, laterEvent.enteredBy))
    .$dynamic()
}

/** A tank's readings, oldest first: the current ones, or every row with its trail. */
export function tankReadings(db: Db, tankId: string, options: { range?: TimeRange, which?: Which } = {}): ReadingWithTrail[] {
  return readingQuery(db).where(readingFilter(tankId, options.range ?? {}, options.which ?? 'current'))
    .orderBy(asc(readings.takenAt), asc(readings.createdAt), asc(sql`${readings}.rowid`)).all()
    .map(r => withTrail(r.row, r.enteredByName, r.later, r.byName))
}

/** What the rule engine reads of a reading: its times and values, nothing of who or why. */
export const ENGINE_READING_COLUMNS = {
  id: readings.id,
  takenAt: readings.takenAt,
  createdAt: readings.createdAt,
  ammoniaN: readings.ammoniaN,
  nitriteN: readings.nitriteN,
  nitrateN: readings.nitrateN,
  pH: readings.pH,
  temperatureC: readings.temperatureC,
  salinity: readings.salinity,
  alkalinityDkh: readings.alkalinityDkh,
  calciumMgL: readings.calciumMgL,
  magnesiumMgL: readings.magnesiumMgL,
  phosphateMgL: readings.phosphateMgL,
}

/** A current reading as the rule engine reads it. */
export type EngineReadingRow = { [K in keyof typeof ENGINE_READING_COLUMNS]: ReadingRow[K] }

type EngineColumn = keyof typeof ENGINE_READING_COLUMNS
const ENGINE_COLUMN_NAMES = Object.keys(ENGINE_READING_COLUMNS) as EngineColumn[]

/**
 * The same reading as its values in the order of ENGINE_READING_COLUMNS: a long history comes
 * from SQLite as arrays, which skips naming each of 100,000 rows (a tenth of the verdict
 * refresh after an import, and as many objects for the collector).
 */
export type EngineReadingValues = [
  id: string, takenAt: string, createdAt: string,
  ammoniaN: number | null, nitriteN: number | null, nitrateN: number | null, pH: number | null, temperatureC: number | null,
  salinity: number | null, alkalinityDkh: number | null, calciumMgL: number | null, magnesiumMgL: number | null, phosphateMgL: number | null,
]

/** A row's engine values in that order (a single row: one test just saved). */
export function engineValuesOf(row: EngineReadingRow): EngineReadingValues {
  return ENGINE_COLUMN_NAMES.map(name => row[name]) as EngineReadingValues
}

/**
 * A tank's current readings with only what the engine reads, in the order of `tankReadings` (so
 * a signed snapshot's input is written as before). Every verdict refresh reads the whole history: leaving out the author, the
 * correction trail and the notes makes that read several times cheaper. The rows come straight
 * from SQLite as arrays of ENGINE_READING_COLUMNS' values (text and real columns, nothing for an
 * ORM to convert: mapping 100,000 rows of an imported history through Drizzle took as long as
 * reading them), one at a time, so a caller maps each into its own shape without holding them all twice.
 * The index on (tank, taken, entered) holds them in this order (its entries end with the rowid):
 * SQLite sorts none of them.
 */
export function tankEngineReadings(db: Db, tankId: string): IterableIterator<EngineReadingValues> {
  const columns = sql.join(Object.values(ENGINE_READING_COLUMNS).map(column => sql`${column}`), sql`, `)
  return iterateValues<EngineReadingValues>(db, sql`select ${columns} from ${readings}
    left join ${readings} as ${sql.identifier('later_reading')} on ${laterReading.correctsId} = ${readings.id}
    where ${readingFilter(tankId, {}, 'current')}
    order by ${readings.takenAt} asc, ${readings.createdAt} asc, ${readings}.rowid asc`)
}

/** What a chart draws of a test: its time and the charted values, in this order. */
export type ChartReadingValues = [takenAt: string, ammoniaN: number | null, nitriteN: number | null, nitrateN: number | null, pH: number | null, temperatureC: number | null, salinity: number | null]

/**
 * The latest `max` current readings of a tank in a range, oldest first, with only what a chart
 * draws, and whether the range holds older ones (one more row is asked for; counting a long
 * history took longer than reading what is drawn). The query names its index: without
 * statistics SQLite took the tank's import-key index and sorted all of a 100,000-test history
 * (211 ms) to keep the latest; walking (tank, taken, entered) backwards reads only those.
 */
export function latestChartReadings(db: Db, tankId: string, range: TimeRange, max: number): { rows: ChartReadingValues[], older: boolean } {
  const rows = db.values<ChartReadingValues>(sql`select ${readings.takenAt}, ${readings.ammoniaN}, ${readings.nitriteN}, ${readings.nitrateN}, ${readings.pH}, ${readings.temperatureC}, ${readings.salinity}
    from ${readings} indexed by readings_tank_taken
    left join ${readings} as ${sql.identifier('later_reading')} on ${laterReading.correctsId} = ${readings.id}
    where ${readingFilter(tankId, range, 'current')}
    order by ${readings.takenAt} desc, ${readings.createdAt} desc, ${readings}.rowid desc limit ${max + 1}`)
  const older = rows.length > max
  return { rows: rows.slice(0, max).reverse(), older }
}

/** A tank's events, oldest first: the current ones, or every row with its trail. */
export function tankEvents(db: Db, tankId: string, options: { range?: TimeRange, which?: Which } = {}): EventWithTrail[] {
  return eventQuery(db).where(eventFilter(tankId, options.range ?? {}, options.which ?? 'current'))
    .orderBy(asc(events.at), asc(events.createdAt), asc(sql`${events}.rowid`)).all()
    .map(r => withTrail(r.row, r.enteredByName, r.later, r.byName))
}

/** How a page of a history list is cut: the sort column, its direction and the page. */
export interface HistoryPage {
  sort: AnySQLiteColumn
  dir: 'asc' | 'desc'
  page: number
  pageSize: number
}

/**
 * A reading on a page of its tank's history, as the history list and the evidence read it: its
 * columns but the tank and the import key, `entered` as its stored JSON text (parsed by the one
 * reader that shows it, for its own page only), who entered it and what replaced it.
 */
export type ReadingPageRow = Omit<ReadingRow, 'tankId' | 'importKey' | 'entered'> & { entered: string, enteredByName: string | null, replacedBy: Replacement | null }

/** An event on a page of its tank's history: its columns but the tank, who entered it and what replaced it. */
export type EventPageRow = Omit<EventRow, 'tankId'> & { enteredByName: string | null, replacedBy: Replacement | null }

/** The correction that replaced a row, read as four columns of the page's row (all null when none did). */
type LaterValues = [laterId: string | null, laterReason: string | null, laterAt: string | null, laterByName: string | null]

type ReadingPageValues = [
  id: string, takenAt: string, enteredBy: string | null, enteredByName: string | null,
  ammoniaN: number | null, nitriteN: number | null, nitrateN: number | null, pH: number | null, temperatureC: number | null,
  salinity: number | null, alkalinityDkh: number | null, calciumMgL: number | null, magnesiumMgL: number | null, phosphateMgL: number | null,
  notes: string | null, entered: string, correctsId: string | null, correctionReason: string | null, createdAt: string, updatedAt: string,
  ...LaterValues,
]

type EventPageValues = [
  id: string, at: string, kind: EventRow['kind'], amount: number | null, group: EventRow['group'], notes: string | null,
  enteredBy: string | null, enteredByName: string | null, correctsId: string | null, correctionReason: string | null,
  createdAt: string, updatedAt: string, ...LaterValues,
]

function replacementOf(id: string | null, reason: string | null, at: string | null, byName: string | null): Replacement | null {
  // Key order as the trail has always been sent: id, reason, at, byName.
  return id === null ? null : { id, reason, at: at!, byName }
}

// The trail's joins, and the columns they add to each row in LaterValues' order.
const readingTrail = sql`left join ${users} as ${sql.identifier('author')} on ${author.id} = ${readings.enteredBy}
  left join ${readings} as ${sql.identifier('later_reading')} on ${laterReading.correctsId} = ${readings.id}
  left join ${users} as ${sql.identifier('corrector')} on ${corrector.id} = ${laterReading.enteredBy}`
const eventTrail = sql`left join ${users} as ${sql.identifier('author')} on ${author.id} = ${events.enteredBy}
  left join ${events} as ${sql.identifier('later_event')} on ${laterEvent.correctsId} = ${events.id}
  left join ${users} as ${sql.identifier('corrector')} on ${corrector.id} = ${laterEvent.enteredBy}`

/** The range's conditions on a time column, as placeholders `from` and `to`. */
function rangeConditions(tankColumn: AnySQLiteColumn, timeColumn: AnySQLiteColumn, hasFrom: boolean, hasTo: boolean): SQL | undefined {
  const conditions: SQL[] = [eq(tankColumn, sql.placeholder('tankId'))]
  if (hasFrom) conditions.push(gte(timeColumn, sql.placeholder('from')))
  if (hasTo) conditions.push(lte(timeColumn, sql.placeholder('to')))
  return and(...conditions)
}

/**
 * A history list's statements, one set per shape of request (sort column, direction, which ends
 * of the range are given), each prepared the first time that shape is asked for: the history
 * list and the evidence are read far more often than they change shape.
 */
function perShape<S>(prepare: (db: Db, sort: AnySQLiteColumn, dir: 'asc' | 'desc', hasFrom: boolean, hasTo: boolean) => S) {
  const statements = preparedPerDb(() => new Map<AnySQLiteColumn, Map<string, S>>())
  return (db: Db, range: TimeRange, page: HistoryPage): S => {
    const bySort = statements(db)
    let shapes = bySort.get(page.sort)
    if (!shapes) bySort.set(page.sort, shapes = new Map())
    const shape = `${page.dir}|${Boolean(range.from)}|${Boolean(range.to)}`
    let prepared = shapes.get(shape)
    if (!prepared) shapes.set(shape, prepared = prepare(db, page.sort, page.dir, Boolean(range.from), Boolean(range.to)))
    return prepared
  }
}

const pageOrder = (sort: AnySQLiteColumn, dir: 'asc' | 'desc', table: typeof readings | typeof events, createdAt: AnySQLiteColumn) => {
  const by = sql.raw(dir)
  // Ties in the sort column fall in entry order, as in tankReadings/tankEvents (so a page reversed reads as the full list does).
  return sql`order by ${sort} ${by}, ${createdAt} ${by}, ${table}.rowid ${by} limit ${sql.placeholder('limit')} offset ${sql.placeholder('offset')}`
}

/**
 * Pages are read as arrays of column values and mapped here (no ORM mapping, no parse of a row's
 * `entered` that the evidence never sends): Drizzle's mapping of a thousand rows with their trail
 * held the request loop longer than SQLite's read of them.
 */
const readingPageStatements = perShape((db, sort, dir, hasFrom, hasTo) => {
  const where = rangeConditions(readings.tankId, readings.takenAt, hasFrom, hasTo)
  return {
    page: preparedValues<ReadingPageValues>(db, sql`select ${readings.id}, ${readings.takenAt}, ${readings.enteredBy}, ${author.name},
      ${readings.ammoniaN}, ${readings.nitriteN}, ${readings.nitrateN}, ${readings.pH}, ${readings.temperatureC},
      ${readings.salinity}, ${readings.alkalinityDkh}, ${readings.calciumMgL}, ${readings.magnesiumMgL}, ${readings.phosphateMgL},
      ${readings.notes}, ${readings.entered}, ${readings.correctsId}, ${readings.correctionReason}, ${readings.createdAt}, ${readings.updatedAt},
      ${laterReading.id}, ${laterReading.correctionReason}, ${laterReading.createdAt}, ${corrector.name}
      from ${readings} ${readingTrail} where ${where} ${pageOrder(sort, dir, readings, readings.createdAt)}`),
    count: db.select({ n: count() }).from(readings).where(where).prepare(),
  }
})

const eventPageStatements = perShape((db, sort, dir, hasFrom, hasTo) => {
  const where = rangeConditions(events.tankId, events.at, hasFrom, hasTo)
  return {
    page: preparedValues<EventPageValues>(db, sql`select ${events.id}, ${events.at}, ${events.kind}, ${events.amount}, ${events.group}, ${events.notes},
      ${events.enteredBy}, ${author.name}, ${events.correctsId}, ${events.correctionReason}, ${events.createdAt}, ${events.updatedAt},
      ${laterEvent.id}, ${laterEvent.correctionReason}, ${laterEvent.createdAt}, ${corrector.name}
      from ${events} ${eventTrail} where ${where} ${pageOrder(sort, dir, events, events.createdAt)}`),
    count: db.select({ n: count() }).from(events).where(where).prepare(),
  }
})

/** The values a page's statements bind. */
function pageValues(tankId: string, range: TimeRange, page: HistoryPage) {
  return { tankId, from: range.from ? iso(range.from) : undefined, to: range.to ? iso(range.to) : undefined, limit: page.pageSize, offset: (page.page - 1) * page.pageSize }
}

/** Tanks whose reading count is kept per handle (the least recently counted goes first). */
const COUNTED_TANKS = 256

/** Each tank's count of stored readings, with the data revision it was counted at. */
const keptCounts = preparedPerDb(() => new Map<string, { revision: number, n: number }>())

/** A tank's stored readings counted from the index on (tank, taken, entered), prepared once: no row is read. */
const storedReadings = preparedPerDb(db => db.select({ n: count() }).from(readings).where(eq(readings.tankId, sql.placeholder('tankId'))).prepare())

/**
 * How many readings the tank stores, every row (corrections included), counted again only when
 * the tank's data revision has moved since: counting 100,000 index entries took 5 ms of the
 * request loop at every page of a long history's evidence and history lists.
 */
export function storedReadingCount(db: Db, tankId: string): number {
  const revision = tankDataRevisionInDb(db, tankId)
  const byTank = keptCounts(db)
  const kept = byTank.get(tankId)
  if (kept?.revision === revision) return kept.n
  // The revision is read before counting: a write in between moves it, and the next call counts again.
  const n = storedReadings(db).get({ tankId })?.n ?? 0
  byTank.delete(tankId)
  byTank.set(tankId, { revision, n })
  if (byTank.size > COUNTED_TANKS) byTank.delete(byTank.keys().next().value!)
  return n
}

/** One page of a tank's readings, every row with its trail, so the history shows what was replaced. */
export function readingHistoryPage(db: Db, tankId: string, range: TimeRange, page: HistoryPage): { rows: ReadingPageRow[], total: number } {
  const statements = readingPageStatements(db, range, page)
  const values = pageValues(tankId, range, page)
  const rows = statements.page(values).map(([
    id, takenAt, enteredBy, enteredByName, ammoniaN, nitriteN, nitrateN, pH, temperatureC, salinity, alkalinityDkh, calciumMgL, magnesiumMgL, phosphateMgL,
    notes, entered, correctsId, correctionReason, createdAt, updatedAt, laterId, laterReason, laterAt, laterByName,
  ]): ReadingPageRow => ({
    id, takenAt, enteredBy, ammoniaN, nitriteN, nitrateN, pH, temperatureC, salinity, alkalinityDkh, calciumMgL, magnesiumMgL, phosphateMgL,
    notes, entered, correctsId, correctionReason, createdAt, updatedAt, enteredByName, replacedBy: replacementOf(laterId, laterReason, laterAt, laterByName),
  }))
  const total = range.from || range.to ? statements.count.get(values)?.n ?? 0 : storedReadingCount(db, tankId)
  return { rows, total }
}

/** One page of a tank's events, every row with its trail. */
export function eventHistoryPage(db: Db, tankId: string, range: TimeRange, page: HistoryPage): { rows: EventPageRow[], total: number } {
  const statements = eventPageStatements(db, range, page)
  const values = pageValues(tankId, range, page)
  const rows = statements.page(values).map(([
    id, at, kind, amount, group, notes, enteredBy, enteredByName, correctsId, correctionReason, createdAt, updatedAt, laterId, laterReason, laterAt, laterByName,
  ]): EventPageRow => ({
    id, at, kind, amount, group, notes, enteredBy, correctsId, correctionReason, createdAt, updatedAt, enteredByName,
    replacedBy: replacementOf(laterId, laterReason, laterAt, laterByName),
  }))
  return { rows, total: statements.count.get(values)?.n ?? 0 }
}
