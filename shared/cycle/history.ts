/**
 * Turns the raw readings and events into one ordered history. The order is total
 * (time taken, then time entered, then id, then content), so the verdict cannot depend
 * on input order, and of two tests taken in the same minute the one entered last is
 * the latest.
 */

import { partitionPoint } from '../sorted'
import { latestValues, readingsBetween, updatedLatest, type Latest } from './snapshot'
import { parseTime, timeReaderFor, type TimeReader } from './time'
import type { CycleEvent, CycleInput, CycleReading, CycleTank, Thresholds } from './types'
import { MEASURED_FIELDS, type MeasuredField } from '../vocabulary'
import { EventRows, ReadingRows } from './reading-rows'
import { BeyondWindow, windowStart, type HistoryWindow } from './window'

/** A reading with its parsed time; only values the engine can trust are kept. */
export interface TimedReading {
  readonly id: string
  readonly t: number
  /** When it was entered (epoch ms); -Infinity when unknown, so it sorts first among equals. */
  readonly entered: number
  readonly ammoniaN?: number
  readonly nitriteN?: number
  readonly nitrateN?: number
  readonly pH?: number
  readonly temperatureC?: number
  readonly salinity?: number
  readonly alkalinityDkh?: number
  readonly calciumMgL?: number
  readonly magnesiumMgL?: number
  readonly phosphateMgL?: number
}

/** An event with its parsed time. */
export interface TimedEvent {
  readonly event: CycleEvent
  readonly t: number
  readonly entered: number
}

/** The ordered history as of `now`. */
export interface History {
  readonly readings: readonly TimedReading[]
  readonly events: readonly TimedEvent[]
  /** Readings left out because their time does not parse. Sorted. */
  readonly ignoredReadingIds: readonly string[]
  /** Readings that kept their time but lost a value that was negative or not a number. Sorted. */
  readonly repairedReadingIds: readonly string[]
  /** Set when `readings` holds only the latest part of the history (window.ts): read them through reads.ts. */
  readonly window?: HistoryWindow
}

// Temperature may legitimately be below zero on a broken heater's log; every other value may not.
function acceptable(key: MeasuredField, value: number): boolean {
  return Number.isFinite(value) && (key === 'temperatureC' || value >= 0)
}

export function compareStrings(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0
}

function valueKey(reading: TimedReading): string {
  return MEASURED_FIELDS.map(key => String(reading[key] ?? '')).join('|')
}

// Equal infinities subtract to NaN, which a sort would read as "unordered": compare explicitly.
function compareNumbers(a: number, b: number): number {
  return a < b ? -1 : a > b ? 1 : 0
}

/** History order of two readings. */
export function compareReadings(a: TimedReading, b: TimedReading): number {
  return a.t - b.t || compareNumbers(a.entered, b.entered) || compareStrings(a.id, b.id) || compareStrings(valueKey(a), valueKey(b))
}

function compareEvents(a: TimedEvent, b: TimedEvent): number {
  return a.t - b.t
    || compareNumbers(a.entered, b.entered)
    || compareStrings(a.event.id, b.event.id)
    || compareStrings(a.event.kind, b.event.kind)
    || (a.event.amount ?? -1) - (b.event.amount ?? -1)
    || compareStrings(a.event.group ?? '', b.event.group ?? '')
}

/**
 * Values are compared with limits at a micro-unit (1e-6) precision: the same kit reading
 * typed in the form, imported from a CSV in another basis or entered as a correction
 * reaches the engine through different unit conversions, and must not fall on different
 * sides of a limit by a floating-point hair.
 */
export function atLimitPrecision(value: number): number {
  return Math.round(value * 1e6) / 1e6
}

/** Entry time in epoch ms; a missing or unreadable one sorts first, as if entered before any other. */
function enteredTime(iso: string | undefined, readTime: TimeReader): number {
  const ms = iso === undefined ? Number.NaN : readTime(iso)
  return Number.isFinite(ms) ? ms : Number.NEGATIVE_INFINITY
}

/**
 * A raw reading as the history holds it: its time read, each value checked (see `repaired`) and set
 * at limit precision. A plain object, for a history that is copied whole (history-stream.ts);
 * `heldReading` is the same test held in a row of a prepared history's numbers.
 */
export function sanitize(raw: CycleReading, t: number, readTime: TimeReader = parseTime): { reading: TimedReading, repaired: boolean } {
  // The values go straight into the reading (the same keys in the same order as a spread of them
  // would give): a long history made a second object per test for the collector.
  const reading: { -readonly [K in keyof TimedReading]: TimedReading[K] } = { id: raw.id, t, entered: enteredTime(raw.enteredAt, readTime) }
  let repaired = false
  for (const key of MEASURED_FIELDS) {
    const value = raw[key]
    if (value === undefined || value === null) continue
    const held = keptValue(key, value)
    if (Number.isNaN(held)) repaired = true
    else reading[key] = held
  }
  return { reading, repaired }
}

