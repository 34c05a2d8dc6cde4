/**
 * A tank's history folded from its tests as they stream past once in time order (rows read from
 * the database), holding only the tests of the last `windowDays` (window.ts). What the verdict
 * needs of the older tests is folded as they pass: the course (the same CourseFeed traceCourse
 * runs), the latest value of each quantity, the first test that showed ammonia or nitrite, and
 * the forecast's curve tests. So the memory a verdict takes is that of the window, not of the
 * years before it; and a test saved later goes on from the fold (`withTestAppended`), so a save
 * does not read the years again either.
 *
 * The engine and the forecast give such a history's verdict exactly as the whole history's, or
 * throw BeyondWindow (reads.ts); `tests/unit/shared/cycle/history-stream.test.ts` holds both
 * against `evaluateCycle` and `forecastCycle`, for a stream read at once and one tests were
 * appended to.
 */
import { partitionPoint } from '../sorted'
import { CourseFeed, type CourseFeedState } from './course'
import { CurveTestFold, dosesOf, type CurveFoldState } from './forecast/curve-tests'
import { byId, compareNitrogenTests, compareReadings, compareStrings, nitrogenTest, sanitize, timedEventsOf, type NitrogenTest, type PreparedInput, type TimedEvent, type TimedReading } from './history'
import { CURRENT_RULE_OPTIONS, type RuleOptions } from './options'
import { showsNitrogen } from './reads'
import { noteLatest, type LatestSoFar } from './snapshot'
import { resolveThresholds } from './thresholds'
import { DAY_MS, parseTime, requireTime, timeReaderFor, toIso, type TimeReader } from './time'
import { foldServes, type FoldedFor } from './window'
import type { CycleEvent, CycleReading, CycleTank, Thresholds } from './types'

/** What a streamed history is read for: everything of the engine's input but the readings and events. */
export interface StreamedInputHead {
  readonly tank: CycleTank
  readonly thresholds?: Partial<Thresholds>
  /** ISO 8601 time the verdict is for. */
  readonly now: string
}

/** Tests and events after a fold's latest, as the forecast assumes them. */
interface LaterTests {
  readonly readings: readonly CycleReading[]
  readonly events: readonly CycleEvent[]
}

/** A test as read, and as the history holds it. */
interface Passing {
  readonly raw: CycleReading
  readonly reading: TimedReading
}

/** What the fold is for: fixed once read, shared by every stream that goes on from it. */
interface StreamSettings extends FoldedFor {
  readonly windowDays: number
  /** The tests held are those from here on. */
  readonly startMs: number
  /** The `now` the rows were read at: the course has taken the events up to it. */
  readonly readAtMs: number
  /** The course and curve folds as read, whose settings the copies share. */
  readonly feed: CourseFeed
  readonly curve: CurveTestFold
}

/**
 * The fold so far, as plain data: copied whole (structuredClone) before it goes on or is read as
 * an input, so the copies keep one another's tests the same objects, as the engine needs.
 */
interface StreamData {
  feed: CourseFeedState
  curve: CurveFoldState
  /** The curve fold as it stood before the first test held: the forecast replays the held tests from it. */
  curveAtStart: CurveFoldState | null
  held: TimedReading[]
  heldTests: NitrogenTest[]
  latest: LatestSoFar
  firstShown: TimedReading | null
  ignored: string[]
  repaired: { id: string, t: number }[]
  repairedBeforeStart: boolean
  /** A test before the window's start was folded and let go. */
  leftOut: boolean
  /** Time of the latest test folded. */
  lastT: number
  /** A test or an event after `readAtMs` was passed over: the fold says nothing of any later `now`. */
  passedOver: boolean
  /** How many tests it was made from (one whose time does not parse included). */
  tests: number
}

/** A history folded from its tests streamed past once, able to go on with later tests. */
export class HistoryStream {
  private constructor(private readonly settings: StreamSettings, private readonly data: StreamData) {}

