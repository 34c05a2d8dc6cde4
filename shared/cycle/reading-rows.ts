/**
 * A prepared history's tests and events with their numbers held in Float64Arrays, a row each (a
 * test's row: its time, its entry time, then each of MEASURED_FIELDS, NaN for a value it does not
 * carry; an event's: its two times), each read through one small object that holds only its id
 * (or event), its array and where its row starts (`HeldReading`, `HeldEvent`).
 *
 * Why: a test as a plain object held each of its numbers boxed, one heap object apiece (Node 20
 * has no pointer compression and boxes every double field), about ten objects and 260 bytes a
 * test, and an event three. Every minor collection during an evaluation copied all of them, so its
 * cost grew with the length of the history, and ten years of them outgrew a core's cache. The
 * arrays live outside the collected heap; what is left to copy is one small object a test.
 */
import { MEASURED_FIELDS } from '../vocabulary'
import type { CycleEvent, CycleReading } from './types'
import type { TimedEvent, TimedReading } from './history'

const TIME = 0
const ENTERED = 1
/** Where the first of MEASURED_FIELDS sits in a test's row; the others follow in their order. */
const VALUES = 2
/** Numbers in a test's row. */
const ROW = VALUES + MEASURED_FIELDS.length
/**
 * Rows of the first array when the number of tests is not known (rows read from the database);
 * each further array is twice the one before, so the room never used is under half the history.
 */
const FIRST_ROWS = 64

/** Where a history's tests are written as it is prepared: arrays filled one after another, never moved. */
export class ReadingRows {
  private numbers: Float64Array
  private next = 0
  /** Whether the test written last lost a value that `kept` refused. */
  lostValue = false

  /** `expected`: how many tests will be written, when known (then one array holds them all). */
  constructor(expected = Number.POSITIVE_INFINITY) {
    this.numbers = new Float64Array((Number.isFinite(expected) ? Math.max(1, expected) : FIRST_ROWS) * ROW)
  }

  /**
   * The test `raw` held in a row, its time `t` and entry time `entered` read, each value given by
   * `kept` (the value as the history keeps it, or NaN to leave it out: `lostValue` then says so).
   */
  write(raw: CycleReading, t: number, entered: number, kept: (key: (typeof MEASURED_FIELDS)[number], value: number) => number): TimedReading {
    if (this.next + ROW > this.numbers.length) {
      this.numbers = new Float64Array(this.numbers.length * 2)
      this.next = 0
    }
    const { numbers } = this
    const start = this.next
    numbers[start + TIME] = t
    numbers[start + ENTERED] = entered
    let lost = false
    for (let i = 0; i < MEASURED_FIELDS.length; i += 1) {
      const key = MEASURED_FIELDS[i]!
      const value = raw[key]
      if (value === undefined || value === null) {
        numbers[start + VALUES + i] = Number.NaN
        continue
      }
      const held = kept(key, value)
      numbers[start + VALUES + i] = held
      lost ||= Number.isNaN(held)
    }
    this.lostValue = lost
    this.next = start + ROW
    return new HeldReading(numbers, start, raw.id)
  }
}

/**
 * A test held in a row (see `ReadingRows`): the same values a plain `TimedReading` has. They are
 * getters on the class, so a copy by spread or structuredClone does not carry them: only the
 * streamed history (plain objects, history-stream.ts) is ever copied. A value's place is 2 + its
 * place in MEASURED_FIELDS (VALUES), written out in each getter: one short function apiece,
 * which the compiler copies into the rules that read it; NaN is "not carried", as a kept value
 * is always finite.
 */
class HeldReading implements TimedReading {
  constructor(private readonly numbers: Float64Array, private readonly start: number, readonly id: string) {}

  get t(): number {
    return this.numbers[this.start + TIME]!
  }

  get entered(): number {
    return this.numbers[this.start + ENTERED]!
  }

  get ammoniaN(): number | undefined {
    const value = this.numbers[this.start + 2]!
    return value === value ? value : undefined
  }

  get nitriteN(): number | undefined {
    const value = this.numbers[this.start + 3]!
    return value === value ? value : undefined
  }

  get nitrateN(): number | undefined {
    const value = this.numbers[this.start + 4]!
    return value === value ? value : undefined
  }

  get pH(): number | undefined {
    const value = this.numbers[this.start + 5]!
    return value === value ? value : undefined
  }

  get temperatureC(): number | undefined {
    const value = this.numbers[this.start + 6]!
    return value === value ? value : undefined
  }

  get salinity(): number | undefined {
    const value = this.numbers[this.start + 7]!
    return value === value ? value : undefined
  }

  get alkalinityDkh(): number | undefined {
    const value = this.numbers[this.start + 8]!
    return value === value ? value : undefined
  }

  get calciumMgL(): number | undefined {
    const value = this.numbers[this.start + 9]!
    return value === value ? value : undefined
  }

  get magnesiumMgL(): number | undefined {
    const value = this.numbers[this.start + 10]!
    return value === value ? value : undefined
  }

  get phosphateMgL(): number | undefined {
    const value = this.numbers[this.start + 11]!
    return value === value ? value : undefined
  }
}

/** Numbers in an event's row: its time and its entry time. */
const EVENT_ROW = 2

/**
 * A prepared history's events, their times held as rows of one Float64Array (their number is
 * known), each read through one object (`HeldEvent`): three objects an event (the event, its
 * time and its entry time boxed) become one.
 */
export class EventRows {
  private readonly numbers: Float64Array
  private next = 0

  constructor(count: number) {
    this.numbers = new Float64Array(Math.max(1, count) * EVENT_ROW)
  }

  /** The event held with its times `t` and `entered`. */
  write(event: CycleEvent, t: number, entered: number): TimedEvent {
    const start = this.next
    this.numbers[start + TIME] = t
    this.numbers[start + ENTERED] = entered
    this.next = start + EVENT_ROW
    return new HeldEvent(this.numbers, start, event)
  }
}

/** An event held in a row (see `EventRows`), read as a plain `TimedEvent` is. */
class HeldEvent implements TimedEvent {
  constructor(private readonly numbers: Float64Array, private readonly start: number, readonly event: CycleEvent) {}

  get t(): number {
    return this.numbers[this.start + TIME]!
  }

  get entered(): number {
    return this.numbers[this.start + ENTERED]!
  }
}