/** A value as the history keeps it (at limit precision), or NaN when it is not one the engine can trust. */
function keptValue(key: MeasuredField, value: number): number {
  return acceptable(key, value) ? atLimitPrecision(value) : Number.NaN
}

/** `sanitize`, the test held in a row of `rows` (see reading-rows.ts). */
export function heldReading(rows: ReadingRows, raw: CycleReading, t: number, readTime: TimeReader = parseTime): { reading: TimedReading, repaired: boolean } {
  const reading = rows.write(raw, t, enteredTime(raw.enteredAt, readTime), keptValue)
  return { reading, repaired: rows.lostValue }
}

/**
 * A tank's readings and events parsed, checked and put in history order once, for any `now`: what
 * `buildHistory` does, kept between evaluations so a new test costs its own place in the order,
 * not a year of parsing and sorting again. Cutting it at `now` (`historyAsOf`) is the history
 * `buildHistory` gives, because the order puts time first: what happened by `now` is a prefix.
 * It holds nothing of the raw readings it was made from: a long history kept between a tank's
 * evaluations would otherwise be held twice, once as given and once in order.
 */
export interface PreparedHistory {
  /** Every reading whose time parses, in history order (including any after a given `now`). */
  readonly readings: readonly TimedReading[]
  /** Every event whose time parses, in history order. */
  readonly events: readonly TimedEvent[]
  /** Readings whose time does not parse, sorted by id. */
  readonly ignoredReadingIds: readonly string[]
  /** Readings that lost a value, sorted by id, with their time (a `now` before it leaves it out). */
  readonly repaired: readonly { readonly id: string, readonly t: number }[]
  /** The latest reading carrying each value among all of `readings` (the engine's `latest` when nothing is cut). */
  readonly latest: Latest
  /**
   * The tests with ammonia or nitrite whose time parses, in the forecast's order (time, then id,
   * then input order), with their values as given: the forecast's curves, cut at `now` like the rest.
   */
  readonly nitrogenTests: readonly NitrogenTest[]
  /**
   * Set when the history was streamed for one `now` (see window.ts and history-stream.ts):
   * `readings` and `nitrogenTests` are the tests from the window's start to that `now`, and
   * nothing is placed into it or cut from it at another time.
   */
  readonly window?: HistoryWindow
}

/**
 * What the engine and the forecast read of a `CycleInput`, with its readings and events already
 * prepared (`prepareInput`, or a history kept between a tank's evaluations and read from the
 * database a row at a time): the raw arrays are not needed once their history is made.
 */
export interface PreparedInput {
  readonly tank: CycleTank
  readonly thresholds?: Partial<Thresholds>
  /** ISO 8601 time the verdict is for. */
  readonly now: string
  readonly history: PreparedHistory
}

/** An ammonia or nitrite test as the forecast reads it. */
export interface NitrogenTest {
  readonly t: number
  readonly id: string
  readonly ammoniaN?: number
  readonly nitriteN?: number
  readonly nitrateN?: number
}

/** The forecast's order of tests: time, then id (a stable sort keeps input order after that). */
export function compareNitrogenTests(a: NitrogenTest, b: NitrogenTest): number {
  return a.t - b.t || compareStrings(a.id, b.id)
}

/**
 * The forecast's test for a raw reading, or undefined without ammonia and nitrite. When checking
 * left its three values as given (the common case), the history's own reading is that test: a
 * second object per test would double what a long history holds in memory.
 */
export function nitrogenTest(raw: CycleReading, reading: TimedReading): NitrogenTest | undefined {
  if (raw.ammoniaN === undefined && raw.nitriteN === undefined) return undefined
  if (reading.ammoniaN === raw.ammoniaN && reading.nitriteN === raw.nitriteN && reading.nitrateN === raw.nitrateN) return reading
  return { t: reading.t, id: raw.id, ammoniaN: raw.ammoniaN, nitriteN: raw.nitriteN, nitrateN: raw.nitrateN }
}

/** The forecast's tests as of `nowMs` (a prefix: its order puts time first). */
export function nitrogenTestsAsOf(prepared: PreparedHistory, nowMs: number): readonly NitrogenTest[] {
  if (windowStart(prepared) > Number.NEGATIVE_INFINITY) throw new BeyondWindow('the forecast\'s tests of the whole history')
  return prefix(prepared.nitrogenTests, countUpTo(prepared.nitrogenTests, nowMs))
}