  /**
   * Folds `readings`, which come one at a time in time order (their time read as the history reads
   * it; a test whose time does not parse may come anywhere), with `events`, for `head`, holding the
   * tests of the `windowDays` before its `now`. Undefined when the readings are not in time order:
   * the caller prepares the whole history instead.
   */
  static read(head: StreamedInputHead, readings: Iterable<CycleReading>, events: readonly CycleEvent[] | undefined, windowDays: number, options: RuleOptions = CURRENT_RULE_OPTIONS): HistoryStream | undefined {
    const nowMs = requireTime('now', head.now)
    const startedMs = requireTime('tank.startedAt', head.tank.startedAt)
    const thresholds = resolveThresholds(head.thresholds)
    const timedEvents = timedEventsOf(events)
    const upToNow = partitionPoint(timedEvents, e => e.t <= nowMs)
    const eventsNow: readonly TimedEvent[] = timedEvents.slice(0, upToNow)
    const feed = new CourseFeed(eventsNow, thresholds, head.tank.cycleMethod, startedMs, options)
    const curve = new CurveTestFold(dosesOf(eventsNow), thresholds)
    const settings: StreamSettings = { thresholds, method: head.tank.cycleMethod, startedMs, options, windowDays, startMs: nowMs - windowDays * DAY_MS, readAtMs: nowMs, feed, curve }
    const stream = new HistoryStream(settings, {
      feed: feed.state(),
      curve: curve.state(),
      curveAtStart: null,
      held: [],
      heldTests: [],
      latest: {},
      firstShown: null,
      ignored: [],
      repaired: [],
      repairedBeforeStart: false,
      leftOut: false,
      lastT: Number.NEGATIVE_INFINITY,
      passedOver: upToNow < timedEvents.length,
      tests: 0,
    })
    return stream.fold(readings, feed, curve, timeReaderFor(Number.POSITIVE_INFINITY), nowMs) ? stream : undefined
  }

  /** How many tests the history was made from. */
  get tests(): number {
    return this.data.tests
  }

  /** How many tests it holds in memory. */
  get held(): number {
    return this.data.held.length
  }

  /**
   * This history with one more test, `raw`, taken after every test in it (a time that does not
   * parse is only counted): what reading the rows again would fold. Undefined when the test is not
   * after them all or the fold passed over a later test or event: the caller reads the rows again.
   */
  withTestAppended(raw: CycleReading): HistoryStream | undefined {
    const t = parseTime(raw.takenAt)
    if (this.data.passedOver || (Number.isFinite(t) && t <= this.data.lastT)) return undefined
    const data = structuredClone(this.data)
    const next = new HistoryStream(this.settings, data)
    const feed = this.settings.feed.withState(data.feed)
    const curve = this.settings.curve.withState(data.curve)
    next.fold([raw], feed, curve, parseTime, Number.POSITIVE_INFINITY)
    return next
  }

  /**
   * The engine input for `head`, its history held for the window: undefined when this fold cannot
   * give it (other limits, tank or rule set; a `now` before its tests or the moment it was read, or
   * after a test or event it passed over; a window grown to twice its days). The engine and the
   * forecast give the whole history's answers from it, or throw BeyondWindow.
   */
  inputAt(head: StreamedInputHead, options: RuleOptions = CURRENT_RULE_OPTIONS): PreparedInput | undefined {
    const { settings } = this
    const nowMs = requireTime('now', head.now)
    const asked: FoldedFor = { options, method: head.tank.cycleMethod, startedMs: requireTime('tank.startedAt', head.tank.startedAt), thresholds: resolveThresholds(head.thresholds) }
    const fits = foldServes(settings, asked)
      && nowMs >= settings.readAtMs && nowMs >= this.data.lastT
      && (nowMs === settings.readAtMs || !this.data.passedOver)
      && nowMs - settings.startMs <= 2 * settings.windowDays * DAY_MS
    if (!fits) return undefined
    // The course's result changes the scan (a held test whose window closed by now ends its run):
    // it is made on a copy, and the copy's tests are the history's, one set of objects.
    const data = structuredClone(this.data)
    const course = settings.feed.withState(data.feed).result(nowMs)
    const curve = settings.curve.withState(data.curve)
    // The forecast's projections go on from this fold, read at the moment each is judged at.
    const continuedTo = (atMs: number, later: LaterTests) => this.withLater(later, atMs)?.inputAt({ ...head, now: toIso(atMs) }, options)?.history
    return {
      tank: head.tank,
      thresholds: head.thresholds,
      now: head.now,
      history: {
        readings: data.held,
        events: data.feed.events,
        ignoredReadingIds: data.ignored.sort(compareStrings),
        repaired: data.repaired.sort(byId),
        latest: data.latest,
        nitrogenTests: data.heldTests,
        window: {
          // A history no longer than the window is held whole: every read answers.
          startMs: data.leftOut ? settings.startMs : Number.NEGATIVE_INFINITY,
          nowMs,
          thresholds: settings.thresholds,
          method: settings.method,
          startedMs: settings.startedMs,
          options: settings.options,
          course,
          firstShown: data.firstShown,
          repairedBeforeStart: data.repairedBeforeStart,
          curve: { last: curve.last ?? null, count: curve.count, atStart: data.curveAtStart ?? curve.state() },
          continuedTo,
        },
      },
    }
  }

