/**
 * A tank's history prepared for one `now` from its tests as they stream past once in time order
 * (rows read from the database), holding only the tests of the last `windowDays` (window.ts).
 * What the verdict needs of the older tests is folded as they pass: the course (the same
 * CourseFeed traceCourse runs), the latest value of each quantity, the first test that showed
 * ammonia or nitrite, and the forecast's curve tests. So the memory a verdict takes is that of
 * the window, not of the years before it.
 *
 * The engine and the forecast give this history's verdict exactly as the whole history's, or
 * throw BeyondWindow (reads.ts); `tests/unit/shared/cycle/history-stream.test.ts` holds both
 * against `evaluateCycle` and `forecastCycle`.
 */
import { partitionPoint } from '../sorted'
import { CourseFeed } from './course'
import { CurveTestFold, dosesOf } from './forecast/curve-tests'
import { byId, compareNitrogenTests, compareReadings, compareStrings, nitrogenTest, sanitize, timedEventsOf, type NitrogenTest, type PreparedInput, type TimedReading } from './history'
import { CURRENT_RULE_OPTIONS, type RuleOptions } from './options'
import { showsNitrogen } from './reads'
import type { Latest } from './snapshot'
import { resolveThresholds } from './thresholds'
import { DAY_MS, requireTime, timeReaderFor } from './time'
import type { CycleEvent, CycleReading, CycleTank, Thresholds } from './types'

/** What a streamed history is prepared for: everything of the engine's input but the readings and events. */
export interface StreamedInputHead {
  readonly tank: CycleTank
  readonly thresholds?: Partial<Thresholds>
  /** ISO 8601 time the verdict is for. */
  readonly now: string
}

type Measured = keyof Latest

const MEASURED: readonly Measured[] = [
  'ammoniaN', 'nitriteN', 'nitrateN', 'pH', 'temperatureC', 'salinity', 'alkalinityDkh', 'calciumMgL', 'magnesiumMgL', 'phosphateMgL',
]

/** A test as read, and as the history holds it. */
interface Passing {
  readonly raw: CycleReading
  readonly reading: TimedReading
}

/**
 * The engine input for `head` whose readings come one at a time in time order (their time read as
 * the history reads it; a test whose time does not parse may come anywhere), holding the tests
 * of the `windowDays` before `now`. Undefined when the readings are not in time order: the caller
 * prepares the whole history instead. The input is for this `now`, these limits and `options`
 * only: the engine throws BeyondWindow when asked anything else, or anything the window cannot
 * settle.
 */
export function prepareStreamed(
  head: StreamedInputHead,
  readings: Iterable<CycleReading>,
  events: readonly CycleEvent[] | undefined,
  windowDays: number,
  options: RuleOptions = CURRENT_RULE_OPTIONS,
): PreparedInput | undefined {
  const nowMs = requireTime('now', head.now)
  const startedMs = requireTime('tank.startedAt', head.tank.startedAt)
  const thresholds = resolveThresholds(head.thresholds)
  const timedEvents = timedEventsOf(events)
  const eventsNow = timedEvents.slice(0, partitionPoint(timedEvents, e => e.t <= nowMs))
  const course = new CourseFeed(eventsNow, thresholds, head.tank.cycleMethod, startedMs, options)
  const curve = new CurveTestFold(dosesOf(eventsNow), thresholds)
  const startMs = nowMs - windowDays * DAY_MS
  const held: TimedReading[] = []
  const heldTests: NitrogenTest[] = []
  let leftOut = false
  const latest: { -readonly [K in Measured]?: TimedReading } = {}
  let firstShown: TimedReading | null = null
  const ignored: string[] = []
  const repaired: { id: string, t: number }[] = []
  let repairedBeforeStart = false

  // Tests of one instant wait for the rest of it: the history orders them by entry time, id and
  // values, and the forecast by id, which the rows' order need not follow.
  let instant: Passing[] = []
  function pass(): void {
    const inOrder = instant.length === 1 ? instant : instant.slice().sort((a, b) => compareReadings(a.reading, b.reading))
    for (const { reading } of inOrder) {
      course.reading(reading)
      for (const key of MEASURED) if (reading[key] !== undefined) latest[key] = reading
      if (firstShown === null && showsNitrogen(reading, thresholds)) firstShown = reading
      if (reading.t >= startMs) held.push(reading)
      else leftOut = true
    }
    const tests: NitrogenTest[] = []
    for (const { raw, reading } of instant) {
      const test = nitrogenTest(raw, reading)
      if (test) tests.push(test)
    }
    // A stable sort, as the whole history's: of two tests with one time and id, the order given.
    for (const test of tests.sort(compareNitrogenTests)) {
      curve.push(test)
      if (test.t >= startMs) heldTests.push(test)
    }
    instant = []
  }

  const readTime = timeReaderFor(Number.POSITIVE_INFINITY)
  let lastT = Number.NEGATIVE_INFINITY
  for (const raw of readings) {
    const t = readTime(raw.takenAt)
    if (!Number.isFinite(t)) {
      ignored.push(raw.id)
      continue
    }
    if (t < lastT) return undefined
    // Tests after `now` are outside the verdict (and every later one is after it too).
    if (t > nowMs) {
      lastT = t
      continue
    }
    if (t !== lastT && instant.length > 0) pass()
    lastT = t
    const checked = sanitize(raw, t, readTime)
    if (checked.repaired) {
      repaired.push({ id: raw.id, t })
      repairedBeforeStart ||= t < startMs
    }
    instant.push({ raw, reading: checked.reading })
  }
  if (instant.length > 0) pass()

  return {
    tank: head.tank,
    thresholds: head.thresholds,
    now: head.now,
    history: {
      readings: held,
      events: timedEvents,
      ignoredReadingIds: ignored.sort(compareStrings),
      repaired: repaired.sort(byId),
      latest,
      nitrogenTests: heldTests,
      window: {
        // A history no longer than the window is held whole: every read answers.
        startMs: leftOut ? startMs : Number.NEGATIVE_INFINITY,
        nowMs,
        thresholds,
        method: head.tank.cycleMethod,
        startedMs,
        options,
        course: course.result(nowMs),
        firstShown,
        repairedBeforeStart,
        curve: { last: curve.last ?? null, count: curve.count },
      },
    },
  }
}