/** The events as of `nowMs` (a prefix: the history's order puts time first). */
export function eventsAsOf(prepared: PreparedHistory, nowMs: number): readonly TimedEvent[] {
  return prefix(prepared.events, countUpTo(prepared.events, nowMs))
}

export function byId(a: { id: string }, b: { id: string }): number {
  return compareStrings(a.id, b.id)
}

/**
 * Parses, checks and orders a tank's readings and events once (see `PreparedHistory`). The
 * readings may come one at a time (rows read from the database): none of them is held after its
 * turn. `count` is how many there are, when they are not an array (it chooses how times are read).
 */
export function prepareHistory(readings: Iterable<CycleReading>, events: readonly CycleEvent[] | undefined, count = Array.isArray(readings) ? readings.length : Number.POSITIVE_INFINITY): PreparedHistory {
  const kept: TimedReading[] = []
  const ignored: string[] = []
  const repaired: { id: string, t: number }[] = []
  const nitrogen: NitrogenTest[] = []
  const readTime = timeReaderFor(count)
  const rows = new ReadingRows(count)
  for (const raw of readings) {
    const t = readTime(raw.takenAt)
    if (!Number.isFinite(t)) {
      ignored.push(raw.id)
      continue
    }
    const result = heldReading(rows, raw, t, readTime)
    kept.push(result.reading)
    if (result.repaired) repaired.push({ id: raw.id, t })
    const test = nitrogenTest(raw, result.reading)
    if (test) nitrogen.push(test)
  }
  kept.sort(compareReadings)
  return {
    readings: kept,
    events: timedEventsOf(events, true),
    ignoredReadingIds: ignored.sort(compareStrings),
    repaired: repaired.sort(byId),
    latest: latestValues(kept),
    nitrogenTests: nitrogen.sort(compareNitrogenTests),
  }
}

/**
 * The events whose time parses, with it, in history order: as plain objects (a history copied
 * whole, history-stream.ts), or `held` in rows of numbers (a prepared history, see reading-rows.ts).
 */
export function timedEventsOf(events: readonly CycleEvent[] | undefined, held = false): TimedEvent[] {
  const timed: TimedEvent[] = []
  const readTime = timeReaderFor(events?.length ?? 0)
  const rows = held ? new EventRows(events?.length ?? 0) : undefined
  for (const event of events ?? []) {
    const t = readTime(event.at)
    if (!Number.isFinite(t)) continue
    const entered = enteredTime(event.enteredAt, readTime)
    timed.push(rows ? rows.write(event, t, entered) : { event, t, entered })
  }
  return timed.sort(compareEvents)
}

/** The input with its readings and events prepared: what `evaluatePrepared` and `forecastPrepared` read. */
export function prepareInput(input: CycleInput): PreparedInput {
  return { tank: input.tank, thresholds: input.thresholds, now: input.now, history: prepareHistory(input.readings, input.events) }
}

/** How many of `items` (in time order) happened at or before `nowMs`. */
function countUpTo(items: readonly { readonly t: number }[], nowMs: number): number {
  return partitionPoint(items, item => item.t <= nowMs)
}

/** The prefix of `items` up to `count`: the array itself when nothing is cut (no copy on the common path). */
function prefix<T>(items: readonly T[], count: number): readonly T[] {
  return count === items.length ? items : items.slice(0, count)
}

/** The history as of `nowMs`: a reading or event after it is in the verdict's future and left out, which keeps old verdicts reproducible. */
export function historyAsOf(prepared: PreparedHistory, nowMs: number): History {
  const { window } = prepared
  if (window) {
    if (window.nowMs !== nowMs) throw new BeyondWindow('it was read for another moment')
    return { readings: prepared.readings, events: eventsAsOf(prepared, nowMs), ignoredReadingIds: prepared.ignoredReadingIds, repairedReadingIds: prepared.repaired.map(r => r.id), window }
  }
  const readings = prefix(prepared.readings, countUpTo(prepared.readings, nowMs))
  const events = eventsAsOf(prepared, nowMs)
  const repaired = prepared.repaired.some(r => r.t > nowMs) ? prepared.repaired.filter(r => r.t <= nowMs) : prepared.repaired
  return { readings, events, ignoredReadingIds: prepared.ignoredReadingIds, repairedReadingIds: repaired.map(r => r.id) }
}

/** Where `item` goes in `list` (sorted by `compare`): after every element not after it. */
function insertionPoint<T>(list: readonly T[], item: T, compare: (a: T, b: T) => number): number {
  return partitionPoint(list, other => compare(other, item) <= 0)
}

function inserted<T>(list: readonly T[], item: T, compare: (a: T, b: T) => number): T[] {
  const next = list.slice()
  next.splice(insertionPoint(list, item, compare), 0, item)
  return next
}