  /**
   * This fold continued by `later` tests and events, all after every test and event in it and at
   * or before `atMs` (the forecast's assumed future): undefined when one is not, or the fold
   * passed over a later test or event.
   */
  private withLater(later: LaterTests, atMs: number): HistoryStream | undefined {
    const events = timedEventsOf(later.events)
    const readings = later.readings.map(raw => ({ raw, t: parseTime(raw.takenAt) })).sort((a, b) => a.t - b.t)
    const fedEvents = this.data.feed.events
    const lastEventT = fedEvents[fedEvents.length - 1]?.t ?? Number.NEGATIVE_INFINITY
    // An event at or before a test already folded would have come before it.
    const inOrder = events.length === later.events.length && events.every(e => e.t > Math.max(lastEventT, this.data.lastT) && e.t <= atMs)
      && readings.every(({ t }) => Number.isFinite(t) && t > this.data.lastT && t <= atMs)
    if (this.data.passedOver || !inOrder) return undefined
    const data = structuredClone(this.data)
    data.feed = { ...data.feed, events: [...data.feed.events, ...events] }
    const next = new HistoryStream(this.settings, data)
    const feed = this.settings.feed.withState(data.feed)
    const curve = this.settings.curve.withState(data.curve)
    return next.fold(readings.map(({ raw }) => raw), feed, curve, parseTime, Number.POSITIVE_INFINITY) ? next : undefined
  }

  /**
   * Folds `readings` (in time order) into this stream's data with `feed` and `curve` (restored on
   * it), then keeps their state in the data; tests after `passOverAfter` are counted, not folded.
   * False when a reading comes before an earlier one.
   */
  private fold(readings: Iterable<CycleReading>, feed: CourseFeed, curve: CurveTestFold, readTime: TimeReader, passOverAfter: number): boolean {
    const { settings, data } = this
    const { thresholds, startMs } = settings
    // Tests of one instant wait for the rest of it: the history orders them by entry time, id and
    // values, and the forecast by id, which the rows' order need not follow.
    let instant: Passing[] = []
    const pass = (): void => {
      const inOrder = instant.length === 1 ? instant : instant.slice().sort((a, b) => compareReadings(a.reading, b.reading))
      for (const { reading } of inOrder) {
        feed.reading(reading)
        noteLatest(data.latest, reading)
        if (data.firstShown === null && showsNitrogen(reading, thresholds)) data.firstShown = reading
        if (reading.t >= startMs) data.held.push(reading)
        else data.leftOut = true
      }
      const tests: NitrogenTest[] = []
      for (const { raw, reading } of instant) {
        const test = nitrogenTest(raw, reading)
        if (test) tests.push(test)
      }
      // A stable sort, as the whole history's: of two tests with one time and id, the order given.
      for (const test of tests.sort(compareNitrogenTests)) {
        if (test.t >= startMs) {
          data.curveAtStart ??= curve.state()
          data.heldTests.push(test)
        }
        curve.push(test)
      }
      instant = []
    }
    let lastSeen = data.lastT
    for (const raw of readings) {
      data.tests += 1
      const t = readTime(raw.takenAt)
      if (!Number.isFinite(t)) {
        data.ignored.push(raw.id)
        continue
      }
      if (t < lastSeen) return false
      lastSeen = t
      // A test after the moment read at is outside that verdict (and so is every later one).
      if (t > passOverAfter) {
        data.passedOver = true
        continue
      }
      if (t !== data.lastT && instant.length > 0) pass()
      data.lastT = t
      const checked = sanitize(raw, t, readTime)
      if (checked.repaired) {
        data.repaired.push({ id: raw.id, t })
        data.repairedBeforeStart ||= t < startMs
      }
      instant.push({ raw, reading: checked.reading })
    }
    if (instant.length > 0) pass()
    data.feed = feed.state()
    data.curve = curve.state()
    return true
  }
}
