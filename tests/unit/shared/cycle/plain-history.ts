/**
 * A history's tests and events as plain records of what they hold (id, times, each value), so that
 * two histories compare by content whatever objects hold them: a prepared history holds each test's
 * and event's numbers in rows read through getters (shared/cycle/reading-rows.ts), which `toEqual`
 * does not see, while the reference builds and the streamed history hold plain objects.
 */
import type { History, NitrogenTest, PreparedHistory, TimedEvent, TimedReading } from '../../../../shared/cycle/history'
import { MEASURED_FIELDS } from '../../../../shared/vocabulary'

/** The test's id, times and the values it carries, as own properties. */
export function plainReading(r: TimedReading): TimedReading {
  const plain: Record<string, unknown> = { id: r.id, t: r.t, entered: r.entered }
  for (const key of MEASURED_FIELDS) if (r[key] !== undefined) plain[key] = r[key]
  return plain as unknown as TimedReading
}

/** The event with its times, as own properties. */
export function plainEvent(e: TimedEvent): TimedEvent {
  return { event: e.event, t: e.t, entered: e.entered }
}

/** What the forecast reads of a test. */
function plainTest(test: NitrogenTest): NitrogenTest {
  return { t: test.t, id: test.id, ammoniaN: test.ammoniaN, nitriteN: test.nitriteN, nitrateN: test.nitrateN }
}

/** The latest test of each value, as plain records. */
export function plainLatest(latest: PreparedHistory['latest']): PreparedHistory['latest'] {
  return Object.fromEntries(Object.entries(latest).map(([key, reading]) => [key, plainReading(reading)]))
}

/** A prepared history with its tests as plain records. */
export function plainPrepared(h: PreparedHistory): PreparedHistory {
  return { ...h, readings: h.readings.map(plainReading), events: h.events.map(plainEvent), latest: plainLatest(h.latest), nitrogenTests: h.nitrogenTests.map(plainTest) }
}

/** A history (cut at a `now`) with its tests as plain records. */
export function plainHistory(h: History): History {
  return { ...h, readings: h.readings.map(plainReading), events: h.events.map(plainEvent) }
}