/**
 * `prepared` with one more reading, `raw`: the history `prepareHistory` makes of its readings and
 * `raw`, in any order (the order of the raw input never matters: the history's order is total).
 * Undefined when the test has the time and id of one already there, whatever it measured (the
 * input's order would decide between them, and a copy read after the count it is labelled with
 * may hold the very test it is then told of): the caller then prepares the whole history again.
 */
export function withReadingAdded(prepared: PreparedHistory, raw: CycleReading): PreparedHistory | undefined {
  // A window is read for one moment: a later test means reading the tank again.
  if (prepared.window) return undefined
  const t = parseTime(raw.takenAt)
  if (!Number.isFinite(t)) return { ...prepared, ignoredReadingIds: inserted(prepared.ignoredReadingIds, raw.id, compareStrings) }
  if (readingsBetween(prepared.readings, t, t).some(r => r.id === raw.id)) return undefined
  // A row of its own, so the kept history's tests stay one kind of object.
  const result = heldReading(new ReadingRows(1), raw, t)
  const test = nitrogenTest(raw, result.reading)
  return {
    ...prepared,
    // Every test of the forecast is a reading held: one of this time and id is not there either.
    nitrogenTests: test ? inserted(prepared.nitrogenTests, test, compareNitrogenTests) : prepared.nitrogenTests,
    readings: inserted(prepared.readings, result.reading, compareReadings),
    // It goes after every reading not after it in the order, so it is the latest of each value it carries unless a later one does.
    latest: updatedLatest(prepared.latest, result.reading, (a, b) => compareReadings(a, b) > 0),
    repaired: result.repaired ? inserted(prepared.repaired, { id: raw.id, t }, byId) : prepared.repaired,
  }
}

/**
 * `prepared` as of `nowMs`, continued by readings and events that all come after `nowMs` (the
 * forecast's assumed future): the history `prepareHistory` makes of the readings and events up
 * to `nowMs` and `later` together (a time that does not parse stays, as it does in the past). Only
 * the later ones are parsed and ordered: they go after every past one, as the order puts time
 * first. Undefined when one of them is not after `nowMs` or its time does not parse.
 */
export function withLaterAppended(
  prepared: PreparedHistory,
  nowMs: number,
  later: { readonly readings: readonly CycleReading[], readonly events: readonly CycleEvent[] },
): PreparedHistory | undefined {
  // Saying "undefined" would read as a future the engine cannot judge, so a window says why instead.
  if (windowStart(prepared) > Number.NEGATIVE_INFINITY) throw new BeyondWindow('a projection continues the whole history')
  const future = prepareHistory(later.readings, later.events)
  const allAfter = (items: readonly { readonly t: number }[], given: number) => items.length === given && items.every(item => item.t > nowMs)
  if (!allAfter(future.readings, later.readings.length) || !allAfter(future.events, later.events.length)) return undefined
  const past = historyAsOf(prepared, nowMs)
  const pastLatest = past.readings === prepared.readings ? prepared.latest : latestValues(past.readings)
  const after = (a: TimedReading, b: TimedReading) => compareReadings(a, b) > 0
  return {
    readings: [...past.readings, ...future.readings],
    events: [...past.events, ...future.events],
    ignoredReadingIds: prepared.ignoredReadingIds,
    repaired: [...prepared.repaired.filter(r => r.t <= nowMs), ...future.repaired].sort(byId),
    latest: future.readings.reduce((latest, reading) => updatedLatest(latest, reading, after), pastLatest),
    nitrogenTests: [...nitrogenTestsAsOf(prepared, nowMs), ...future.nitrogenTests],
  }
}

/**
 * `prepared` as of `nowMs` continued by `later` (see withLaterAppended), to be judged at `atMs`,
 * at or after every later test and event: a history held for its window goes on from its fold.
 * Undefined when a later test or event is not after `nowMs`; a window that cannot go on with them
 * throws BeyondWindow.
 */
export function continuedHistory(
  prepared: PreparedHistory,
  nowMs: number,
  later: { readonly readings: readonly CycleReading[], readonly events: readonly CycleEvent[] },
  atMs: number,
): PreparedHistory | undefined {
  const { window } = prepared
  if (window === undefined || windowStart(prepared) === Number.NEGATIVE_INFINITY) return withLaterAppended(prepared, nowMs, later)
  const continued = window.continuedTo(atMs, later)
  if (continued === undefined) throw new BeyondWindow('the assumed future does not go on from the held part')
  return continued
}

/** Builds the ordered history from raw input, dropping what happened after `nowMs`. */
export function buildHistory(readings: readonly CycleReading[], events: readonly CycleEvent[], nowMs: number): History {
  return historyAsOf(prepareHistory(readings, events), nowMs)
}
